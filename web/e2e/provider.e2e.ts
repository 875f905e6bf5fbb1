import { createUser } from '../../api/src/testing/test-app';
import { demoLogoPng } from '../../db/seed/demo-provider';
import { seriousViolations } from './support/axe';
import { startE2E, type E2E } from './support/harness';

jest.setTimeout(180_000);

/** A coordinator fills in the PT provider's profile and logo; the API answers with what was typed. */
describe('PT provider page in a real browser', () => {
  let e: E2E;
  beforeAll(async () => {
    e = await startE2E();
    await createUser(e.ds, { email: 'coord@provider-e2e.test', roles: ['coordinator'] });
  });
  afterAll(() => e.close());

  it('saves the profile and the logo, and refuses an e-mail address that is not one', async () => {
    const page = await e.page();
    await e.signIn(page, 'coord@provider-e2e.test');
    await page.getByRole('link', { name: 'PT provider' }).click();
    await page.getByRole('heading', { name: 'PT provider', level: 1 }).waitFor();
    await page.getByLabel('Provider name').fill('Invented Browser PT Office');
    await page.getByLabel('Contact e-mail').fill('not an address');
    await page.getByRole('button', { name: 'Save profile' }).click();
    await page.locator('mat-error').first().waitFor();
    await page.getByLabel('Contact e-mail').fill('office@browser-pt.example');
    await page.getByLabel('Person who authorises reports').fill('Dr Browser Person');
    await page.getByRole('button', { name: 'Save profile' }).click();
    await page.getByRole('status').filter({ hasText: 'Saved.' }).waitFor();
    await page
      .locator('input[type=file]')
      .setInputFiles({ name: 'logo.png', mimeType: 'image/png', buffer: demoLogoPng() });
    await page.getByAltText('Current logo of the PT provider').waitFor();
    await e.shot(page, 'provider-profile');
    expect(await seriousViolations(page)).toEqual([]);
    const rows: {
      name: string;
      contact_email: string;
      authoriser_name: string;
      logo_type: string;
    }[] = await e.ds.query(
      'SELECT name, contact_email, authoriser_name, logo_type FROM provider_profile',
    );
    expect(rows).toEqual([
      {
        name: 'Invented Browser PT Office',
        contact_email: 'office@browser-pt.example',
        authoriser_name: 'Dr Browser Person',
        logo_type: 'image/png',
      },
    ]);
    expect(e.consoleErrors).toEqual([]);
  });
});
