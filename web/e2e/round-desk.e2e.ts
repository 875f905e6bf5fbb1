import { Invitation, Round } from '../../db/entities';
import { createLab, createUser, mailTo } from '../../api/src/testing/test-app';
import { startE2E, type E2E } from './support/harness';

jest.setTimeout(180_000);

/** The coordinator creates a scheme and a round with two test items, opens enrolment and invites two labs. */
describe('Round desk in a real browser', () => {
  let e: E2E;
  beforeAll(async () => {
    e = await startE2E();
    await createLab(e.ds, 'Harbour Sizing Lab');
    await createUser(e.ds, {
      email: 'coordinator@e2e.test',
      name: 'Cora Coordinator',
      roles: ['coordinator'],
    });
  });
  afterAll(() => e.close());

  it('creates a round with two items and invites two labs', async () => {
    const page = await e.page();
    await e.signIn(page, 'coordinator@e2e.test');
    await page.waitForURL((u) => u.pathname === '/desk');

    // a scheme with the DLS default measurands
    await page.getByTestId('new-scheme').click();
    await page.getByLabel('Code').fill('NANO-DLS');
    await page.getByLabel('Name', { exact: true }).fill('Nanoparticle sizing by DLS');
    await page.getByRole('button', { name: 'Create scheme' }).click();
    await page.getByRole('dialog').waitFor({ state: 'detached' });

    // a round with two test items
    await page.getByTestId('new-round').click();
    await page.getByLabel('Round code').fill('DLS-2026-1');
    await page.getByLabel('Title').fill('Latex and silica, spring 2026');
    await page.getByLabel('Results due').fill('2026-06-30T12:00');
    await page.getByTestId('item-0').getByLabel('Item code').fill('A');
    await page.getByTestId('item-0').getByLabel('Material').fill('Polystyrene latex in water');
    await page.getByTestId('item-0').getByLabel('Nominal size (nm)').fill('100');
    await page.getByTestId('add-item').click();
    await page.getByTestId('item-1').getByLabel('Item code').fill('B');
    await page.getByTestId('item-1').getByLabel('Material').fill('Silica in water');
    await page.getByTestId('item-1').getByLabel('Nominal size (nm)').fill('60');
    await e.shot(page, 'round-desk-new-round');
    await page.getByRole('button', { name: 'Create round' }).click();
    await page.waitForURL((u) => u.pathname.startsWith('/desk/rounds/'));
    await page.getByTestId('page-heading').getByText('DLS-2026-1').waitFor();
    await page
      .locator('ag-grid-angular[aria-label="Test items"]')
      .getByText('Polystyrene latex in water')
      .waitFor();
    await page
      .locator('ag-grid-angular[aria-label="Measurands"]')
      .getByText('Z-average diameter')
      .waitFor();

    // open enrolment through the lifecycle dialog
    await page.getByTestId('move-enrolling').click();
    await page.getByTestId('dialog-confirm').click();
    await page.getByTestId('round-state').getByText('Enrolling').waitFor();

    // invite an existing lab and a new lab by contact address
    await page.getByTestId('invite-lab-0').click();
    await page.getByRole('option', { name: 'Harbour Sizing Lab' }).click();
    await page.getByTestId('invite-form').getByLabel('E-mail').first().fill('head@harbour.test');
    await page.getByTestId('add-invitation').click();
    await page.getByLabel('New lab name').fill('Ridge Particle Lab');
    await page.getByTestId('invite-form').getByLabel('E-mail').nth(1).fill('contact@ridge.test');
    await page.getByTestId('send-invitations').click();
    const invitations = page.locator('ag-grid-angular[aria-label="Invitations"]');
    await invitations.getByText('head@harbour.test').waitFor();
    await invitations.getByText('Ridge Particle Lab (new)').waitFor();
    await e.shot(page, 'round-desk-invitations');

    const round = await e.ds.getRepository(Round).findOneByOrFail({ code: 'DLS-2026-1' });
    expect(round.state).toBe('enrolling');
    expect(await e.ds.getRepository(Invitation).countBy({ roundId: round.id })).toBe(2);
    const [harbour] = await mailTo(e.ds, 'head@harbour.test');
    const [ridge] = await mailTo(e.ds, 'contact@ridge.test');
    expect(harbour!.subject).toBe('Invitation to proficiency-testing round DLS-2026-1');
    expect(ridge!.text).toContain('/invitations/');

    // the new lab accepts through the link in its e-mail
    const link = /(http:\/\/\S+\/invitations\/[A-Za-z0-9_-]+)/.exec(ridge!.text)![1]!;
    const labPage = await e.page();
    await labPage.goto(link);
    await labPage.getByTestId('accept').click();
    await labPage.getByTestId('accepted').waitFor();
    await expect(labPage.getByTestId('accepted').textContent()).resolves.toMatch(/P[A-Z2-9]{4}/);
    expect(e.consoleErrors.filter((m) => !m.includes('401'))).toEqual([]);
  });
});
