import type { Locator, Page } from 'playwright-core';

/**
 * Steps a coordinator takes on the Round desk and the Evaluation page that several browser stories
 * share. Each step waits for what the page shows afterwards, so a story reads as its sequence of
 * steps.
 */

/** Creates a scheme (with the DLS default measurands) from the Round desk. */
export async function createScheme(page: Page, code: string, name: string): Promise<void> {
  await page.getByTestId('new-scheme').click();
  await page.getByLabel('Code').fill(code);
  await page.getByLabel('Name', { exact: true }).fill(name);
  await page.getByRole('button', { name: 'Create scheme' }).click();
  await page.getByRole('dialog').waitFor({ state: 'detached' });
}

export interface NewRound {
  readonly code: string;
  readonly title: string;
  /** The "Results due" box's local date-time text (YYYY-MM-DDTHH:mm). */
  readonly resultsDue: string;
}

/**
 * Opens the new-round dialog and fills it with two test items: A, polystyrene latex (100 nm),
 * and B, silica (60 nm). The story then creates the round (and may take a screenshot first).
 */
export async function fillTwoItemRound(page: Page, round: NewRound): Promise<void> {
  await page.getByTestId('new-round').click();
  await page.getByLabel('Round code').fill(round.code);
  await page.getByLabel('Title').fill(round.title);
  await page.getByLabel('Results due').fill(round.resultsDue);
  await page.getByTestId('item-0').getByLabel('Item code').fill('A');
  await page.getByTestId('item-0').getByLabel('Material').fill('Polystyrene latex in water');
  await page.getByTestId('item-0').getByLabel('Nominal size (nm)').fill('100');
  await page.getByTestId('add-item').click();
  await page.getByTestId('item-1').getByLabel('Item code').fill('B');
  await page.getByTestId('item-1').getByLabel('Material').fill('Silica in water');
  await page.getByTestId('item-1').getByLabel('Nominal size (nm)').fill('60');
}

/** Moves the open round to Enrolling through the lifecycle dialog. */
export async function openEnrolment(page: Page): Promise<void> {
  await page.getByTestId('move-enrolling').click();
  await page.getByTestId('dialog-confirm').click();
  await page.getByTestId('round-state').getByText('Enrolling').waitFor();
}

/**
 * Invites the existing Harbour Sizing Lab (at `harbourEmail`) and a new lab, Ridge Particle Lab
 * (contact@ridge.test), in one go, and waits until both show in the Invitations grid.
 */
export async function inviteHarbourAndNewRidgeLab(page: Page, harbourEmail: string): Promise<void> {
  await page.getByTestId('invite-lab-0').click();
  await page.getByRole('option', { name: 'Harbour Sizing Lab' }).click();
  await page.getByTestId('invite-form').getByLabel('E-mail').first().fill(harbourEmail);
  await page.getByTestId('add-invitation').click();
  await page.getByLabel('New lab name').fill('Ridge Particle Lab');
  await page.getByTestId('invite-form').getByLabel('E-mail').nth(1).fill('contact@ridge.test');
  await page.getByTestId('send-invitations').click();
  const invitations = page.locator('ag-grid-angular[aria-label="Invitations"]');
  await invitations.getByText(harbourEmail).waitFor();
  await invitations.getByText('Ridge Particle Lab (new)').waitFor();
}

/**
 * Opens a closed round's Evaluation page and evaluates it; resolves to the σ_pt cell of item A's
 * Z-average once it shows.
 */
export async function evaluateRound(page: Page, roundId: string): Promise<Locator> {
  await page.goto(`/board/rounds/${roundId}/evaluation`);
  await page.getByTestId('evaluate').click();
  const sigma = page.getByTestId('sigma-A-z_average');
  await sigma.waitFor();
  return sigma;
}

/** Adds a σ_pt rule of 10 % of x_pt (reason: fitness for purpose) to the evaluation preview. */
export async function previewTenPercentSigma(page: Page): Promise<void> {
  await page.getByTestId('override-value').fill('10');
  await page.getByTestId('override-reason').fill('fitness for purpose');
  await page.getByTestId('add-override').click();
}

/**
 * Saves the evaluation draft, commits it and publishes version 1; waits for the message that
 * `labsEmailed` labs were e-mailed.
 */
export async function saveCommitAndPublish(page: Page, labsEmailed: number): Promise<void> {
  await page.getByTestId('save-draft').click();
  await page.getByTestId('evaluation-message').getByText('Draft saved.').waitFor();
  await page.getByTestId('commit').click();
  await page.getByTestId('evaluation-message').getByText('approved for publication').waitFor();
  await page.getByTestId('publish').click();
  await page
    .getByTestId('evaluation-message')
    .getByText(new RegExp(`Published version 1: ${labsEmailed} labs e-mailed`))
    .waitFor();
}
