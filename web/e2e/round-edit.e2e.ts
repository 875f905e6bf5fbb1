import { Measurand, Round, TestItem } from '../../db/entities';
import { createUser, signedIn } from '../../api/src/testing/test-app';
import { startE2E, type E2E } from './support/harness';

jest.setTimeout(180_000);

/**
 * After creating a round, the coordinator edits it on the round page: the due date and fee, a third
 * test item, and the Z-average σ_pt rule; the changes are still there after a reload.
 */
describe('Editing a round in a real browser', () => {
  let e: E2E;
  let roundId: string;
  beforeAll(async () => {
    e = await startE2E();
    await createUser(e.ds, {
      email: 'coordinator@e2e.test',
      name: 'Cora Coordinator',
      roles: ['coordinator'],
    });
    // the round as the Round desk creates it (the creation itself is covered by round-desk.e2e.ts)
    const api = await signedIn(e.app, 'coordinator@e2e.test');
    const post = (path: string, body: object) =>
      api.agent.post(`/api/v1${path}`).set('x-csrf-token', api.csrf).send(body);
    const scheme = await post('/schemes', {
      code: 'NANO-DLS',
      name: 'Nanoparticle sizing by DLS',
    }).expect(201);
    const round = await post('/rounds', {
      schemeId: scheme.body.id,
      code: 'DLS-2026-2',
      title: 'Latex and silica, autumn 2026',
      resultsDueAt: '2026-10-30T12:00:00Z',
      feeMinor: 30000,
      items: [
        { code: 'A', material: 'Polystyrene latex in water', nominalSizeNm: 100 },
        { code: 'B', material: 'Silica in water', nominalSizeNm: 60 },
      ],
    }).expect(201);
    roundId = round.body.id;
  });
  afterAll(() => e.close());

  it('edits the due date and fee, adds a third item, sets σ_pt to 4 % of x_pt; all kept after a reload', async () => {
    const page = await e.page();
    await e.signIn(page, 'coordinator@e2e.test');
    await page.goto(`/desk/rounds/${roundId}`);
    await page.getByTestId('page-heading').getByText('DLS-2026-2').waitFor();

    // the round's description
    await page.getByTestId('edit-round').click();
    const edit = page.getByRole('dialog');
    await edit.getByLabel('Results due').fill('2026-11-20T12:00');
    await edit.getByLabel('Participation fee').fill('450');
    // the basic safety cautions are fixed: shown, and nothing to untick
    await edit
      .getByTestId('fixed-cautions')
      .getByText('Never defeat or bypass the instrument')
      .waitFor();
    expect(await edit.getByTestId('keep-cautions').count()).toBe(0);
    await e.shot(page, 'round-edit-dialog');
    await edit.getByTestId('save-round').click();
    await edit.waitFor({ state: 'detached' });
    await page.getByText('Fee 450.00 EUR').waitFor();

    // a third test item; a taken code is refused under the field first
    await page.getByTestId('add-test-item').click();
    const item = page.getByRole('dialog');
    await item.getByLabel('Item code').fill('a');
    await item.getByLabel('Material', { exact: true }).fill('Gold colloid in citrate buffer');
    await item.getByTestId('save-item').click();
    await item.getByText('The round already has a test item a.').first().waitFor();
    await item.getByLabel('Item code').fill('C');
    await item.getByLabel('Nominal size (nm)').fill('30');
    await item.getByLabel('Storage notes').fill('Keep at 2–8 °C, away from light');
    await item.getByTestId('save-item').click();
    await item.waitFor({ state: 'detached' });
    const items = page.locator('ag-grid-angular[aria-label="Test items"]');
    await items.getByText('Gold colloid in citrate buffer').waitFor();

    // the Z-average σ_pt rule: robust SD → 4 % of x_pt
    await page.getByRole('button', { name: 'Edit measurand Z-average diameter' }).click();
    const measurand = page.getByRole('dialog');
    await measurand.getByTestId('sigma-kind').click();
    await page.getByRole('option', { name: 'Percent of x_pt' }).click();
    await measurand.getByLabel('Percent of x_pt').fill('4');
    await e.shot(page, 'round-edit-measurand');
    await measurand.getByTestId('save-measurand').click();
    await measurand.waitFor({ state: 'detached' });

    // after a reload the page shows what the server kept
    await page.reload();
    await page.getByTestId('page-heading').getByText('DLS-2026-2').waitFor();
    await page.getByText('Fee 450.00 EUR').waitFor();
    const due = await page.evaluate(() =>
      new Date('2026-11-20T12:00').toLocaleString(undefined, {
        dateStyle: 'medium',
        timeStyle: 'short',
      }),
    );
    await page.getByText(`Results due ${due}`).waitFor();
    await page
      .locator('ag-grid-angular[aria-label="Test items"]')
      .getByText('Gold colloid in citrate buffer')
      .waitFor();
    const zRow = page.locator('ag-grid-angular[aria-label="Measurands"] [role="row"]', {
      hasText: 'Z-average diameter',
    });
    await zRow.getByText('4 % of x_pt').waitFor();
    await e.shot(page, 'round-edit-after-reload');

    const round = await e.ds.getRepository(Round).findOneByOrFail({ id: roundId });
    expect(round.feeMinor).toBe(45000);
    const dueInBrowser = await page.evaluate(() => new Date('2026-11-20T12:00').toISOString());
    expect(round.resultsDueAt?.toISOString()).toBe(dueInBrowser);
    expect(round.instructions).toContain('laser interlock');
    const stored = await e.ds
      .getRepository(TestItem)
      .find({ where: { roundId }, order: { position: 'ASC' } });
    expect(stored.map((i) => [i.code, i.nominalSizeNm])).toEqual([
      ['A', 100],
      ['B', 60],
      ['C', 30],
    ]);
    const z = await e.ds.getRepository(Measurand).findOneByOrFail({ roundId, key: 'z_average' });
    expect(z.sigmaPtRule).toEqual({ kind: 'percent', percent: 4 });
    const pdi = await e.ds.getRepository(Measurand).findOneByOrFail({ roundId, key: 'pdi' });
    expect(pdi.sigmaPtRule).toEqual({ kind: 'robust-sd' });
    expect(e.consoleErrors.filter((m) => !/40[19]/.test(m))).toEqual([]);
  });
});
