import JSZip from 'jszip';
import { createHash } from 'node:crypto';
import { readFile } from 'node:fs/promises';
import { AssessorGrant } from '../../db/entities';
import { buildEvaluationFixture } from '../../api/src/testing/evaluation-fixtures';
import { createUser, signedIn } from '../../api/src/testing/test-app';
import { startE2E, type E2E } from './support/harness';

jest.setTimeout(180_000);

/** An assessor signs in, opens a granting lab, and downloads an Evidence pack that checks out. */
describe('assessor in a real browser', () => {
  let e: E2E;
  let labName: string;
  beforeAll(async () => {
    e = await startE2E();
    const fx = await buildEvaluationFixture(e.ds, {
      participants: 15,
      labPrefix: 'Browser Granting Lab',
    });
    labName = fx.labs[0]!.name;
    await createUser(e.ds, { email: 'coord@assessor-e2e.test', roles: ['coordinator'] });
    const assessor = await createUser(e.ds, {
      email: 'asa@assessor-e2e.test',
      name: 'Asa Assessor',
      roles: ['assessor'],
    });
    const c = await signedIn(e.app, 'coord@assessor-e2e.test');
    for (const step of ['evaluation', 'evaluation/commit', 'publish']) {
      await c.agent
        .post(`/api/v1/rounds/${fx.round.id}/${step}`)
        .set('x-csrf-token', c.csrf)
        .send({})
        .expect(step === 'evaluation' ? 201 : 200);
    }
    await e.ds.getRepository(AssessorGrant).insert({
      organisationId: fx.labs[0]!.id,
      assessorId: assessor.id,
      grantedBy: null,
      startsOn: '2020-01-01',
      endsOn: null,
      revokedAt: null,
    });
  });
  afterAll(() => e.close());

  it('lists the granting lab, shows its round and downloads the Evidence pack', async () => {
    const page = await e.page();
    await e.signIn(page, 'asa@assessor-e2e.test');
    await page.getByTestId('lab-link').filter({ hasText: labName }).click();
    await page.getByTestId('page-heading').filter({ hasText: labName }).waitFor();
    await page.getByTestId('round').first().waitFor();
    await e.shot(page, 'assessor-lab');
    const [download] = await Promise.all([
      page.waitForEvent('download', { timeout: 60_000 }),
      page.getByTestId('download-evidence').click(),
    ]);
    expect(download.suggestedFilename()).toMatch(/^evidence-.*\.zip$/);
    const zip = await JSZip.loadAsync(await readFile((await download.path())!));
    const manifest = JSON.parse(await zip.file('manifest.json')!.async('string')) as {
      files: { path: string; sha256: string }[];
    };
    expect(manifest.files.length).toBeGreaterThanOrEqual(8);
    for (const f of manifest.files) {
      const data = await zip.file(f.path)!.async('nodebuffer');
      expect(createHash('sha256').update(data).digest('hex')).toBe(f.sha256);
    }
    expect(e.consoleErrors).toEqual([]);
  });
});
