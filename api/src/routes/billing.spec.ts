import type { Server } from 'node:http';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { AuditEvent, Invoice, Round, Shipment } from '../../../db/entities';
import { documentNumber, invoiceAmounts } from '../../../shared/contracts/billing';
import { createBenchRound } from '../testing/bench-fixtures';
import {
  client,
  createLab,
  createUser,
  invitationToken,
  mailTo,
  send,
  signedIn,
  startTestApp,
  type Client,
  type TestApp,
} from '../testing/test-app';

const YEAR = new Date().getUTCFullYear();

describe('participation fees', () => {
  let t: TestApp;
  let server: Server;
  let coordinator: Client;
  let labId: string;
  let manager: Client;

  /** A round open for enrolment with the demo's fee (480.00 EUR). */
  async function feeRound(code: string, feeMinor = 48_000): Promise<string> {
    const { round } = await createBenchRound(t.ds, { code, state: 'enrolling' });
    await t.ds.getRepository(Round).update({ id: round.id }, { feeMinor, currency: 'EUR' });
    return round.id;
  }

  async function invite(
    roundId: string,
    invitations: { organisationId?: string; email: string; labName?: string }[],
  ): Promise<string[]> {
    await send(coordinator, `/rounds/${roundId}/invitations`, { invitations }).expect(201);
    const tokens: string[] = [];
    for (const i of invitations) {
      const [mail] = await mailTo(t.ds, i.email);
      tokens.push(invitationToken(mail!.text));
    }
    return tokens;
  }

  async function enrolOwnLab(code: string): Promise<{ roundId: string; invoiceId: string }> {
    const roundId = await feeRound(code);
    const email = `contact-${code.toLowerCase()}@pay.test`;
    const [token] = await invite(roundId, [{ organisationId: labId, email }]);
    await send(manager, `/invitations/${token}/accept`, {}).expect((r) =>
      expect(r.status).toBeLessThan(300),
    );
    await manager.refreshCsrf();
    const mine = await manager.agent.get('/api/v1/my/invoices').expect(200);
    const inv = (mine.body as { id: string; roundId: string }[]).find((i) => i.roundId === roundId);
    return { roundId, invoiceId: inv!.id };
  }

  beforeAll(async () => {
    t = await startTestApp();
    server = await new Promise((resolve) => {
      const s = t.app.listen(0, '127.0.0.1', () => resolve(s));
    });
    const a = server.address();
    t.context.config.publicUrl = `http://127.0.0.1:${typeof a === 'object' && a ? a.port : 0}`;
    await t.ds.query(
      `INSERT INTO provider_profile (id, name, address, tax_rate_bp, contact_email)
       VALUES (1, 'Northwind Particle PT', '12 Example Road\nSampletown', 2000, 'pt@northwind.example')`,
    );
    await createUser(t.ds, { email: 'coord@pay.test', roles: ['coordinator'] });
    coordinator = await signedIn(t, 'coord@pay.test');
    const lab = await createLab(t.ds, 'Sizing Lab Alpha');
    labId = lab.id;
    await createUser(t.ds, { email: 'manager@pay.test', lab: lab.id, manager: true });
    manager = await signedIn(t, 'manager@pay.test');
  });
  afterAll(async () => {
    await new Promise<void>((r) => server.close(() => r()));
    await t.close();
  });

  it('keeps money in integer minor units: 480.00 EUR + 20 % tax = 576.00 EUR', () => {
    // Arithmetic of the demo fee; rounding half up per invoice is common practice.
    expect(invoiceAmounts(48_000, 2_000)).toEqual({
      netMinor: 48_000,
      taxMinor: 9_600,
      totalMinor: 57_600,
    });
    expect(invoiceAmounts(999, 1_900)).toEqual({ netMinor: 999, taxMinor: 190, totalMinor: 1189 }); // 189.81 → 190
    expect(invoiceAmounts(5, 1_000).taxMinor).toBe(1); // 0.5 rounds up
    expect(() => invoiceAmounts(1.5, 0)).toThrow(RangeError);
    expect(documentNumber('INV', 2026, 1)).toBe('INV-2026-0001');
  });

  it('issues the invoice on enrolment, mails it, shows it only to the lab, and prints it', async () => {
    const { invoiceId } = await enrolOwnLab('FEE-1');
    const inv = (await manager.agent.get(`/api/v1/invoices/${invoiceId}`).expect(200)).body;
    expect(inv).toMatchObject({
      number: documentNumber('INV', YEAR, 1),
      netMinor: 48_000,
      taxRateBp: 2_000,
      taxMinor: 9_600,
      totalMinor: 57_600,
      currency: 'EUR',
      status: 'issued',
      billTo: { billingName: 'Sizing Lab Alpha' },
    });
    const mails = await mailTo(t.ds, 'manager@pay.test');
    expect(mails.some((m) => m.subject.startsWith(`Invoice ${inv.number}`))).toBe(true);

    const other = await createLab(t.ds, 'Other Lab');
    await createUser(t.ds, { email: 'other@pay.test', lab: other.id });
    const stranger = await signedIn(t, 'other@pay.test');
    await stranger.agent.get(`/api/v1/invoices/${invoiceId}`).expect(404);
    await stranger.agent.get(`/api/v1/invoices/${invoiceId}.pdf`).expect(404);
    expect((await stranger.agent.get('/api/v1/my/invoices').expect(200)).body).toEqual([]);

    const pdf = await manager.agent
      .get(`/api/v1/invoices/${invoiceId}.pdf`)
      .buffer(true)
      .parse((res, cb) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => cb(null, Buffer.concat(chunks)));
      })
      .expect(200);
    expect((pdf.body as Buffer).subarray(0, 5).toString()).toBe('%PDF-');
    if (process.env['RINGLET_KEEP_PDF']) writeFileSync(process.env['RINGLET_KEEP_PDF'], pdf.body);
    const text = pdfText(pdf.body as Buffer);
    if (text !== null) {
      expect(text).toContain(inv.number);
      expect(text).toContain('576.00 EUR');
      expect(text).toContain('Northwind Particle PT');
    }
  });

  it('pays by card: checkout through the SDK, the fake’s page, the signed webhook, paid', async () => {
    const { invoiceId } = await enrolOwnLab('FEE-2');
    const checkout = await send(manager, `/invoices/${invoiceId}/checkout`, {}).expect(200);
    const url = new URL(checkout.body.url as string);
    const session = t.payments.sessions.get(checkout.body.sessionId)!;
    expect(session).toMatchObject({
      client_reference_id: invoiceId,
      amount_total: 57_600,
      currency: 'eur',
      mode: 'payment',
    });
    // The hosted page, then a declined card, then the test card.
    const page = await request(url.origin).get(url.pathname).expect(200);
    expect(page.text).toContain('576.00 EUR');
    await request(url.origin)
      .post(url.pathname)
      .type('form')
      .send({ card: '4000 0000 0000 0002', action: 'pay' })
      .expect(402);
    expect((await t.ds.getRepository(Invoice).findOneByOrFail({ id: invoiceId })).status).toBe(
      'issued',
    );
    const paid = await request(url.origin)
      .post(url.pathname)
      .type('form')
      .send({ card: '4242 4242 4242 4242', action: 'pay' })
      .expect(303);
    expect(paid.headers['location']).toBe(
      `${t.context.config.publicUrl}/billing?paid=${invoiceId}`,
    );
    const row = await t.ds.getRepository(Invoice).findOneByOrFail({ id: invoiceId });
    expect(row).toMatchObject({ status: 'paid', paidMethod: 'card' });
    expect(row.paidReference).toMatch(/^pi_test_/);
    const mails = await mailTo(t.ds, 'manager@pay.test');
    expect(mails.some((m) => m.subject === `Payment received for invoice ${row.number}`)).toBe(
      true,
    );
    await send(manager, `/invoices/${invoiceId}/checkout`, {}).expect(409);
  });

  function completedEvent(eventId: string, invoiceId: string, amount = 57_600): string {
    return JSON.stringify({
      id: eventId,
      object: 'event',
      type: 'checkout.session.completed',
      created: Math.floor(Date.now() / 1000),
      data: {
        object: {
          id: `cs_test_${eventId}`,
          object: 'checkout.session',
          client_reference_id: invoiceId,
          metadata: { invoiceId },
          amount_total: amount,
          currency: 'eur',
          payment_status: 'paid',
          payment_intent: `pi_test_${eventId}`,
        },
      },
    });
  }
  const post = (payload: string, signature: string | null) => {
    const r = request(server)
      .post('/api/v1/payments/webhook')
      .set('Content-Type', 'application/json');
    return (signature === null ? r : r.set('Stripe-Signature', signature)).send(payload);
  };

  it('answers a replayed event 200 and changes nothing; refuses a tampered one with 400', async () => {
    const { invoiceId } = await enrolOwnLab('FEE-3');
    const payload = completedEvent('evt_replay_1', invoiceId);
    const first = await post(payload, t.payments.sign(payload)).expect(200);
    expect(first.body).toEqual({ received: true, outcome: 'paid' });
    const before = await t.ds.getRepository(Invoice).findOneByOrFail({ id: invoiceId });
    const audits = await t.ds.getRepository(AuditEvent).countBy({ subjectId: invoiceId });
    const again = await post(payload, t.payments.sign(payload)).expect(200);
    expect(again.body).toEqual({ received: true, outcome: 'duplicate' });
    expect(await t.ds.getRepository(Invoice).findOneByOrFail({ id: invoiceId })).toEqual(before);
    expect(await t.ds.getRepository(AuditEvent).countBy({ subjectId: invoiceId })).toBe(audits);

    // Tampered: signed, then the amount changed; a wrong secret; no header; a stale timestamp.
    const other = await enrolOwnLab('FEE-4');
    const good = completedEvent('evt_tamper_1', other.invoiceId);
    const sig = t.payments.sign(good);
    await post(good.replace('57600', '100'), sig).expect(400);
    await post(good, sig.replace(/v1=[0-9a-f]{4}/, 'v1=0000')).expect(400);
    await post(good, null).expect(400);
    await post(good, t.payments.sign(good, Math.floor(Date.now() / 1000) - 3600)).expect(400);
    expect(
      (await t.ds.getRepository(Invoice).findOneByOrFail({ id: other.invoiceId })).status,
    ).toBe('issued');

    // Unknown event types and unknown invoices are acknowledged; a wrong amount does not pay.
    const odd = JSON.stringify({
      id: 'evt_odd',
      object: 'event',
      type: 'charge.refunded',
      data: { object: {} },
    });
    expect((await post(odd, t.payments.sign(odd)).expect(200)).body.outcome).toBe('ignored');
    const ghost = completedEvent('evt_ghost', '00000000-0000-4000-8000-000000000000');
    expect((await post(ghost, t.payments.sign(ghost)).expect(200)).body.outcome).toBe(
      'unknown-invoice',
    );
    const cheap = completedEvent('evt_cheap', other.invoiceId, 100);
    expect((await post(cheap, t.payments.sign(cheap)).expect(200)).body.outcome).toBe(
      'amount-mismatch',
    );
    expect(
      (await t.ds.getRepository(Invoice).findOneByOrFail({ id: other.invoiceId })).status,
    ).toBe('issued');
  });

  it('numbers invoices without gap or duplicate under concurrent enrolments', async () => {
    const before = await t.ds.getRepository(Invoice).count();
    const rounds = [await feeRound('GAP-1'), await feeRound('GAP-2'), await feeRound('GAP-3')];
    const tokens: string[] = [];
    for (const [r, roundId] of rounds.entries()) {
      tokens.push(
        ...(await invite(
          roundId,
          Array.from({ length: 5 }, (_, i) => ({
            email: `gap${r}-${i}@pay.test`,
            labName: `Gap Lab ${r}-${i}`,
          })),
        )),
      );
    }
    const anon = await client(t);
    const answers = await Promise.all(
      tokens.map((token) => send(anon, `/invitations/${token}/accept`, {})),
    );
    expect(answers.filter((a) => a.status >= 300).map((a) => [a.status, a.body])).toEqual([]);
    const rows = await t.ds.getRepository(Invoice).find({ where: { year: YEAR } });
    const seqs = rows.map((r) => r.seq).sort((a, b) => a - b);
    expect(seqs).toEqual(Array.from({ length: before + tokens.length }, (_, i) => i + 1));
    expect(new Set(rows.map((r) => r.number)).size).toBe(rows.length);
  });

  it('credits a lab withdrawn before dispatch; the ledger sums issued, paid, outstanding, credited', async () => {
    const { roundId, invoiceId } = await enrolOwnLab('FEE-5');
    const [token] = await invite(roundId, [{ email: 'beta@pay.test', labName: 'Sizing Lab Beta' }]);
    const anon = await client(t);
    await send(anon, `/invitations/${token}/accept`, {}).expect(201);
    const ledger0 = (await coordinator.agent.get(`/api/v1/rounds/${roundId}/ledger`).expect(200))
      .body;
    expect(ledger0.totals).toEqual({
      issuedMinor: 115_200,
      paidMinor: 0,
      outstandingMinor: 115_200,
      creditedMinor: 0,
    });
    const beta = ledger0.rows.find(
      (r: { organisationName: string }) => r.organisationName === 'Sizing Lab Beta',
    );
    expect(beta.feeOutstanding).toBe(true);
    // Only the coordinator sees the ledger.
    await manager.agent.get(`/api/v1/rounds/${roundId}/ledger`).expect(403);

    // Bank transfer for our lab, a reminder for Beta, then Beta withdraws before dispatch.
    const paid = await send(coordinator, `/invoices/${invoiceId}/payment`, {
      reference: 'BANK-REF-1',
      paidOn: new Date().toISOString().slice(0, 10),
    }).expect(200);
    expect(paid.body).toMatchObject({ status: 'paid', paidMethod: 'bank-transfer' });
    await send(coordinator, `/invoices/${invoiceId}/payment`, {
      reference: 'x\u0007',
      paidOn: '2026-13-01',
    }).expect(400);
    await send(coordinator, `/invoices/${beta.invoiceId}/reminder`, {}).expect(200);
    expect(
      (await mailTo(t.ds, 'beta@pay.test', 3)).some((m) => m.subject.startsWith('Reminder')),
    ).toBe(true);
    // Crediting an enrolled lab is refused.
    await send(coordinator, `/invoices/${beta.invoiceId}/credit-note`, {
      reason: 'Changed its mind',
    }).expect(422);
    const enrolments = (
      await coordinator.agent.get(`/api/v1/rounds/${roundId}/enrolments`).expect(200)
    ).body;
    const betaEnrolment = enrolments.find(
      (e: { organisationName: string }) => e.organisationName === 'Sizing Lab Beta',
    );
    await send(coordinator, `/rounds/${roundId}/enrolments/${betaEnrolment.id}/withdrawal`, {
      reason: 'Instrument out of service',
    }).expect(200);
    const ledger = (await coordinator.agent.get(`/api/v1/rounds/${roundId}/ledger`).expect(200))
      .body;
    expect(ledger.totals).toEqual({
      issuedMinor: 115_200,
      paidMinor: 57_600,
      outstandingMinor: 0,
      creditedMinor: 57_600,
    });
    const credited = ledger.rows.find((r: { invoiceId: string }) => r.invoiceId === beta.invoiceId);
    expect(credited).toMatchObject({
      status: 'credited',
      creditNoteNumber: documentNumber('CN', YEAR, 1),
    });
    await send(coordinator, `/invoices/${beta.invoiceId}/credit-note`, { reason: 'Again' }).expect(
      409,
    );
    const xlsx = await coordinator.agent.get(`/api/v1/rounds/${roundId}/ledger.xlsx`).expect(200);
    expect(xlsx.headers['content-type']).toContain('spreadsheetml');
  });

  it('refuses dispatch to a lab with an unpaid fee when the round says so (422)', async () => {
    const { roundId, invoiceId } = await enrolOwnLab('FEE-6');
    const enrolment = (await t.ds.getRepository(Invoice).findOneByOrFail({ id: invoiceId }))
      .enrolmentId;
    const dispatch = () =>
      send(coordinator, `/rounds/${roundId}/enrolments/${enrolment}/dispatch`, {
        courier: 'Parcel Co',
        trackingNumber: 'TRK-1',
        dispatchedOn: new Date().toISOString().slice(0, 10),
      });
    await send(
      coordinator,
      `/rounds/${roundId}/billing-settings`,
      { shipUnpaid: false },
      'put',
    ).expect(200);
    const refused = await dispatch().expect(422);
    expect(refused.body.error.code).toBe('fee_outstanding');
    expect(await t.ds.getRepository(Shipment).countBy({ enrolmentId: enrolment })).toBe(0);
    await send(coordinator, `/invoices/${invoiceId}/payment`, {
      reference: 'BANK-REF-2',
      paidOn: new Date().toISOString().slice(0, 10),
    }).expect(200);
    await dispatch().expect(200);
  });
});

/** The PDF's text through pdftotext (poppler-utils) when installed; null otherwise. */
function pdfText(pdf: Buffer): string | null {
  try {
    const dir = mkdtempSync(join(tmpdir(), 'ringlet-invoice-'));
    writeFileSync(join(dir, 'i.pdf'), pdf);
    execFileSync('pdftotext', ['-layout', join(dir, 'i.pdf'), join(dir, 'i.txt')]);
    return readdirSync(dir).includes('i.txt')
      ? execFileSync('cat', [join(dir, 'i.txt')]).toString()
      : null;
  } catch {
    return null;
  }
}
