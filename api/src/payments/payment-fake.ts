/**
 * A local fake of the hosted-payment service, for development, the demo and tests (never
 * production). It answers the calls the app makes through the `stripe` SDK in the SDK's wire
 * format (POST /v1/checkout/sessions form-encoded → session JSON; GET /v1/checkout/sessions/{id}),
 * serves a plain hosted checkout page at the session's url, and on "Pay" POSTs a
 * `checkout.session.completed` event to the app's webhook signed the way the SDK verifies it
 * (`Stripe-Signature: t=<unix seconds>,v1=<hex HMAC-SHA256(secret, t + "." + payload)>`), then
 * redirects the browser to the session's success URL. Loopback only.
 */
import { createHmac, randomBytes } from 'node:crypto';
import { createServer, type IncomingMessage, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import type { PaymentSettings } from '../config';

/** The documented test card that succeeds; every other number is declined. */
export const TEST_CARD = '4242424242424242';

interface FakeSession {
  id: string;
  object: 'checkout.session';
  mode: string;
  status: 'open' | 'complete' | 'expired';
  payment_status: 'unpaid' | 'paid';
  client_reference_id: string | null;
  metadata: Record<string, string>;
  amount_total: number;
  currency: string;
  success_url: string;
  cancel_url: string;
  url: string;
  payment_intent: string | null;
  created: number;
  livemode: false;
  description: string;
}

export interface PaymentFake {
  port: number;
  /** What the app's config needs to talk to this fake through the SDK. */
  settings: PaymentSettings;
  sessions: Map<string, FakeSession>;
  /** Signs a payload as the SDK expects (tests use it to replay or tamper with events). */
  sign(payload: string, timestamp?: number): string;
  close(): Promise<void>;
}

const id = (prefix: string) => `${prefix}_test_${randomBytes(12).toString('hex')}`;

export function signPayload(secret: string, payload: string, t: number): string {
  const v1 = createHmac('sha256', secret).update(`${t}.${payload}`, 'utf8').digest('hex');
  return `t=${t},v1=${v1}`;
}

function readBody(req: IncomingMessage, limit = 64 * 1024): Promise<string> {
  return new Promise((resolve, reject) => {
    let size = 0;
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => {
      size += c.length;
      if (size > limit) {
        reject(new Error('body too large'));
        req.destroy();
      } else chunks.push(c);
    });
    req.on('end', () => resolve(Buffer.concat(chunks).toString('utf8')));
    req.on('error', reject);
  });
}

const esc = (s: string) =>
  s.replace(
    /[&<>"']/g,
    (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!,
  );

function json(res: ServerResponse, status: number, body: unknown): void {
  res.writeHead(status, { 'Content-Type': 'application/json' });
  res.end(JSON.stringify(body));
}

function stripeError(res: ServerResponse, status: number, message: string): void {
  json(res, status, { error: { type: 'invalid_request_error', message } });
}

function page(title: string, body: string): string {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>${esc(title)}</title>
<style>body{font:16px system-ui,sans-serif;background:#f3f5f8;color:#1a1f26;margin:0}
main{max-width:26rem;margin:3rem auto;background:#fff;padding:1.5rem 2rem;border-radius:8px;box-shadow:0 1px 4px #0002}
label{display:block;margin:.8rem 0 .3rem}input{font:inherit;padding:.5rem;width:100%;box-sizing:border-box}
.row{display:flex;gap:.8rem;margin-top:1.2rem}button{font:inherit;padding:.6rem 1.2rem;border-radius:4px;border:1px solid #1f3a5f}
.pay{background:#1f3a5f;color:#fff}.note{color:#555;font-size:.85rem}.error{color:#a61b29}</style></head>
<body><main>${body}</main></body></html>`;
}

function moneyText(minor: number, currency: string): string {
  return `${(minor / 100).toFixed(2)} ${currency.toUpperCase()}`;
}

function checkoutPage(s: FakeSession, error = ''): string {
  return page(
    'Test checkout',
    `<h1>Test checkout</h1>
<p class="note">Local payment fake: no money moves. Use the test card 4242 4242 4242 4242.</p>
<p>${esc(s.description)}</p>
<p><strong data-testid="amount">${esc(moneyText(s.amount_total, s.currency))}</strong></p>
${error ? `<p class="error" role="alert">${esc(error)}</p>` : ''}
<form method="post" action="/pay/${esc(s.id)}">
<label for="card">Card number</label>
<input id="card" name="card" inputmode="numeric" autocomplete="cc-number" maxlength="23" required>
<label for="expiry">Expiry (MM/YY)</label>
<input id="expiry" name="expiry" maxlength="5" value="12/34">
<div class="row"><button class="pay" type="submit" name="action" value="pay">Pay</button>
<button type="submit" name="action" value="cancel" formnovalidate>Cancel</button></div>
</form>`,
  );
}

/** Starts the fake on 127.0.0.1 (port 0 = any free port). `webhookUrl` is read at each payment. */
export async function startPaymentFake(opts: {
  webhookUrl: () => string;
  port?: number;
  secretKey?: string;
  webhookSecret?: string;
}): Promise<PaymentFake> {
  const secretKey = opts.secretKey ?? `sk_test_${randomBytes(12).toString('hex')}`;
  const webhookSecret = opts.webhookSecret ?? `whsec_${randomBytes(24).toString('base64url')}`;
  const sessions = new Map<string, FakeSession>();
  let base = '';

  async function deliver(s: FakeSession): Promise<number> {
    const event = {
      id: id('evt'),
      object: 'event',
      api_version: '2025-01-01',
      created: Math.floor(Date.now() / 1000),
      livemode: false,
      type: 'checkout.session.completed',
      data: { object: s },
    };
    const payload = JSON.stringify(event);
    const res = await fetch(opts.webhookUrl(), {
      method: 'POST',
      headers: {
        'Content-Type': 'application/json; charset=utf-8',
        'Stripe-Signature': signPayload(webhookSecret, payload, Math.floor(Date.now() / 1000)),
      },
      body: payload,
    });
    return res.status;
  }

  async function handle(req: IncomingMessage, res: ServerResponse): Promise<void> {
    const url = new URL(req.url ?? '/', base);
    if (url.pathname === '/favicon.ico') {
      res.writeHead(204).end();
      return;
    }
    const apiCall = url.pathname.startsWith('/v1/');
    if (apiCall && req.headers.authorization !== `Bearer ${secretKey}`) {
      stripeError(res, 401, 'Invalid API Key provided.');
      return;
    }
    if (req.method === 'POST' && url.pathname === '/v1/checkout/sessions') {
      const form = new URLSearchParams(await readBody(req));
      const metadata: Record<string, string> = {};
      for (const [k, v] of form) {
        const m = /^metadata\[(.+)\]$/.exec(k);
        if (m) metadata[m[1]!] = v;
      }
      const unit = Number(form.get('line_items[0][price_data][unit_amount]'));
      const qty = Number(form.get('line_items[0][quantity]') ?? '1');
      const currency = form.get('line_items[0][price_data][currency]') ?? '';
      const success = form.get('success_url');
      const cancel = form.get('cancel_url');
      if (form.get('mode') !== 'payment' || !success || !cancel || !Number.isInteger(unit)) {
        stripeError(res, 400, 'mode=payment, success_url, cancel_url and line_items are required.');
        return;
      }
      const sid = id('cs');
      const s: FakeSession = {
        id: sid,
        object: 'checkout.session',
        mode: 'payment',
        status: 'open',
        payment_status: 'unpaid',
        client_reference_id: form.get('client_reference_id'),
        metadata,
        amount_total: unit * qty,
        currency,
        success_url: success,
        cancel_url: cancel,
        url: `${base}/pay/${sid}`,
        payment_intent: null,
        created: Math.floor(Date.now() / 1000),
        livemode: false,
        description: form.get('line_items[0][price_data][product_data][name]') ?? '',
      };
      sessions.set(sid, s);
      json(res, 200, s);
      return;
    }
    const one = /^\/v1\/checkout\/sessions\/([\w-]+)$/.exec(url.pathname);
    if (req.method === 'GET' && one) {
      const s = sessions.get(one[1]!);
      if (!s) stripeError(res, 404, `No such checkout.session: '${one[1]}'`);
      else json(res, 200, s);
      return;
    }
    const pay = /^\/pay\/([\w-]+)$/.exec(url.pathname);
    const s = pay ? sessions.get(pay[1]!) : undefined;
    if (pay && !s) {
      res.writeHead(404, { 'Content-Type': 'text/html; charset=utf-8' });
      res.end(page('Not found', '<h1>This checkout does not exist.</h1>'));
      return;
    }
    if (s && req.method === 'GET') {
      res.writeHead(200, { 'Content-Type': 'text/html; charset=utf-8' });
      res.end(
        s.status === 'open'
          ? checkoutPage(s)
          : page('Test checkout', '<h1>This checkout is finished.</h1>'),
      );
      return;
    }
    if (s && req.method === 'POST') {
      const form = new URLSearchParams(await readBody(req, 4096));
      const back = (to: string) => {
        res.writeHead(303, { Location: to.replace('{CHECKOUT_SESSION_ID}', s.id) });
        res.end();
      };
      if (form.get('action') === 'cancel') return back(s.cancel_url);
      if (s.status !== 'open') return back(s.success_url);
      if ((form.get('card') ?? '').replace(/[\s-]/g, '') !== TEST_CARD) {
        res.writeHead(402, { 'Content-Type': 'text/html; charset=utf-8' });
        res.end(checkoutPage(s, 'Your card was declined. Use the test card 4242 4242 4242 4242.'));
        return;
      }
      s.status = 'complete';
      s.payment_status = 'paid';
      s.payment_intent = id('pi');
      const status = await deliver(s).catch(() => 0);
      if (status < 200 || status >= 300) {
        s.status = 'open';
        s.payment_status = 'unpaid';
        res.writeHead(502, { 'Content-Type': 'text/html; charset=utf-8' });
        res.end(checkoutPage(s, `The shop did not accept the payment (answer ${status}).`));
        return;
      }
      return back(s.success_url);
    }
    stripeError(res, 404, `Unrecognized request URL (${req.method}: ${url.pathname}).`);
  }

  const server = createServer((req, res) => {
    handle(req, res).catch(() => {
      if (!res.headersSent) stripeError(res, 400, 'Bad request.');
      else res.end();
    });
  });
  await new Promise<void>((resolve) => server.listen(opts.port ?? 0, '127.0.0.1', resolve));
  const port = (server.address() as AddressInfo).port;
  base = `http://127.0.0.1:${port}`;
  return {
    port,
    settings: {
      secretKey,
      webhookSecret,
      api: { host: '127.0.0.1', port, protocol: 'http' },
    },
    sessions,
    sign: (payload, t = Math.floor(Date.now() / 1000)) => signPayload(webhookSecret, payload, t),
    close: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}
