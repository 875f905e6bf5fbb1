import { createLab, createUser } from '../../api/src/testing/test-app';
import { seriousViolations } from './support/axe';
import { startE2E, type E2E } from './support/harness';

jest.setTimeout(180_000);

/** axe-core on the main pages: no serious or critical WCAG 2.1 AA violations. */
describe('accessibility of the main pages', () => {
  let e: E2E;
  beforeAll(async () => {
    e = await startE2E();
    const lab = await createLab(e.ds, 'Axe Lab');
    await createUser(e.ds, { email: 'admin@axe.test', name: 'Ada Admin', roles: ['admin'] });
    await createUser(e.ds, {
      email: 'coordinator@axe.test',
      name: 'Cora Coordinator',
      roles: ['coordinator'],
    });
    await createUser(e.ds, {
      email: 'assessor@axe.test',
      name: 'Asa Assessor',
      roles: ['assessor'],
    });
    await createUser(e.ds, { email: 'lab@axe.test', name: 'Lena Lab', lab: lab.id, manager: true });
  });
  afterAll(() => e.close());

  it('sign-in and forgot-password pages', async () => {
    const page = await e.page();
    for (const path of ['/sign-in', '/forgot-password']) {
      await page.goto(path);
      await page.getByTestId('page-heading').first().waitFor();
      expect({ path, violations: await seriousViolations(page) }).toEqual({ path, violations: [] });
    }
  });

  const pages = [
    ['admin@axe.test', ['/admin/users', '/admin/labs', '/outbox']],
    ['coordinator@axe.test', ['/desk']],
    ['lab@axe.test', ['/bench', '/bench/track-record', '/bench/lab-members']],
    ['assessor@axe.test', ['/assessor']],
  ] as const;

  it.each(pages)('pages of %s', async (email, paths) => {
    const page = await e.page();
    await e.signIn(page, email);
    for (const path of paths) {
      await page.goto(path);
      await page.getByTestId('page-heading').first().waitFor();
      await page.waitForLoadState('networkidle');
      expect({ path, violations: await seriousViolations(page) }).toEqual({ path, violations: [] });
    }
  });

  it('shows a visible focus ring when tabbing', async () => {
    const page = await e.page();
    await page.goto('/sign-in');
    await page.getByTestId('page-heading').first().waitFor();
    await page.keyboard.press('Tab');
    await page.keyboard.press('Tab');
    const outline = await page.evaluate(() => {
      const el = document.activeElement as HTMLElement | null;
      if (!el || el === document.body) return null;
      const s = getComputedStyle(el);
      return {
        outline: s.outlineStyle,
        width: s.outlineWidth,
        shadow: s.boxShadow,
        tag: el.tagName,
      };
    });
    expect(outline).not.toBeNull();
    const visible = outline!.outline !== 'none' && outline!.width !== '0px';
    expect(visible || (outline!.shadow !== 'none' && outline!.shadow !== '')).toBe(true);
  });
});
