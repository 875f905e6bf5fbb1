/**
 * The benches' HTTP client, in one place: one request on a keep-alive agent to the server under
 * test on 127.0.0.1 (never another address), and signing in as the browser does (CSRF token,
 * session cookie, a fresh token for the session).
 */
import http from 'node:http';

export interface Answer {
  status: number;
  headers: http.IncomingHttpHeaders;
  /** The body as UTF-8 text. */
  body: string;
}

/**
 * Sends one request. A string body is JSON (`content-type` set unless given); a Buffer body is
 * sent as is with its `content-length` (the caller names its type, e.g. multipart).
 */
export function send(
  port: number,
  agent: http.Agent | undefined,
  method: string,
  path: string,
  headers: Record<string, string> = {},
  body?: string | Buffer,
): Promise<Answer> {
  const extra: Record<string, string> =
    body === undefined
      ? {}
      : typeof body === 'string'
        ? { 'content-type': 'application/json' }
        : { 'content-length': String(body.length) };
  return new Promise((resolve, reject) => {
    const req = http.request(
      { host: '127.0.0.1', port, method, path, agent, headers: { ...extra, ...headers } },
      (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () =>
          resolve({
            status: res.statusCode ?? 0,
            headers: res.headers,
            body: Buffer.concat(chunks).toString('utf8'),
          }),
        );
        res.on('error', reject);
      },
    );
    req.on('error', reject);
    if (body) req.write(body);
    req.end();
  });
}

export interface Session {
  cookie: string;
  csrf: string;
}

const cookiesOf = (a: Answer): string =>
  (a.headers['set-cookie'] ?? []).map((c) => c.split(';')[0]).join('; ');
const tokenOf = (a: Answer): string => (JSON.parse(a.body) as { token: string }).token;

/** Signs in with e-mail and password; `headers` go on every request (e.g. x-forwarded-for). */
export async function signIn(
  port: number,
  agent: http.Agent,
  email: string,
  password: string,
  headers: Record<string, string> = {},
): Promise<Session> {
  const t1 = await send(port, agent, 'GET', '/api/v1/auth/csrf-token', headers);
  let cookie = cookiesOf(t1);
  const r = await send(
    port,
    agent,
    'POST',
    '/api/v1/auth/sign-in',
    { ...headers, cookie, 'x-csrf-token': tokenOf(t1) },
    JSON.stringify({ email, password }),
  );
  if (r.status !== 200) throw new Error(`sign-in ${email}: ${r.status} ${r.body}`);
  cookie = cookiesOf(r) || cookie;
  const t2 = await send(port, agent, 'GET', '/api/v1/auth/csrf-token', { ...headers, cookie });
  return { cookie, csrf: tokenOf(t2) };
}
