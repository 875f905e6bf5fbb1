import { createLab, createUser } from '../../api/src/testing/test-app';
import { createBenchRound, enrol, type BenchRound } from '../../api/src/testing/bench-fixtures';
import { startE2E, type E2E } from './support/harness';

jest.setTimeout(180_000);

/**
 * The connection drops while a lab types replicates: the page says it is offline and will retry,
 * keeps what is typed, and saves all of it once the connection is back.
 */
describe('Lab bench with a dropped connection', () => {
  let e: E2E;
  let r: BenchRound;
  beforeAll(async () => {
    e = await startE2E();
    const lab = await createLab(e.ds, 'Alder Sizing Lab');
    await createUser(e.ds, { email: 'analyst@offline-e2e.test', name: 'Oda Analyst', lab: lab.id });
    r = await createBenchRound(e.ds, { code: 'LB-OFF' });
    await enrol(e.ds, r.round.id, lab.id, 'P-044');
  });
  afterAll(() => e.close());

  it('keeps typing through an outage and saves everything when the connection returns', async () => {
    const page = await e.page();
    await e.signIn(page, 'analyst@offline-e2e.test');
    await page.getByRole('link', { name: /LB-OFF/ }).click();
    await page.getByTestId('page-heading').filter({ hasText: 'LB-OFF' }).waitFor();
    const state = page.getByTestId('save-state');

    // Online: item A's Z-average runs save as usual
    const aZ = [101.8, 102.4, 102.1];
    for (const [k, v] of aZ.entries())
      await page.getByTestId(`rep-A-z_average-${k + 1}`).fill(String(v));
    await state.filter({ hasText: 'Saved' }).waitFor();
    expect(await state.getAttribute('data-state')).toBe('saved');

    // The connection drops: the next save fails and the page says so
    await page.context().setOffline(true);
    const aP = [0.051, 0.055, 0.049];
    for (const [k, v] of aP.entries()) await page.getByTestId(`rep-A-pdi-${k + 1}`).fill(String(v));
    await state.filter({ hasText: 'Offline — will retry' }).waitFor({ timeout: 45_000 });
    expect(await state.getAttribute('data-state')).toBe('offline');
    await page.getByRole('button', { name: 'Retry now' }).waitFor();
    await e.shot(page, 'lab-bench-offline');

    // Still offline: more values typed, still not saved
    const bZ = [61.3, 61.0, 61.6];
    for (const [k, v] of bZ.entries())
      await page.getByTestId(`rep-B-z_average-${k + 1}`).fill(String(v));
    await page.waitForTimeout(1_500); // past the 700 ms debounce: the save was attempted and failed
    expect(await state.getAttribute('data-state')).toBe('offline');

    // Back online: the 'online' event triggers the save at once
    await page.context().setOffline(false);
    await state.filter({ hasText: 'Saved' }).waitFor({ timeout: 45_000 });
    expect(await state.getAttribute('data-state')).toBe('saved');

    // A reload shows every value typed, online and offline
    await page.reload();
    await page.getByTestId('rep-B-z_average-3').waitFor();
    for (const [k, v] of aZ.entries())
      expect(await page.getByTestId(`rep-A-z_average-${k + 1}`).inputValue()).toBe(String(v));
    for (const [k, v] of aP.entries())
      expect(await page.getByTestId(`rep-A-pdi-${k + 1}`).inputValue()).toBe(String(v));
    for (const [k, v] of bZ.entries())
      expect(await page.getByTestId(`rep-B-z_average-${k + 1}`).inputValue()).toBe(String(v));

    // The server's stored draft holds them (not just the browser's local copy)
    const rows: {
      draft: { items: { testItemId: string; results: { replicates: (number | null)[] }[] }[] };
      draft_revision: number;
    }[] = await e.ds.query(
      `SELECT s.draft, s.draft_revision FROM submission s JOIN enrolment en ON en.id = s.enrolment_id WHERE en.round_id = $1`,
      [r.round.id],
    );
    expect(rows).toHaveLength(1);
    expect(rows[0]!.draft_revision).toBeGreaterThanOrEqual(2);
    const byItem = new Map(
      rows[0]!.draft.items.map((i) => [i.testItemId, i.results.map((x) => x.replicates)]),
    );
    expect(byItem.get(r.items[0]!.id)).toEqual([aZ, aP]);
    expect(byItem.get(r.items[1]!.id)![0]).toEqual(bZ);
    // Chromium logs each failed request while offline; nothing else may be logged as an error
    expect(
      e.consoleErrors.filter((m) => !/ERR_INTERNET_DISCONNECTED|Failed to load resource/.test(m)),
    ).toEqual([]);
  });
});
