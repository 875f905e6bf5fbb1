import { Invitation, Round } from '../../db/entities';
import { createLab, createUser, mailTo } from '../../api/src/testing/test-app';
import { startE2E, type E2E } from './support/harness';
import {
  createScheme,
  fillTwoItemRound,
  inviteHarbourAndNewRidgeLab,
  openEnrolment,
} from './support/round-steps';

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
    await createScheme(page, 'NANO-DLS', 'Nanoparticle sizing by DLS');

    // a round with two test items
    await fillTwoItemRound(page, {
      code: 'DLS-2026-1',
      title: 'Latex and silica, spring 2026',
      resultsDue: '2026-06-30T12:00',
    });
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
    await openEnrolment(page);

    // invite an existing lab and a new lab by contact address
    await inviteHarbourAndNewRidgeLab(page, 'head@harbour.test');
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
