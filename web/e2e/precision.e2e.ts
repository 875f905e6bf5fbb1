import { Scheme } from '../../db/entities';
import { writePrecisionStudy, type WrittenPrecisionStudy } from '../../db/seed/demo-precision';
import uranium from '../../shared/stats/fixtures/precision-grubbs-uranium.json';
import { createLab, createUser } from '../../api/src/testing/test-app';
import { seriousViolations } from './support/axe';
import { startE2E, type E2E } from './support/harness';

jest.setTimeout(240_000);

/**
 * Replicates of lab i: its mean is the i-th uranium value of the NIST/SEMATECH e-Handbook
 * §1.3.5.17.1 (Tietjen–Moore data, fixtures/precision-grubbs-uranium.json), so Grubbs' single test
 * on the cell means flags the eighth lab (G = 2.4687, beyond the ISO 5725-2 1 % value ≈ 2.27 for
 * p = 8); the spread ±0.1 around each mean is invented.
 */
const CELLS = uranium.values.map((v) => [v - 0.1, v, v + 0.1].map((x) => Number(x.toFixed(2))));

/** s_R from the ISO 5725-2 §7.4 definitions for equal n (hand calculation, docs/STATISTICS.md). */
function reproducibilitySd(cells: number[][]): number {
  const n = cells[0]!.length;
  const p = cells.length;
  const means = cells.map((c) => c.reduce((a, v) => a + v, 0) / n);
  const grand = means.reduce((a, v) => a + v, 0) / p;
  const sr2 =
    cells
      .map((c, i) => c.reduce((a, v) => a + (v - means[i]!) ** 2, 0) / (n - 1))
      .reduce((a, v) => a + v, 0) / p;
  const sd2 = (n * means.reduce((a, m) => a + (m - grand) ** 2, 0)) / (p - 1);
  return Math.sqrt(Math.max(0, (sd2 - sr2) / n) + sr2);
}

/**
 * The coordinator opens a precision study from the Round desk, sees the Grubbs outlier flagged,
 * sets it aside with a reason, and s_R on the page drops at once to the value without that lab;
 * the decision is stored (it survives a reload).
 */
describe('Precision study in a real browser', () => {
  let e: E2E;
  let s: WrittenPrecisionStudy;
  beforeAll(async () => {
    e = await startE2E();
    const scheme = await e.ds
      .getRepository(Scheme)
      .save({ code: 'RR-E2E', name: 'Round robins (browser test)' });
    const labs: { id: string }[] = [];
    for (let i = 0; i < CELLS.length; i++) labs.push(await createLab(e.ds, `Study lab ${i + 1}`));
    s = await writePrecisionStudy(e.ds, {
      schemeId: scheme.id,
      code: 'RR-E2E-1',
      title: 'Latex 100 nm round robin',
      state: 'closed',
      levels: [{ code: 'A', material: 'polystyrene latex, 100 nm', nominalSizeNm: 100 }],
      measurand: { key: 'x', name: 'Z-average', unit: 'nm', decimals: 2, replicatesRequired: 3 },
      labs: CELLS.map((values, i) => ({
        organisationId: labs[i]!.id,
        participantCode: `L${i + 1}`,
        values: { A: values },
      })),
    });
    await createUser(e.ds, {
      email: 'coordinator@precision.test',
      name: 'Cora Coordinator',
      roles: ['coordinator'],
    });
  });
  afterAll(() => e.close());

  it('coordinator: confirm an exclusion with a reason, s_R changes at once and is stored', async () => {
    const page = await e.page();
    await e.signIn(page, 'coordinator@precision.test');
    await page.goto(`/desk/rounds/${s.round.id}`);
    await page.getByTestId('precision-study-note').waitFor();
    await page.getByTestId('precision-study-link').click();
    await page.getByTestId('page-heading').getByText('Precision study: RR-E2E-1').waitFor();

    const sR = page.getByTestId('sR-A-x');
    const before = parseFloat((await sR.textContent()) ?? '');
    expect(before).toBeCloseTo(reproducibilitySd(CELLS), 3);
    const pending = page.getByTestId('pending-L8-A-x');
    await expect(pending.textContent()).resolves.toMatch(/Outlier.*Grubbs \(single\)/);
    await expect(
      pending.locator('[data-signal="action"] [data-shape="diamond"]').count(),
    ).resolves.toBe(1);
    await e.shot(page, 'precision-study');

    // A reason is required: the dialog stays open and says so.
    await pending.getByRole('button', { name: /Decide on L8/ }).click();
    await page.getByTestId('decision-confirm').click();
    await page
      .getByRole('dialog')
      .getByText(/Required|Give a reason/)
      .waitFor();
    await page.getByTestId('decision-reason').fill('Measured at 35 °C instead of 25 °C');
    await page.getByTestId('decision-confirm').click();

    const expected = reproducibilitySd(CELLS.slice(0, 7));
    await page.waitForFunction(
      ([want]) => {
        const el = document.querySelector('[data-testid="sR-A-x"]');
        return !!el && Math.abs(parseFloat(el.textContent ?? '') - want) < 5e-4;
      },
      [expected] as const,
    );
    expect(parseFloat((await sR.textContent()) ?? '')).toBeLessThan(before / 2);
    await expect(page.getByTestId('p-A-x').textContent()).resolves.toMatch(/7 of 8 labs/);
    await page.getByTestId('precision-message').getByText('Decision on L8 stored.').waitFor();
    await page.getByTestId('no-pending').waitFor();
    await expect(page.getByTestId('decisions').textContent()).resolves.toMatch(
      /Measured at 35 °C instead of 25 °C/,
    );
    expect(await seriousViolations(page)).toEqual([]);

    await page.reload();
    await sR.waitFor();
    expect(parseFloat((await sR.textContent()) ?? '')).toBeCloseTo(expected, 3);
    await e.shot(page, 'precision-study-decided');
    await page.setViewportSize({ width: 390, height: 844 });
    await e.shot(page, 'precision-study-narrow');
    expect(e.consoleErrors).toEqual([]);
  });
});
