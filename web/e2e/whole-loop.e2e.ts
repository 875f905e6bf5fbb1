import ExcelJS from 'exceljs';
import { randomUUID } from 'node:crypto';
import { mkdirSync, writeFileSync } from 'node:fs';
import { readFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import JSZip from 'jszip';
import type { Page } from 'playwright-core';
import {
  Enrolment,
  Investigation,
  Measurand,
  Organisation,
  Round,
  TestItem,
  User,
} from '../../db/entities';
import { passingCheck } from '../../api/src/testing/bench-fixtures';
import {
  createLab,
  createUser,
  mailTo,
  signedIn,
  type Client,
} from '../../api/src/testing/test-app';
import type { SubmissionData } from '../../shared/contracts/submission';
import { seriousViolations, type AxeViolation } from './support/axe';
import { recordPassingCheck } from './support/bench-steps';
import { startE2E, type E2E } from './support/harness';
import {
  createScheme,
  evaluateRound,
  fillTwoItemRound,
  inviteHarbourAndNewRidgeLab,
  openEnrolment,
  previewTenPercentSigma,
  saveCommitAndPublish,
} from './support/round-steps';

jest.setTimeout(300_000);

const README_DIR = join(__dirname, 'readme');
const README_SHOTS = process.env['RINGLET_README_SHOTS'] === '1';
const ROUND = 'WL-2027-1';
const CONDITIONS = {
  instrument: 'Sizer One',
  laserWavelengthNm: 633,
  scatteringAngleDeg: 173,
  temperatureC: 25,
  equilibrationMin: 10,
  dispersant: 'water',
  viscosityMPas: 0.89,
  refractiveIndex: 1.332,
  dilution: '1:100',
  filterPoreUm: null,
  cuvette: 'disposable polystyrene',
};
/** Eleven labs that take part through the API; the third reports a clear blunder on item A (160 nm for a 100 nm latex). */
const BULK = [
  'Alder',
  'Birch',
  'Cedar',
  'Elm',
  'Fir',
  'Hornbeam',
  'Juniper',
  'Larch',
  'Maple',
  'Oak',
  'Rowan',
];
const OFFSETS = [-2.4, -1.7, -1.1, -0.6, -0.2, 0.3, 0.7, 1.2, 1.6, 2.1, -0.9];
const BLUNDER = 2;

const r1 = (x: number) => Math.round(x * 10) / 10;
const r3 = (x: number) => Math.round(x * 1000) / 1000;
const runs = (v: number) => [r1(v - 0.3), r1(v), r1(v + 0.3)];
const pdiRuns = (v: number) => [r3(v - 0.002), r3(v), r3(v + 0.002)];

/** A datetime-local value `days` from now. */
function localInDays(days: number): string {
  const d = new Date(Date.now() + days * 86400_000);
  const p = (n: number) => String(n).padStart(2, '0');
  return `${d.getFullYear()}-${p(d.getMonth() + 1)}-${p(d.getDate())}T12:00`;
}

/** Focus is visible: an outline or a box shadow on the focused element. */
async function focusState(
  page: Page,
): Promise<{ testid: string | null; tag: string; visible: boolean }> {
  return page.evaluate(() => {
    const el = document.activeElement as HTMLElement | null;
    if (!el || el === document.body) return { testid: null, tag: 'BODY', visible: false };
    const s = getComputedStyle(el);
    const outline = s.outlineStyle !== 'none' && parseFloat(s.outlineWidth) > 0;
    const shadow = !!s.boxShadow && s.boxShadow !== 'none';
    // a Material field shows focus on its own outline (thicker, in the primary colour)
    const field = !!el.closest('.mat-mdc-form-field.mat-focused');
    return {
      testid: el.getAttribute('data-testid'),
      tag: el.tagName,
      visible: outline || shadow || field,
    };
  });
}

/** Presses Tab (keyboard only) until the element with data-testid `testid` has focus; checks its ring. */
async function tabTo(page: Page, testid: string, max = 150): Promise<void> {
  for (let i = 0; i < max; i++) {
    await page.keyboard.press('Tab');
    const f = await focusState(page);
    if (f.testid === testid) {
      expect({ testid, visible: f.visible }).toEqual({ testid, visible: true });
      return;
    }
  }
  throw new Error(`Tab never reached ${testid}`);
}

describe('the whole loop in a real browser', () => {
  /** The steps build on each other: after a failure the later steps stop at once instead of timing out. */
  let broken: string | null = null;
  const step = (name: string, fn: () => Promise<void>) =>
    it(name, async () => {
      if (broken) throw new Error(`skipped: step "${broken}" failed`);
      try {
        await fn();
      } catch (err) {
        broken = name;
        for (const [k, p] of e.browser
          .contexts()
          .flatMap((c) => c.pages())
          .entries())
          await e.shot(p, `loop-failure-${k}`).catch(() => undefined);
        throw err;
      }
    });
  let e: E2E;
  let coordPage: Page;
  let roundId = '';
  let coord: Client;
  const a11y: { where: string; violations: AxeViolation[] }[] = [];
  /** axe-core on the page as it is now; collected and asserted empty at the end of each step. */
  const axe = async (page: Page, where: string) => {
    a11y.push({ where, violations: await seriousViolations(page) });
  };
  const expectNoViolations = () => expect(a11y.filter((x) => x.violations.length)).toEqual([]);
  const readme = async (page: Page, name: string) => {
    if (!README_SHOTS) return;
    mkdirSync(README_DIR, { recursive: true });
    await page.setViewportSize({ width: 1280, height: 800 });
    await page.screenshot({ path: join(README_DIR, name), fullPage: false });
  };
  const bulk: { lab: Organisation; email: string; client?: Client }[] = [];

  const post = (c: Client, path: string, body: unknown) =>
    c.agent
      .post(`/api/v1${path}`)
      .set('x-csrf-token', c.csrf)
      .send(body as object);

  beforeAll(async () => {
    e = await startE2E();
    await createUser(e.ds, {
      email: 'cora@wl.test',
      name: 'Cora Coordinator',
      roles: ['coordinator'],
    });
    await createUser(e.ds, { email: 'ada@wl.test', name: 'Ada Admin', roles: ['admin'] });
    await createUser(e.ds, { email: 'asa@wl.test', name: 'Asa Assessor', roles: ['assessor'] });
    await createUser(e.ds, {
      email: 'leaving@wl.test',
      name: 'Lou Leaving',
      roles: ['coordinator'],
    });
    const harbour = await createLab(e.ds, 'Harbour Sizing Lab');
    await createUser(e.ds, {
      email: 'lena@harbour.test',
      name: 'Lena Harbour',
      lab: harbour.id,
      manager: true,
    });
    for (const name of BULK) {
      const lab = await createLab(e.ds, `${name} Sizing Lab`);
      const email = `manager@${name.toLowerCase()}.test`;
      await createUser(e.ds, { email, name: `${name} Manager`, lab: lab.id, manager: true });
      bulk.push({ lab, email });
    }
    coord = await signedIn(e.app, 'cora@wl.test');
  });
  afterAll(() => e.close());

  step(
    '1. the coordinator creates a scheme and a round, opens enrolment and invites labs',
    async () => {
      coordPage = await e.page();
      const page = coordPage;
      await e.signIn(page, 'cora@wl.test');
      await createScheme(page, 'WL-DLS', 'Nanoparticle sizing by DLS');

      await fillTwoItemRound(page, {
        code: ROUND,
        title: 'Latex and silica, whole loop',
        resultsDue: localInDays(30),
      });
      await page.getByRole('button', { name: 'Create round' }).click();
      await page.waitForURL((u) => u.pathname.startsWith('/desk/rounds/'));
      roundId = new URL(page.url()).pathname.split('/').pop()!;
      await page
        .locator('ag-grid-angular[aria-label="Measurands"]')
        .getByText('Z-average diameter')
        .waitFor();
      await page
        .locator('ag-grid-angular[aria-label="Measurands"]')
        .getByText('Polydispersity index (PDI)')
        .waitFor();

      await openEnrolment(page);

      // an existing lab and a new lab through the page
      await inviteHarbourAndNewRidgeLab(page, 'lena@harbour.test');
      await axe(page, 'round detail (enrolling)');
      await e.shot(page, 'loop-01-round-invitations');

      // eleven more existing labs in one request
      await post(coord, `/rounds/${roundId}/invitations`, {
        invitations: bulk.map((b) => ({ organisationId: b.lab.id, email: b.email })),
      }).expect(201);
      await page.goto('/desk');
      await page.getByText(ROUND).first().waitFor();
      await axe(page, 'Round desk list');
      expectNoViolations();
    },
  );

  step(
    '2. invited labs read their mail on the Outbox page, follow the link and accept',
    async () => {
      // Harbour (an existing lab): its manager reads the mail on the Outbox page and accepts signed in
      await mailTo(e.ds, 'lena@harbour.test');
      const lena = await e.page();
      await e.signIn(lena, 'lena@harbour.test');
      await lena.getByRole('link', { name: 'Outbox' }).click();
      await lena.getByRole('option').filter({ hasText: 'lena@harbour.test' }).click();
      await axe(lena, 'Outbox');
      await e.shot(lena, 'loop-02-outbox');
      await lena.getByTestId('outbox-message').locator('a[href*="/invitations/"]').click();
      await lena.getByTestId('accept').click();
      await expect(lena.getByTestId('accepted').textContent()).resolves.toMatch(/participant code/);
      await lena.close();

      // Ridge (a new lab): the admin reads the link on the Outbox page; it is opened by someone without an account
      // (the demo Outbox shows each user their own mail; the admin sees every message)
      await mailTo(e.ds, 'contact@ridge.test');
      const adminPage = await e.page();
      await e.signIn(adminPage, 'ada@wl.test');
      await adminPage.goto('/outbox');
      await adminPage.getByRole('option').filter({ hasText: 'contact@ridge.test' }).click();
      const invitationHref = await adminPage
        .getByTestId('outbox-message')
        .locator('a[href*="/invitations/"]')
        .getAttribute('href');
      const ridge = await e.page();
      await ridge.goto(invitationHref!);
      await ridge.getByTestId('accept').click();
      await ridge.getByTestId('accepted').waitFor();
      await mailTo(e.ds, 'contact@ridge.test', 2);
      await adminPage.getByRole('button', { name: 'Refresh' }).click();
      await adminPage
        .getByRole('option')
        .filter({ hasText: 'contact@ridge.test' })
        .filter({ hasText: 'Your Ringlet account' })
        .click();
      const passwordHref = await adminPage
        .getByTestId('outbox-message')
        .locator('a[href*="/set-password/"]')
        .getAttribute('href');
      await ridge.goto(passwordHref!);
      await ridge.getByLabel('New password').fill('ridge lab password 2027');
      await ridge.getByLabel('Confirm password').fill('ridge lab password 2027');
      await ridge.getByRole('button', { name: 'Save password' }).click();
      await ridge.getByTestId('password-set').waitFor();
      await adminPage.close();
      await ridge.close();

      // the eleven API labs accept with the token from their mail
      for (const b of bulk) {
        const [mail] = await mailTo(e.ds, b.email);
        const token = /\/invitations\/([A-Za-z0-9_-]+)/.exec(mail!.text)![1]!;
        b.client = await signedIn(e.app, b.email);
        await post(b.client, `/invitations/${token}/accept`, {}).expect(201);
      }
      expect(await e.ds.getRepository(Enrolment).countBy({ roundId })).toBe(13);
      expectNoViolations();
    },
  );

  step('3. the coordinator dispatches and the round starts collecting', async () => {
    const page = coordPage;
    // the enrolments grid is wide: its row actions show without scrolling on a wide screen
    await page.setViewportSize({ width: 1920, height: 1000 });
    await page.goto(`/desk/rounds/${roundId}`);
    const enrolments = await e.ds.getRepository(Enrolment).findBy({ roundId });
    const ridgeLab = await e.ds
      .getRepository(Organisation)
      .findOneByOrFail({ name: 'Ridge Particle Lab' });
    const harbourLab = await e.ds
      .getRepository(Organisation)
      .findOneByOrFail({ name: 'Harbour Sizing Lab' });
    const uiCodes = enrolments
      .filter((x) => x.organisationId === ridgeLab.id || x.organisationId === harbourLab.id)
      .map((x) => x.participantCode);
    const grid = page.locator('ag-grid-angular[aria-label="Enrolments"]');
    await grid.getByText('Harbour Sizing Lab').waitFor();
    for (const code of uiCodes) {
      // the row actions sit in the last column: scroll the grid sideways, as a user would
      await grid.locator('.ag-body-horizontal-scroll-viewport').evaluate((el) => {
        el.scrollLeft = el.scrollWidth;
        el.dispatchEvent(new Event('scroll'));
      });
      await page.getByRole('button', { name: `Record dispatch to ${code}` }).click();
      await page.getByLabel('Courier').fill('Parcel courier');
      await page.getByLabel('Tracking number').fill(`TRK-${code}`);
      await page.getByTestId('dialog-confirm').click();
      await page.getByRole('dialog').waitFor({ state: 'detached' });
    }
    for (const x of enrolments.filter((x) => !uiCodes.includes(x.participantCode))) {
      await post(coord, `/rounds/${roundId}/enrolments/${x.id}/dispatch`, {
        courier: 'Parcel courier',
        trackingNumber: `TRK-${x.participantCode}`,
        dispatchedOn: new Date().toISOString().slice(0, 10),
      }).expect(200);
    }
    await page.getByTestId('move-in-transit').click();
    await page.getByTestId('dialog-confirm').click();
    await page.getByTestId('round-state').getByText('In transit').waitFor();
    await page.getByTestId('move-collecting').click();
    await page.getByTestId('dialog-confirm').click();
    await page.getByTestId('round-state').getByText('Collecting').waitFor();
    await e.shot(page, 'loop-03-collecting');
    await page.setViewportSize({ width: 1280, height: 860 });
  });

  /** Receipt and an instrument check through the Lab bench round page. */
  async function receiptAndCheck(page: Page): Promise<void> {
    await page.getByRole('link', { name: new RegExp(ROUND) }).click();
    await page.getByTestId('page-heading').filter({ hasText: ROUND }).waitFor();
    await page.getByRole('button', { name: 'Record receipt' }).click();
    await page.getByTestId('receipt-state').filter({ hasText: 'Intact' }).waitFor();
    await recordPassingCheck(page, 'Sizer One');
  }

  step(
    '4. Harbour: receipt, instrument check, and results typed with the keyboard only',
    async () => {
      const page = await e.page();
      await e.signIn(page, 'lena@harbour.test');
      await axe(page, 'Lab bench dashboard');
      await e.shot(page, 'loop-04-lab-bench');
      await receiptAndCheck(page);

      // keyboard only from here: Tab to the first run, type, Tab on through the grid
      await page.getByTestId('page-heading').focus(); // start of the page (headings take no part in Tab order)
      await tabTo(page, 'rep-A-z_average-1');
      const typeRow = async (values: number[]) => {
        for (const [k, v] of values.entries()) {
          const f = await focusState(page);
          expect(f).toMatchObject({ tag: 'INPUT', visible: true });
          await page.keyboard.type(String(v));
          if (k < values.length - 1) await page.keyboard.press('Tab');
        }
      };
      const harbour = {
        A: { z: [101.2, 101.5, 101.0], p: [0.052, 0.054, 0.05] },
        B: { z: [60.4, 60.7, 60.2], p: [0.081, 0.079, 0.083] },
      };
      await typeRow(harbour.A.z);
      await tabTo(page, 'rep-A-pdi-1');
      await typeRow(harbour.A.p);
      await tabTo(page, 'cond-A-instrument');
      await page.keyboard.type('Sizer One');
      await tabTo(page, 'rep-B-z_average-1');
      await typeRow(harbour.B.z);
      await tabTo(page, 'rep-B-pdi-1');
      await typeRow(harbour.B.p);
      await tabTo(page, 'cond-B-instrument');
      await page.keyboard.type('Sizer One');
      await page.getByTestId('save-state').filter({ hasText: 'Saved' }).waitFor();
      await axe(page, 'Lab bench round page (results entry)');
      await tabTo(page, 'submit');
      await page.keyboard.press('Enter');
      await page
        .getByTestId('submit-message')
        .filter({ hasText: 'Version 1 submitted.' })
        .waitFor();
      await e.shot(page, 'loop-05-results-submitted');

      const [row] = await e.ds.query(
        `SELECT v.data FROM submission_version v JOIN submission s ON s.id = v.submission_id JOIN enrolment en ON en.id = s.enrolment_id
       JOIN organisation o ON o.id = en.organisation_id WHERE o.name = 'Harbour Sizing Lab' AND v.version = 1`,
      );
      const items = (row.data as SubmissionData).items;
      expect(items.map((i) => i.results.map((r) => r.replicates))).toEqual([
        [harbour.A.z, harbour.A.p],
        [harbour.B.z, harbour.B.p],
      ]);
      expectNoViolations();
    },
  );

  step(
    '5. Ridge: results through the XLSX workbook (download, fill, upload) and submit',
    async () => {
      const page = await e.page();
      await e.signIn(page, 'contact@ridge.test', 'ridge lab password 2027');
      await receiptAndCheck(page);
      const [download] = await Promise.all([
        page.waitForEvent('download'),
        page.getByTestId('template-link').click(),
      ]);
      const wb = new ExcelJS.Workbook();
      await wb.xlsx.load((await readFile((await download.path())!)) as unknown as ArrayBuffer);
      const values: Record<string, number[]> = {
        'A z_average': [99.4, 99.8, 99.6],
        'A pdi': [0.049, 0.051, 0.05],
        'B z_average': [59.6, 59.9, 59.7],
        'B pdi': [0.078, 0.08, 0.082],
      };
      const results = wb.getWorksheet('Results')!;
      results.eachRow((row, r) => {
        if (r === 1) return;
        const v = values[`${row.getCell(1).text} ${row.getCell(2).text}`]!;
        v.forEach((x, k) => (row.getCell(5 + k).value = x));
      });
      const cond = wb.getWorksheet('Conditions')!;
      const headers: string[] = [];
      cond.getRow(1).eachCell((c, i) => (headers[i] = c.text));
      cond.eachRow((row, r) => {
        if (r === 1) return;
        row.getCell(headers.indexOf('Instrument')).value = 'Sizer One';
        row.getCell(headers.indexOf('Viscosity (mPa·s)')).value = 0.89;
      });
      const file = join(tmpdir(), `ringlet-${randomUUID()}.xlsx`);
      writeFileSync(file, Buffer.from(await wb.xlsx.writeBuffer()));
      await page.locator('input[type="file"][accept=".xlsx"]').setInputFiles(file);
      await page.getByText(/Workbook read into the draft/).waitFor();
      // the page reloads the draft the workbook filled
      await page.waitForFunction(
        () =>
          (document.querySelector('[data-testid="rep-B-z_average-2"]') as HTMLInputElement | null)
            ?.value === '59.9',
      );
      await page.getByTestId('submit').click();
      await page
        .getByTestId('submit-message')
        .filter({ hasText: 'Version 1 submitted.' })
        .waitFor();
    },
  );

  step('6. eleven more labs record a check and submit through the API (one blunder)', async () => {
    const items = await e.ds
      .getRepository(TestItem)
      .find({ where: { roundId }, order: { position: 'ASC' } });
    const ms = await e.ds
      .getRepository(Measurand)
      .find({ where: { roundId }, order: { position: 'ASC' } });
    const z = ms.find((m) => m.key === 'z_average')!;
    const p = ms.find((m) => m.key === 'pdi')!;
    for (const [k, b] of bulk.entries()) {
      const zA = k === BLUNDER ? 160 : 100 + OFFSETS[k]!;
      const zB = 60 + OFFSETS[k]! * 0.6;
      const pdi = 0.05 + 0.002 * (k - 5);
      const data: SubmissionData = {
        items: items.map((item, ii) => ({
          testItemId: item.id,
          results: [
            { measurandId: z.id, replicates: runs(ii === 0 ? zA : zB), uncertainty: null },
            {
              measurandId: p.id,
              replicates: pdiRuns(ii === 0 ? pdi : pdi + 0.03),
              uncertainty: null,
            },
          ],
          conditions: CONDITIONS,
          methodNotes: '',
        })),
        acknowledgedWarnings: [],
        explanation: '',
      };
      await post(b.client!, '/my/instrument-checks', passingCheck('Sizer One')).expect(201);
      let res = await post(b.client!, `/rounds/${roundId}/submission/submit`, {
        idempotencyKey: randomUUID(),
        data,
      });
      if (res.status === 422 && res.body.error.code === 'warnings_unacknowledged') {
        data.acknowledgedWarnings = (res.body.error.details as { code: string }[]).map(
          (w) => w.code,
        );
        res = await post(b.client!, `/rounds/${roundId}/submission/submit`, {
          idempotencyKey: randomUUID(),
          data,
        });
      }
      expect({ lab: b.lab.name, status: res.status }).toEqual({ lab: b.lab.name, status: 201 });
    }
  });

  step(
    '7. the coordinator closes early (forced, with a reason), evaluates, previews σ_pt, commits and publishes',
    async () => {
      const page = coordPage;
      await page.goto(`/desk/rounds/${roundId}`);
      await page.getByTestId('move-closed').click();
      await page
        .getByRole('dialog')
        .getByRole('textbox', { name: 'Reason' })
        .fill('All thirteen labs have submitted.');
      await page
        .getByRole('dialog')
        .getByRole('checkbox', { name: /Close early, before results are due/ })
        .check();
      await page.getByTestId('dialog-confirm').click();
      await page.getByTestId('round-state').getByText('Closed').waitFor();
      const closed = await e.ds.getRepository(Round).findOneByOrFail({ id: roundId });
      expect(closed.state).toBe('closed');

      await page.getByRole('link', { name: 'Consensus board' }).first().click();
      await page.getByTestId('page-heading').first().waitFor();
      const sigma = await evaluateRound(page, roundId);
      const before = Number(await sigma.textContent());
      // robust SD of twelve labs spread over ±2.4 nm around 100 nm (the blunder does not move it much)
      expect(before).toBeGreaterThan(0.8);
      expect(before).toBeLessThan(3);
      await expect(page.getByTestId('action-A-z_average').textContent()).resolves.toBe('1');
      await axe(page, 'evaluation page');

      await previewTenPercentSigma(page);
      await expect(sigma.textContent()).resolves.not.toBe(String(before));
      const after = Number(await sigma.textContent());
      expect(after).toBeGreaterThan(9.5); // 10 % of x_pt ≈ 100 nm
      expect(after).toBeLessThan(10.5);
      await e.shot(page, 'loop-06-evaluation-preview');
      // back to the stored rule: the round's robust SD
      await page.getByRole('button', { name: /Remove σ_pt rule for Z-average/ }).click();
      await sigma.filter({ hasText: String(before) }).waitFor({ timeout: 10_000 });
      await expect(sigma.textContent()).resolves.toBe(String(before));

      await saveCommitAndPublish(page, 13);

      await page.goto(`/board/rounds/${roundId}`);
      await page.locator('.ag-row').first().waitFor();
      // The charts come after the grid (@defer on idle): check the page once their picker is named.
      await page.getByLabel('Item and measurand').first().waitFor();
      await axe(page, 'Consensus board (coordinator)');
      await e.shot(page, 'loop-07-consensus-board');
      await readme(page, 'consensus-board.png');
      await page.setViewportSize({ width: 1280, height: 860 });
      expectNoViolations();
    },
  );

  step(
    '8. the blundering lab reads its scores, works on the investigation and grants the assessor access',
    async () => {
      const b = bulk[BLUNDER]!;
      const page = await e.page();
      await e.signIn(page, b.email);
      await page.goto(`/board/rounds/${roundId}`);
      await page.locator('.ag-row').first().waitFor();
      // the signal has a shape and a word, not only a colour
      const action = page.locator('.ag-row app-signal-badge[data-signal="action"]').first();
      await expect(action.locator('svg[data-shape="diamond"]').count()).resolves.toBe(1);
      await expect(action.textContent()).resolves.toContain('Action');
      const html = await page.content();
      for (const other of bulk.filter((x) => x !== b)) expect(html).not.toContain(other.lab.name);
      await axe(page, 'Consensus board (lab)');

      await page.goto(`/board/rounds/${roundId}/scores`);
      const card = page.getByTestId('score-A-z_average');
      await card.waitFor();
      await expect(card.textContent()).resolves.toMatch(/Action signal/);
      await expect(
        card.locator('app-signal-badge[data-signal="action"] svg[data-shape="diamond"]').count(),
      ).resolves.toBe(1);
      await expect(
        card.locator('app-signal-badge[data-signal="action"] .word').textContent(),
      ).resolves.toMatch(/Action/);
      await axe(page, 'score page');
      await e.shot(page, 'loop-08-lab-scores');
      await readme(page, 'lab-scores.png');
      await page.setViewportSize({ width: 1280, height: 860 });

      await card.getByRole('link', { name: 'Open the investigation' }).click();
      await page.getByTestId('page-heading').getByText('Investigation').waitFor();
      await page.getByTestId('cause').click();
      await page.getByRole('option').first().click();
      await page
        .getByLabel('Root cause')
        .fill('The cuvette was not rinsed; dust from the previous sample.');
      await page
        .getByLabel('Corrective action')
        .fill('Rinse and filter every cuvette; added to the method.');
      await page.getByRole('button', { name: 'Save' }).click();
      await page.getByRole('status').filter({ hasText: /saved/i }).waitFor();
      await axe(page, 'investigation detail');
      await e.shot(page, 'loop-09-investigation');
      const invs = await e.ds.getRepository(Investigation).findBy({ organisationId: b.lab.id });
      expect(invs.map((i) => i.rootCause)).toContain(
        'The cuvette was not rinsed; dust from the previous sample.',
      );

      await page.goto('/board/investigations');
      await page.getByRole('link', { name: ROUND }).first().waitFor();
      await axe(page, 'investigations list');
      await page.goto('/bench/track-record');
      await page.getByTestId('page-heading').first().waitFor();
      await page.waitForLoadState('networkidle');
      await axe(page, 'Track record');

      // the lab manager grants the assessor (no page for it yet: through the API)
      await post(b.client!, `/labs/${b.lab.id}/assessor-grants`, { email: 'asa@wl.test' }).expect(
        201,
      );
      expectNoViolations();
    },
  );

  step('9. the assessor downloads the Evidence pack of the granting lab', async () => {
    const b = bulk[BLUNDER]!;
    const page = await e.page();
    await e.signIn(page, 'asa@wl.test');
    await axe(page, 'assessor home');
    await page.getByTestId('lab-link').filter({ hasText: b.lab.name }).click();
    await page.getByTestId('page-heading').filter({ hasText: b.lab.name }).waitFor();
    await page.getByTestId('round').first().waitFor();
    await axe(page, 'assessor lab page');
    await e.shot(page, 'loop-10-assessor-lab');
    const [download] = await Promise.all([
      page.waitForEvent('download', { timeout: 60_000 }),
      page.getByTestId('download-evidence').click(),
    ]);
    const zip = await JSZip.loadAsync(await readFile((await download.path())!));
    const manifest = JSON.parse(await zip.file('manifest.json')!.async('string')) as {
      files: { path: string }[];
    };
    expect(manifest.files.length).toBeGreaterThan(0);
    expect(JSON.stringify(manifest)).toContain(ROUND);
    expectNoViolations();
  });

  step('10. the admin invites a user and deactivates another', async () => {
    const page = await e.page();
    await e.signIn(page, 'ada@wl.test');
    await page.getByTestId('invite-user').click();
    const dialog = page.getByRole('dialog');
    await dialog.getByLabel('E-mail').fill('new.coordinator@wl.test');
    await dialog.getByLabel('Name').fill('Nia Newcomer');
    await dialog.getByLabel('Roles').click();
    await page.getByRole('option', { name: 'Coordinator' }).click();
    await page.keyboard.press('Escape');
    await dialog.getByRole('button', { name: 'Send invitation' }).click();
    await dialog.waitFor({ state: 'detached' });
    await page.locator('ag-grid-angular').getByText('new.coordinator@wl.test').waitFor();
    await mailTo(e.ds, 'new.coordinator@wl.test');

    await page.getByLabel('Filter').fill('leaving@wl.test');
    await page.getByRole('button', { name: 'Edit Lou Leaving' }).click();
    await page.getByRole('dialog').getByText('Active (can sign in)').click();
    await page.getByRole('dialog').getByRole('button', { name: 'Save' }).click();
    await page.getByRole('dialog').waitFor({ state: 'detached' });
    await page.locator('ag-grid-angular').getByText('Inactive').waitFor();
    expect(
      (await e.ds.getRepository(User).findOneByOrFail({ email: 'leaving@wl.test' })).isActive,
    ).toBe(false);
    await page.getByLabel('Filter').fill('');
    await axe(page, 'admin users');
    await e.shot(page, 'loop-11-admin-users');
    await page.goto('/admin/labs');
    await page.locator('ag-grid-angular').getByText('Ridge Particle Lab').waitFor();
    await axe(page, 'admin labs');
    expectNoViolations();
    expect(e.consoleErrors.filter((m) => !/40[134]/.test(m))).toEqual([]);
  });
});
