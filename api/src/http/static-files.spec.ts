import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { brotliCompressSync, gzipSync } from 'node:zlib';
import express from 'express';
import request from 'supertest';
import { cacheControlFor, IMMUTABLE, webApp } from './static-files';

describe('the built web app', () => {
  const dir = mkdtempSync(join(tmpdir(), 'ringlet-static-'));
  const js = 'console.log("ringlet");\n'.repeat(200);
  writeFileSync(join(dir, 'index.html'), '<!doctype html><title>Ringlet</title>');
  writeFileSync(join(dir, 'main-AB12CD34.js'), js);
  writeFileSync(join(dir, 'main-AB12CD34.js.br'), brotliCompressSync(js));
  writeFileSync(join(dir, 'main-AB12CD34.js.gz'), gzipSync(js));
  writeFileSync(join(dir, 'favicon.ico'), 'icon');
  const app = express();
  app.use(webApp(dir)!);
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('sends the brotli copy when the browser accepts it, with a year-long immutable cache', async () => {
    const res = await request(app)
      .get('/main-AB12CD34.js')
      .set('Accept-Encoding', 'gzip, deflate, br')
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      });
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBe('br');
    expect(res.headers['content-type']).toMatch(/javascript/);
    expect(res.headers['cache-control']).toBe(IMMUTABLE);
    expect(res.headers['vary']).toMatch(/Accept-Encoding/i);
  });

  it('falls back to gzip, then to the plain file', async () => {
    const gz = await request(app).get('/main-AB12CD34.js').set('Accept-Encoding', 'gzip');
    expect(gz.headers['content-encoding']).toBe('gzip');
    expect(gz.text).toBe(js);
    const plain = await request(app).get('/main-AB12CD34.js').set('Accept-Encoding', 'identity');
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(plain.text).toBe(js);
  });

  it('revalidates unhashed files and the page itself', async () => {
    for (const hashed of ['/chunk-Cla-rRO_.js', '/chunk--v9guhuW.js.br', '/media/a-DUBPJEHV.woff2'])
      expect(cacheControlFor(hashed)).toBe(IMMUTABLE);
    for (const plain of ['/x/favicon.ico', '/favicon.svg', '/3rdpartylicenses.txt'])
      expect(cacheControlFor(plain)).toBe('public, max-age=3600');
    const page = await request(app).get('/rounds/7').set('Accept', 'text/html');
    expect(page.status).toBe(200);
    expect(page.headers['cache-control']).toBe('no-cache');
  });

  it("leaves the API's paths to the API, even when a browser asks for a page", async () => {
    const withApi = express();
    withApi.use(webApp(dir)!);
    withApi.use('/api', (_req, res) => res.status(404).json({ code: 'not_found' }));
    for (const path of ['/api', '/api/v1/nothing-here']) {
      const res = await request(withApi).get(path).set('Accept', 'text/html');
      expect(res.status).toBe(404);
      expect(res.body).toEqual({ code: 'not_found' });
    }
  });

  it('is absent when nothing is built', () => {
    expect(webApp(join(dir, 'missing'))).toBeNull();
  });
});
