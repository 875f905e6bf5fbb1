import { Enrolment, Invoice, Round } from '../../db/entities';
import { createBenchRound } from '../../api/src/testing/bench-fixtures';
import { createLab, createUser } from '../../api/src/testing/test-app';
import { issueInvoiceForEnrolment } from '../../api/src/services/billing';
import { seriousViolations } from './support/axe';
import { startE2E, type E2E } from './support/harness';

jest.setTimeout(240_000);

/**
 * A lab manager finds the lab's invoice, pays it by card on the local payment fake's checkout
 * page (the test card 4242 4242 4242 4242), comes back to a "paid" confirmation and downloads
 * the receipt; the coordinator's ledger shows the payment.
 */
describe('paying a participation fee in a real browser', () => {
  let e: E2E;
  let invoiceId: string;
  let roundId: string;
  beforeAll(async () => {
    e = await startE2E();
    await e.ds.query(
      `INSERT INTO provider_profile (id, name, tax_rate_bp) VALUES (1, 'Invented Browser PT Office', 2000)
       ON CONFLICT (id) DO UPDATE SET tax_rate_bp = 2000`,
    );
    const lab = await createLab(e.ds, 'Browser Colloid Lab');
    await createUser(e.ds, { email: 'manager@billing-e2e.test', lab: lab.id, manager: true });
    await createUser(e.ds, { email: 'coord@billing-e2e.test', roles: ['coordinator'] });
    const { round } = await createBenchRound(e.ds, { code: 'FEE-E2E', state: 'collecting' });
    roundId = round.id;
    await e.ds.getRepository(Round).update({ id: round.id }, { feeMinor: 48_000 });
    invoiceId = (await e.ds.transaction(async (em) => {
      const enrolment = await em.save(
        em.create(Enrolment, {
          roundId: round.id,
          organisationId: lab.id,
          participantCode: 'PB7K2',
        }),
      );
      return issueInvoiceForEnrolment(em, null, enrolment);
    }))!;
  });
  afterAll(() => e.close());

  it('pays by card on the hosted checkout page and comes back to a paid invoice', async () => {
    const page = await e.page();
    await e.signIn(page, 'manager@billing-e2e.test');
    await page.getByRole('link', { name: 'My lab' }).click();
    await page.getByRole('link', { name: 'Invoices and billing details' }).click();
    await page.getByRole('heading', { name: 'Invoices', level: 1 }).waitFor();
    const card = page.getByTestId(/^invoice-INV-/);
    await card.getByText('Awaiting payment').waitFor();
    await card.getByText('€576.00').waitFor();
    expect(await seriousViolations(page)).toEqual([]);
    await e.shot(page, 'billing-invoices-unpaid');

    await page.getByRole('button', { name: /Pay invoice INV-\d{4}-\d{4} by card/ }).click();
    await page.waitForURL((url) => url.pathname.startsWith('/pay/'));
    await page.getByTestId('amount').filter({ hasText: '576.00 EUR' }).waitFor();
    await page.getByLabel('Card number').fill('4242 4242 4242 4242');
    await e.shot(page, 'billing-fake-checkout');
    await page.getByRole('button', { name: 'Pay' }).click();

    await page.waitForURL((url) => url.href.startsWith(`${e.baseUrl}/billing?paid=`));
    await page
      .getByTestId('payment-confirmation')
      .filter({ hasText: 'Payment received' })
      .waitFor();
    await card.getByTestId('invoice-status').filter({ hasText: 'Paid' }).waitFor();
    await e.shot(page, 'billing-invoices-paid');
    const row = await e.ds.getRepository(Invoice).findOneByOrFail({ id: invoiceId });
    expect(row).toMatchObject({ status: 'paid', paidMethod: 'card', totalMinor: 57_600 });

    const download = page.waitForEvent('download');
    await page.getByRole('link', { name: 'Receipt (PDF)' }).click();
    const file = await download;
    expect(file.suggestedFilename()).toMatch(/^INV-\d{4}-\d{4}-receipt\.pdf$/);

    const coordinator = await e.page();
    await e.signIn(coordinator, 'coord@billing-e2e.test');
    await coordinator.goto(`/billing/rounds/${roundId}/ledger`);
    await coordinator.getByRole('heading', { name: 'Fees ledger · FEE-E2E' }).waitFor();
    const totals = coordinator.getByTestId('ledger-totals');
    await totals.locator('.outstanding dd').filter({ hasText: '€0.00' }).waitFor();
    await coordinator.getByRole('gridcell', { name: 'Browser Colloid Lab', exact: true }).waitFor();
    await e.shot(coordinator, 'billing-ledger');
    expect(e.consoleErrors).toEqual([]);
  });
});
