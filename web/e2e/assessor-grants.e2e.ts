import { createLab, createUser, mailTo } from '../../api/src/testing/test-app';
import { startE2E, type E2E } from './support/harness';

// Access may be granted for at most five years (shared/contracts/ranges.ts): one year ahead.
const UNTIL = new Date(Date.now() + 365 * 86_400_000).toISOString().slice(0, 10);

jest.setTimeout(180_000);

/**
 * A lab manager gives an assessor access on "My lab"; the assessor gets the mail (read on the
 * Outbox page) and sees the lab; the manager revokes; the lab disappears for the assessor.
 */
describe('assessor access granted and revoked in a real browser', () => {
  let e: E2E;
  let labId: string;
  const LAB = 'Rowan Particle Lab';
  const ASSESSOR = 'vera.assessor@grants-e2e.test';
  beforeAll(async () => {
    e = await startE2E();
    const lab = await createLab(e.ds, LAB);
    labId = lab.id;
    await createUser(e.ds, {
      email: 'manager@grants-e2e.test',
      name: 'Maud Manager',
      lab: lab.id,
      manager: true,
    });
    await createUser(e.ds, { email: ASSESSOR, name: 'Vera Assessor', roles: ['assessor'] });
  });
  afterAll(() => e.close());

  it('grants, mails, shows, revokes and hides', async () => {
    const manager = await e.page();
    await e.signIn(manager, 'manager@grants-e2e.test');
    await manager.goto('/bench/lab-members');
    await manager.getByTestId('page-heading').filter({ hasText: 'My lab' }).waitFor();
    await manager
      .getByText("will see this lab's rounds, reports, investigations and instrument checks")
      .waitFor();
    await manager.getByTestId('no-grants').waitFor();
    const form = manager.getByTestId('grant-form');

    // The schema refuses a malformed e-mail before anything is sent
    await form.getByLabel("Assessor's e-mail").fill('not-an-address');
    await form.getByLabel('Until').fill(UNTIL);
    await manager.getByTestId('grant-submit').click();
    await form.getByText('Enter a valid e-mail address.').waitFor();

    // A valid grant: listed as active
    await form.getByLabel("Assessor's e-mail").fill(ASSESSOR);
    await manager.getByTestId('grant-submit').click();
    const row = manager.getByTestId('grant-row').filter({ hasText: ASSESSOR });
    await row.getByTestId('grant-state').filter({ hasText: 'Active' }).waitFor();
    expect(await row.textContent()).toContain(UNTIL);
    await e.shot(manager, 'assessor-grants-active');
    const stored: { ends_on: string; revoked_at: Date | null }[] = await e.ds.query(
      `SELECT ends_on::text, revoked_at FROM assessor_grant WHERE organisation_id = $1`,
      [labId],
    );
    expect(stored).toEqual([{ ends_on: UNTIL, revoked_at: null }]);

    // The assessor signs in
    const assessor = await e.page();
    await e.signIn(assessor, ASSESSOR);
    // The invitation mail, on the assessor's own Outbox page and in the mail table
    // (the demo Outbox shows each user only the mail addressed to them)
    const subject = `${LAB} gave you access on Ringlet`;
    const mails = await mailTo(e.ds, ASSESSOR);
    expect(mails.map((m) => m.subject)).toContain(subject);
    await assessor.goto('/outbox');
    await assessor.getByText(subject).first().click();
    const message = assessor.getByTestId('outbox-message');
    await message.getByText(ASSESSOR).first().waitFor();
    expect(await message.textContent()).toContain(`to ${UNTIL}`);
    expect(await message.locator('a').first().getAttribute('href')).toBe(`${e.baseUrl}/assessor`);

    // The assessor sees the lab and can open it
    await assessor.goto('/assessor');
    await assessor.getByTestId('lab-link').filter({ hasText: LAB }).click();
    await assessor.getByTestId('page-heading').filter({ hasText: LAB }).waitFor();

    // The manager revokes, after confirming
    await manager.goto('/bench/lab-members');
    await manager
      .getByTestId('grant-row')
      .filter({ hasText: ASSESSOR })
      .getByTestId('revoke-grant')
      .click();
    await manager.getByRole('dialog').getByText('will no longer see this lab').waitFor();
    await manager.getByTestId('confirm-revoke').click();
    await manager
      .getByTestId('grant-row')
      .filter({ hasText: ASSESSOR })
      .getByTestId('grant-state')
      .filter({ hasText: 'Revoked' })
      .waitFor();
    expect(await manager.getByTestId('revoke-grant').count()).toBe(0);
    await e.shot(manager, 'assessor-grants-revoked');
    const after: { revoked_at: Date | null }[] = await e.ds.query(
      `SELECT revoked_at FROM assessor_grant WHERE organisation_id = $1`,
      [labId],
    );
    expect(after[0]!.revoked_at).toBeInstanceOf(Date);

    // The assessor no longer sees the lab: not listed, the page says so, the API answers 404

    // The assessor sees the lab and can open it
    await assessor.goto('/assessor');
    await assessor.getByTestId('no-labs').waitFor();
    expect(await assessor.getByTestId('lab-link').count()).toBe(0);
    await assessor.goto(`/assessor/labs/${labId}`);
    await assessor.getByTestId('page-heading').filter({ hasText: 'Lab not available' }).waitFor();
    const res = await assessor.request.get(`/api/v1/assessor/labs/${labId}/rounds`);
    expect(res.status()).toBe(404);

    // 404s for the revoked lab are expected; nothing else may be logged as an error
    expect(e.consoleErrors.filter((m) => !/404|Failed to load resource/.test(m))).toEqual([]);
  });
});
