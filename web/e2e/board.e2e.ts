import {
  buildEvaluationFixture,
  type EvaluationFixture,
} from '../../api/src/testing/evaluation-fixtures';
import { createUser } from '../../api/src/testing/test-app';
import { startE2E, type E2E } from './support/harness';
import { evaluateRound, previewTenPercentSigma, saveCommitAndPublish } from './support/round-steps';

jest.setTimeout(180_000);

/**
 * The coordinator evaluates a closed round in the browser (previewing a σ_pt rule), commits and
 * publishes; a lab then reads the Consensus board (codes only, its own row marked) and its
 * score page with the plain-language explanation.
 */
describe('Consensus board in a real browser', () => {
  let e: E2E;
  let fx: EvaluationFixture;
  beforeAll(async () => {
    e = await startE2E();
    fx = await buildEvaluationFixture(e.ds, {
      participants: 40,
      seed: 3,
      blunders: { 3: 2 },
      withUncertainty: true,
      labPrefix: 'Hiddenlab',
    });
    await createUser(e.ds, {
      email: 'coordinator@board.test',
      name: 'Cora Coordinator',
      roles: ['coordinator'],
    });
    await createUser(e.ds, {
      email: 'lab@board.test',
      name: 'Lena Lab',
      lab: fx.labs[3]!.id,
      manager: true,
    });
  });
  afterAll(() => e.close());

  it('coordinator: evaluate, preview a σ_pt rule at once, commit, publish, reveal names', async () => {
    const page = await e.page();
    await e.signIn(page, 'coordinator@board.test');
    const sigma = await evaluateRound(page, fx.round.id);
    const before = Number(await sigma.textContent());
    expect(before).toBeGreaterThan(0);

    // σ_pt = 10 % of x_pt: the preview changes without a round trip.
    await previewTenPercentSigma(page);
    const after = Number(await sigma.textContent());
    expect(after).toBeGreaterThan(before * 1.5); // x_pt ≈ 100 nm → σ_pt ≈ 10 nm, s* ≈ 2 nm
    expect(after).toBeGreaterThan(9);
    expect(after).toBeLessThan(11);
    await e.shot(page, 'board-evaluation-preview');

    await saveCommitAndPublish(page, 40);

    await page.goto(`/board/rounds/${fx.round.id}`);
    await page.locator('.ag-row').first().waitFor();
    expect(await page.content()).not.toContain(fx.labs[0]!.name);
    await page.getByTestId('reveal-names').click();
    await page.getByText(fx.labs[0]!.name, { exact: true }).first().waitFor();
    await e.shot(page, 'board-coordinator');
  });

  it('lab: codes only with its own row marked, charts with text alternatives, and its scores explained', async () => {
    const page = await e.page();
    await e.signIn(page, 'lab@board.test');
    const own = fx.enrolments[3]!.participantCode;
    await page.goto(`/board/rounds/${fx.round.id}`);
    await page.locator('.ag-row').first().waitFor();
    await page.getByTestId('board-filter').fill(own);
    await page.getByText(`${own} (your lab)`).waitFor();
    const html = await page.content();
    for (const lab of fx.labs) expect(html).not.toContain(lab.name);
    await expect(
      page.getByTestId('chart-z-bars').locator('figcaption').textContent(),
    ).resolves.toMatch(/z-scores of 40 participants/);
    await page.getByTestId('chart-density').getByRole('button', { name: 'Show table' }).click();
    await page.getByTestId('chart-density').getByRole('table').waitFor();
    await expect(page.getByTestId('chart-youden').count()).resolves.toBe(1);
    await e.shot(page, 'board-lab');

    await page.goto(`/board/rounds/${fx.round.id}/scores`);
    await expect(page.getByTestId('own-code').textContent()).resolves.toBe(own);
    const card = page.getByTestId('score-A-z_average');
    await expect(card.textContent()).resolves.toMatch(/Action signal/);
    await expect(card.locator('[data-signal="action"]').count()).resolves.toBe(1);
    await e.shot(page, 'board-lab-scores');

    await card.getByRole('link', { name: 'Open the investigation' }).click();
    await page.getByTestId('page-heading').getByText('Investigation').waitFor();
    expect(e.consoleErrors.filter((m) => !m.includes('404'))).toEqual([]);
  });
});
