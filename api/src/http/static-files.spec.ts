import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { brotliCompressSync, gzipSync } from 'node:zlib';
import express from 'express';
import request from 'supertest';
import { cacheControlFor, IMMUTABLE, preloadsFor, webApp } from './static-files';

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

  describe("a page's own scripts", () => {
    const built = mkdtempSync(join(tmpdir(), 'ringlet-static-'));
    writeFileSync(
      join(built, 'index.html'),
      '<html><head></head><body><script src="main-AB12CD34.js" type="module"></script></body></html>',
    );
    const table = [
      { path: 'board/rounds/:id', files: ['chunk-Board123.js', 'chunk-Grid4567.js'] },
      { path: 'board', files: ['chunk-List1234.js', '../secret.js'] },
    ];
    writeFileSync(join(built, 'route-preloads.json'), JSON.stringify(table));
    const site = express();
    site.use(webApp(built)!);
    afterAll(() => rmSync(built, { recursive: true, force: true }));

    it('matches a whole path, literal segments exactly and :params as any one segment', () => {
      expect(preloadsFor(table, '/board/rounds/7')).toEqual(table[0]!.files);
      expect(preloadsFor(table, '/board/')).toEqual(table[1]!.files);
      expect(preloadsFor(table, '/board/rounds/7/evaluation')).toEqual([]);
      expect(preloadsFor(table, '/bench/rounds/7')).toEqual([]);
    });

    it('names them in index.html ahead of main.js, and only safe file names', async () => {
      const page = await request(site).get('/board/rounds/7').set('Accept', 'text/html');
      expect(page.status).toBe(200);
      expect(page.text).toContain(
        '<link rel="modulepreload" href="chunk-Board123.js"><link rel="modulepreload" href="chunk-Grid4567.js"><script src="main-AB12CD34.js"',
      );
      const list = await request(site).get('/board').set('Accept', 'text/html');
      expect(list.text).toContain('href="chunk-List1234.js"');
      expect(list.text).not.toContain('secret');
      const other = await request(site).get('/desk').set('Accept', 'text/html');
      expect(other.text).not.toContain('modulepreload');
    });

    it('answers a revisit with 304 when the page did not change', async () => {
      const first = await request(site).get('/board/rounds/7').set('Accept', 'text/html');
      expect(first.headers['etag']).toBeTruthy();
      const again = await request(site)
        .get('/board/rounds/7')
        .set('Accept', 'text/html')
        .set('If-None-Match', first.headers['etag'] as string);
      expect(again.status).toBe(304);
    });
  });
});
