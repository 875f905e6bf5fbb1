import { createLab, createUser } from '../../api/src/testing/test-app';
import { createBenchRound, enrol, type BenchRound } from '../../api/src/testing/bench-fixtures';
import { recordPassingCheck } from './support/bench-steps';
import { startE2E, type E2E } from './support/harness';

jest.setTimeout(180_000);

/** A lab analyst records a check, enters three runs for two items, and submits. */
describe('Lab bench in a real browser', () => {
  let e: E2E;
  let r: BenchRound;
  beforeAll(async () => {
    e = await startE2E();
    const lab = await createLab(e.ds, 'Hazel Sizing Lab');
    await createUser(e.ds, { email: 'analyst@e2e.test', name: 'Ida Analyst', lab: lab.id });
    r = await createBenchRound(e.ds, { code: 'LB-E2E' });
    await enrol(e.ds, r.round.id, lab.id, 'P-031');
  });
  afterAll(() => e.close());

  it('enters results for two items and submits them', async () => {
    const page = await e.page();
    await e.signIn(page, 'analyst@e2e.test');
    await page.getByRole('link', { name: /LB-E2E/ }).click();
    await page.getByTestId('page-heading').filter({ hasText: 'LB-E2E' }).waitFor();
    expect(await page.getByTestId('participant-code').textContent()).toBe('P-031');
    expect(await page.getByTestId('safety-cautions').textContent()).toContain('laser interlock');

    await recordPassingCheck(page, 'Sizer One');

    // Results: keyboard through the runs of item A, typed into item B
    const values: Record<string, { z: number[]; p: number[] }> = {
      A: { z: [101.8, 102.4, 102.1], p: [0.051, 0.055, 0.049] },
      B: { z: [61.3, 61.0, 61.6], p: [0.08, 0.082, 0.079] },
    };
    await page.getByTestId('rep-A-z_average-1').focus();
    for (const v of values['A']!.z) {
      await page.keyboard.type(String(v));
      await page.keyboard.press('Tab');
    }
    expect(await page.locator(':focus').getAttribute('aria-label')).toBe(
      'A Z-average uncertainty type',
    );
    for (const [k, v] of values['A']!.p.entries())
      await page.getByTestId(`rep-A-pdi-${k + 1}`).fill(String(v));
    for (const [k, v] of values['B']!.z.entries())
      await page.getByTestId(`rep-B-z_average-${k + 1}`).fill(String(v));
    for (const [k, v] of values['B']!.p.entries())
      await page.getByTestId(`rep-B-pdi-${k + 1}`).fill(String(v));
    for (const code of ['A', 'B']) {
      await page.getByTestId(`cond-${code}-instrument`).fill('Sizer One');
      await page.getByTestId(`cond-${code}-viscosityMPas`).fill('0.89');
    }

    // A PDI outside 0–1 is refused as typed, and a radius-like value raises a hint to acknowledge
    await page.getByTestId('rep-B-pdi-1').fill('1.4');
    await page.getByText('B PDI, replicate 1: PDI must be between 0 and 1.').waitFor();
    await page.getByTestId('rep-B-pdi-1').fill('0.08');
    await page.getByTestId('save-state').filter({ hasText: 'Saved' }).waitFor();
    await e.shot(page, 'lab-bench-results-entered');

    // A reload keeps the draft
    await page.reload();
    await page.getByTestId('rep-B-z_average-3').waitFor();
    expect(await page.getByTestId('rep-B-z_average-3').inputValue()).toBe('61.6');

    await page.getByTestId('submit').click();
    await page.getByTestId('submit-message').filter({ hasText: 'Version 1 submitted.' }).waitFor();
    await page.getByTestId('versions').getByText('Ida Analyst').waitFor();
    await e.shot(page, 'lab-bench-submitted');

    const rows: {
      data: { items: { testItemId: string; results: { replicates: number[] }[] }[] };
    }[] = await e.ds.query(
      `SELECT v.data FROM submission_version v JOIN submission s ON s.id = v.submission_id WHERE v.version = 1`,
    );
    expect(rows).toHaveLength(1);
    const byItem = new Map(
      rows[0]!.data.items.map((i) => [i.testItemId, i.results.map((x) => x.replicates)]),
    );
    expect(byItem.get(r.items[0]!.id)).toEqual([values['A']!.z, values['A']!.p]);
    expect(byItem.get(r.items[1]!.id)).toEqual([values['B']!.z, values['B']!.p]);
  });
});
