import { createLab, createUser } from '../../api/src/testing/test-app';
import { startE2E, type E2E } from './support/harness';

jest.setTimeout(120_000);

/** Every role signs in through the real page and lands on its own home page. */
describe('sign-in in a real browser', () => {
  let e: E2E;
  beforeAll(async () => {
    e = await startE2E();
    const lab = await createLab(e.ds, 'Browser Test Lab');
    await createUser(e.ds, { email: 'admin@e2e.test', name: 'Ada Admin', roles: ['admin'] });
    await createUser(e.ds, {
      email: 'coordinator@e2e.test',
      name: 'Cora Coordinator',
      roles: ['coordinator'],
    });
    await createUser(e.ds, {
      email: 'assessor@e2e.test',
      name: 'Asa Assessor',
      roles: ['assessor'],
    });
    await createUser(e.ds, { email: 'lab@e2e.test', name: 'Lena Lab', lab: lab.id, manager: true });
  });
  afterAll(() => e.close());

  const homes = [
    ['admin@e2e.test', '/admin/users', 'Users'],
    ['coordinator@e2e.test', '/desk', 'Round desk'],
    ['lab@e2e.test', '/bench', 'Lab bench'],
    ['assessor@e2e.test', '/assessor', 'Assessor'],
  ] as const;

  it.each(homes)('%s lands on %s', async (email, path, heading) => {
    const page = await e.page();
    await e.signIn(page, email);
    expect(new URL(page.url()).pathname).toBe(path);
    await expect(page.getByTestId('page-heading').first().textContent()).resolves.toContain(
      heading,
    );
    await e.shot(page, `home-${path.replace(/\//g, '_').replace(/^_/, '')}`);
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL((url) => url.pathname.startsWith('/sign-in'));
  });

  it('shows a clear message for a wrong password', async () => {
    const page = await e.page();
    await page.goto('/sign-in');
    await page.getByLabel('E-mail').fill('coordinator@e2e.test');
    await page.getByLabel('Password', { exact: true }).fill('not the password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    const alert = page.getByRole('alert');
    await alert.waitFor();
    expect(await alert.textContent()).toContain('E-mail or password is incorrect.');
    await e.shot(page, 'sign-in-wrong-password');
  });

  it('sends a signed-out visitor to the sign-in page', async () => {
    const page = await e.page();
    await page.goto('/desk');
    await page.waitForURL((url) => url.pathname.startsWith('/sign-in'));
  });

  it('runs under the strict Content-Security-Policy without violations', () => {
    const csp = e.consoleErrors.filter((m) => /Content Security Policy|Refused to/i.test(m));
    expect(csp).toEqual([]);
  });
});
