import { mkdirSync } from 'node:fs';
import type { Server } from 'node:http';
import { join } from 'node:path';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import type { DataSource } from 'typeorm';
import { startTestApp, TEST_PASSWORD, type TestApp } from '../../../api/src/testing/test-app';

/** Debian's chromium (installed by .ci/run); CHROMIUM_PATH overrides. */
export const CHROMIUM = process.env['CHROMIUM_PATH'] || '/usr/bin/chromium';
export const ARTIFACTS = join(__dirname, '../../../test-artifacts');
const WEB_DIST = join(__dirname, '../../../dist/web/browser');

export interface E2E {
  baseUrl: string;
  app: TestApp;
  ds: DataSource;
  browser: Browser;
  /** A new page in its own browser context (own cookies); console errors and CSP reports collected. */
  page(): Promise<Page>;
  /** Signs in through the real sign-in page and waits for the home page. */
  signIn(page: Page, email: string, password?: string): Promise<void>;
  /** Screenshot kept as a test artifact (test-artifacts/NAME.png). */
  shot(page: Page, name: string): Promise<void>;
  /** Browser console errors seen so far (CSP violations land here). */
  consoleErrors: string[];
  close(): Promise<void>;
}

/**
 * The built web app and the real API on a fresh database on loopback, and headless chromium.
 * Needs `ng build` first (npm test does it).
 */
export async function startE2E(): Promise<E2E> {
  const app = await startTestApp({ staticDir: WEB_DIST, mode: 'demo' });
  const server: Server = await new Promise((resolve) => {
    const s = app.app.listen(0, '127.0.0.1', () => resolve(s));
  });
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : 0;
  const baseUrl = `http://127.0.0.1:${port}`;
  app.context.config.publicUrl = baseUrl;
  const browser = await chromium.launch({
    executablePath: CHROMIUM,
    headless: true,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-dev-shm-usage',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--disable-quic',
    ],
  });
  mkdirSync(ARTIFACTS, { recursive: true });
  const contexts: BrowserContext[] = [];
  const consoleErrors: string[] = [];
  const e2e: E2E = {
    baseUrl,
    app,
    ds: app.ds,
    browser,
    consoleErrors,
    async page() {
      // Reduced motion: Material then opens dialogs without an animation, so a dialog's autofocus
      // cannot land mid-way through a test typing into its second field on a loaded machine.
      const ctx = await browser.newContext({
        baseURL: baseUrl,
        viewport: { width: 1280, height: 860 },
        acceptDownloads: true,
        reducedMotion: 'reduce',
      });
      contexts.push(ctx);
      // A loaded 2-core CI machine runs browser and API tests side by side: be patient, not flaky.
      ctx.setDefaultTimeout(60_000);
      ctx.setDefaultNavigationTimeout(60_000);
      const p = await ctx.newPage();
      p.on('console', (m) => {
        if (m.type() === 'error') consoleErrors.push(m.text());
      });
      p.on('pageerror', (err) => consoleErrors.push(String(err)));
      return p;
    },
    async signIn(page, email, password = TEST_PASSWORD) {
      await page.goto('/sign-in');
      await page.getByLabel('E-mail').fill(email);
      await page.getByLabel('Password', { exact: true }).fill(password);
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'), { timeout: 60_000 });
      await page.getByTestId('page-heading').first().waitFor({ timeout: 60_000 });
    },
    async shot(page, name) {
      await page.screenshot({ path: join(ARTIFACTS, `${name}.png`), fullPage: true });
    },
    async close() {
      for (const c of contexts) await c.close().catch(() => undefined);
      await browser.close();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await app.close();
    },
  };
  return e2e;
}
