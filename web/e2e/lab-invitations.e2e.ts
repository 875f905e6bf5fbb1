import { Membership } from '../../db/entities';
import { createBenchRound, enrol } from '../../api/src/testing/bench-fixtures';
import { createLab, createUser, mailTo, TEST_PASSWORD } from '../../api/src/testing/test-app';
import { startE2E, type E2E } from './support/harness';

jest.setTimeout(240_000);

/**
 * A lab manager invites a person who already has an account in another lab; the person reads
 * the mail on their own Outbox page, accepts, and then chooses the lab they act for in the
 * header; the Lab bench follows the choice, which the session keeps. A password change in one
 * browser signs the other out.
 */
describe('lab invitation accepted, then the lab chooser', () => {
  let e: E2E;
  const ALDER = 'Alder Particle Lab';
  const BIRCH = 'Birch Sizing Lab';
  let alderId: string;
  let bertId: string;
  beforeAll(async () => {
    e = await startE2E();
    alderId = (await createLab(e.ds, ALDER)).id;
    const birchId = (await createLab(e.ds, BIRCH)).id;
    await createUser(e.ds, {
      email: 'maud@inv-e2e.test',
      name: 'Maud Manager',
      lab: alderId,
      manager: true,
    });
    bertId = (
      await createUser(e.ds, { email: 'bert@inv-e2e.test', name: 'Bert Birch', lab: birchId })
    ).id;
    await createUser(e.ds, {
      email: 'cora@inv-e2e.test',
      name: 'Cora Coordinator',
      roles: ['coordinator'],
    });
    const a = await createBenchRound(e.ds, { code: 'ALD-1' });
    const b = await createBenchRound(e.ds, { code: 'BIR-1' });
    await enrol(e.ds, a.round.id, alderId, 'P-301');
    await enrol(e.ds, b.round.id, birchId, 'P-302');
  });
  afterAll(() => e.close());

  it('invites, accepts on the invitation page, and acts for the chosen lab', async () => {
    // The manager cannot add a coordinator; an existing account gets an invitation, not a membership
    const manager = await e.page();
    await e.signIn(manager, 'maud@inv-e2e.test');
    await manager.goto('/bench/lab-members');
    await manager.getByTestId('page-heading').filter({ hasText: 'My lab' }).waitFor();
    const invite = manager.locator('form.invite');
    await invite.getByLabel('E-mail').fill('cora@inv-e2e.test');
    await invite.getByLabel('Name').fill('Cora');
    await invite.getByRole('button', { name: 'Send invitation' }).click();
    await invite.getByText('A PT provider staff account cannot be a lab member.').waitFor();

    await invite.getByLabel('E-mail').fill('bert@inv-e2e.test');
    await invite.getByLabel('Name').fill('Bert');
    await invite.getByRole('button', { name: 'Send invitation' }).click();
    await manager.getByTestId('pending-invitations').getByText('bert@inv-e2e.test').waitFor();
    expect(
      await e.ds.getRepository(Membership).countBy({ userId: bertId, organisationId: alderId }),
    ).toBe(0);
    await e.shot(manager, 'lab-invitation-pending');

    // Bert: one lab, no chooser; the invitation mail is on his own Outbox page
    const subject = `${ALDER} invites you to join the lab on Ringlet`;
    await mailTo(e.ds, 'bert@inv-e2e.test');
    const bert = await e.page();
    await e.signIn(bert, 'bert@inv-e2e.test');
    expect(await bert.locator('mat-toolbar [data-testid=lab-chooser]').count()).toBe(0);
    await bert.goto('/outbox');
    await bert.getByRole('option').filter({ hasText: subject }).click();
    await bert.getByTestId('outbox-message').locator('a[href$="/lab-invitations"]').click();
    await bert.getByTestId('page-heading').filter({ hasText: 'Lab invitations' }).waitFor();
    const row = bert.getByTestId('invitations').locator(`li[data-lab="${ALDER}"]`);
    await row.getByText('Sent by Maud Manager').waitFor();
    await row.getByRole('button', { name: `Accept the invitation from ${ALDER}` }).click();
    await bert
      .getByTestId('joined')
      .filter({ hasText: `You are now a member of ${ALDER}` })
      .waitFor();
    expect(
      await e.ds.getRepository(Membership).countBy({ userId: bertId, organisationId: alderId }),
    ).toBe(1);

    // Two labs now: the header chooser shows the lab he acted for until now
    const chooser = bert.locator('mat-toolbar [data-testid=lab-chooser]');
    await chooser.waitFor();
    await bert.goto('/bench');
    await bert.getByTestId('my-rounds').getByText('BIR-1').waitFor();
    expect(
      await chooser.evaluate((el) =>
        (el as HTMLSelectElement).selectedOptions[0]?.textContent?.trim(),
      ),
    ).toBe(BIRCH);

    // He switches to the new lab: the bench follows, and a reload keeps the choice (the session holds it)
    await chooser.selectOption({ label: ALDER });
    await bert.getByTestId('my-rounds').getByText('ALD-1').waitFor();
    expect(await bert.getByTestId('my-rounds').textContent()).not.toContain('BIR-1');
    await e.shot(bert, 'lab-chooser-acting-for-alder');
    await bert.reload();
    await bert.getByTestId('my-rounds').getByText('ALD-1').waitFor();
    expect(
      await chooser.evaluate((el) =>
        (el as HTMLSelectElement).selectedOptions[0]?.textContent?.trim(),
      ),
    ).toBe(ALDER);

    // Another sign-in starts unchosen: the bench asks for the lab first
    const again = await e.page();
    await e.signIn(again, 'bert@inv-e2e.test');
    await again.goto('/bench');
    await again.getByTestId('choose-lab').waitFor();
    await again.locator('mat-toolbar [data-testid=lab-chooser]').selectOption({ label: BIRCH });
    await again.getByTestId('my-rounds').getByText('BIR-1').waitFor();
    // The chooser reopens the page for the new lab after the rounds may already show; a reload
    // lets that finish before the next click (else it can take the browser back to the bench).
    await again.reload();
    await again.getByTestId('my-rounds').getByText('BIR-1').waitFor();

    // A password change in this browser signs the other browser out
    await again.getByTestId('user-name').click();
    await again.getByTestId('page-heading').filter({ hasText: 'Change password' }).waitFor();
    await again.getByLabel('Current password').fill('wrong password here');
    await again.getByLabel('New password').fill('bert new password 2027');
    await again.getByRole('button', { name: 'Change password' }).click();
    await again.getByText('That is not your current password.').waitFor();
    await again.getByLabel('Current password').fill(TEST_PASSWORD);
    await again.getByRole('button', { name: 'Change password' }).click();
    await again.getByTestId('password-changed').waitFor();
    await bert.goto('/bench');
    await bert.waitForURL((url) => url.pathname.startsWith('/sign-in'));
    await again.goto('/bench');
    await again.getByTestId('my-rounds').getByText('BIR-1').waitFor();
    expect(e.consoleErrors.filter((m) => /Content Security Policy|NG0/.test(m))).toEqual([]);
  });
});
