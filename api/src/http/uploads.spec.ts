import ExcelJS from 'exceljs';
import { createHash, randomBytes } from 'node:crypto';
import request from 'supertest';
import {
  ATTACHMENT_LIMIT,
  RESULTS_WORKBOOK_LIMIT,
  STUDY_FILE_LIMIT,
} from '../../../shared/contracts/upload-limits';
import { cleanResults, createBenchRound, enrol, type BenchRound } from '../testing/bench-fixtures';
import { api, binary, send, startCast, type Client, type TestApp } from '../testing/test-app';
import type { TextJobResult } from '../workers/file-jobs';
import { closeUploadWorkers, runInWorker, UPLOAD_WORKER_LIMITS } from '../workers/pool';
import { HttpError } from './errors';
import { cleanFileName } from './uploads';

/** A hand-made multipart body, so broken forms can be sent exactly as a faulty client would. */
function multipart(
  parts: { name: string; filename?: string; filenameStar?: string; data: Buffer | string }[],
  boundary = 'XyZbOuNdArY',
): Buffer {
  const chunks: Buffer[] = [];
  for (const p of parts) {
    const star =
      p.filenameStar !== undefined
        ? `; filename*=UTF-8''${encodeURIComponent(p.filenameStar)}`
        : '';
    const disp = `form-data; name="${p.name}"${p.filename !== undefined ? `; filename="${p.filename}"` : ''}${star}`;
    chunks.push(
      Buffer.from(
        `--${boundary}\r\nContent-Disposition: ${disp}\r\n${p.filename !== undefined ? 'Content-Type: application/octet-stream\r\n' : ''}\r\n`,
        'utf8',
      ),
    );
    chunks.push(Buffer.isBuffer(p.data) ? p.data : Buffer.from(p.data, 'utf8'));
    chunks.push(Buffer.from('\r\n'));
  }
  chunks.push(Buffer.from(`--${boundary}--\r\n`));
  return Buffer.concat(chunks);
}

describe('Uploads: one rule at the edge, limits before parsing, heavy work off the event loop', () => {
  let t: TestApp;
  let a: Client;
  let coord: Client;
  let r: BenchRound;
  let labA: string;

  beforeAll(async () => {
    const cast = await startCast({
      labs: ['Alder Particle Lab'],
      users: [
        { email: 'a@up.test', lab: 0, signIn: true },
        { email: 'coord@up.test', roles: ['coordinator'], signIn: true },
      ],
    });
    ({ t } = cast);
    labA = cast.labIds[0]!;
    a = cast.as('a@up.test');
    coord = cast.as('coord@up.test');
    r = await createBenchRound(t.ds, { code: 'UP-1' });
    await enrol(t.ds, r.round.id, labA, 'P-101');
  });
  afterAll(async () => {
    await closeUploadWorkers();
    await t.close();
  });

  const raw = (
    c: Client,
    path: string,
    body: Buffer,
    contentType = 'multipart/form-data; boundary=XyZbOuNdArY',
  ) =>
    c.agent.post(api(path)).set('x-csrf-token', c.csrf).set('content-type', contentType).send(body);

  async function template(): Promise<ExcelJS.Workbook> {
    const tpl = await a.agent
      .get(api(`/rounds/${r.round.id}/submission/template.xlsx`))
      .buffer(true)
      .parse(binary)
      .expect(200);
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(tpl.body as unknown as ArrayBuffer);
    return wb;
  }

  /** Polls /health until `work` settles; answers the latencies (ms) and how many answered while the work ran. */
  async function whilePolling<T>(work: Promise<T>): Promise<{ result: T; latencies: number[] }> {
    let done = false;
    const settled = Promise.resolve(work).finally(() => (done = true));
    const latencies: number[] = [];
    const poll = (async () => {
      while (!done) {
        const t0 = performance.now();
        const res = await request(t.app).get(api('/health'));
        expect(res.status).toBe(200);
        if (!done) latencies.push(performance.now() - t0);
        await new Promise((ok) => setTimeout(ok, 20));
      }
    })();
    const result = await settled;
    await poll;
    return { result, latencies };
  }

  describe('malformed multipart answers 400 naming the problem, on every upload route', () => {
    const routes = () => [
      { c: a, path: `/rounds/${r.round.id}/submission/upload.xlsx`, file: 'file' },
      { c: a, path: `/rounds/${r.round.id}/submission/attachments`, file: 'file' },
      { c: coord, path: `/rounds/${r.round.id}/homogeneity/upload`, file: 'file' },
    ];

    it('refuses two file parts', async () => {
      for (const { c, path, file } of routes()) {
        const res = await raw(
          c,
          path,
          multipart([
            { name: file, filename: 'a.csv', data: 'x' },
            { name: file, filename: 'b.csv', data: 'y' },
          ]),
        ).expect(400);
        expect(res.body.error.message).toBe('file: send one file only.');
      }
    });

    it('refuses a file under an unexpected field name, and an unknown text field', async () => {
      for (const { c, path } of routes()) {
        const res = await raw(
          c,
          path,
          multipart([{ name: 'upload', filename: 'a.csv', data: 'x' }]),
        ).expect(400);
        expect(res.body.error.message).toBe(
          'upload: unexpected file field; send the file in the field "file".',
        );
        const extra = await raw(
          c,
          path,
          multipart([
            { name: 'colour', data: 'red' },
            { name: 'file', filename: 'a.csv', data: 'x' },
          ]),
        ).expect(400);
        expect(extra.body.error.message).toMatch(
          /^colour: unexpected field; this upload takes "file"/,
        );
      }
      const receipt = await a.agent
        .put(api(`/rounds/${r.round.id}/receipt`))
        .set('x-csrf-token', a.csrf)
        .set('content-type', 'multipart/form-data; boundary=XyZbOuNdArY')
        .send(multipart([{ name: 'file', filename: 'box.png', data: 'x' }]))
        .expect(400);
      expect(receipt.body.error.message).toBe(
        'file: unexpected file field; send the file in the field "photo".',
      );
    });

    it('refuses a truncated body and a missing boundary', async () => {
      for (const { c, path } of routes()) {
        const whole = multipart([{ name: 'file', filename: 'a.csv', data: 'lag,g2\n1e-6,0.9\n' }]);
        const cut = await raw(c, path, whole.subarray(0, whole.length - 20)).expect(400);
        expect(cut.body.error.code).toBe('multipart_invalid');
        expect(cut.body.error.message).toMatch(/^The upload is not a well-formed multipart form/);
        const noBoundary = await raw(c, path, whole, 'multipart/form-data').expect(400);
        expect(noBoundary.body.error.code).toBe('multipart_invalid');
      }
    });

    it('answers a corrupt zip with 415 (not a workbook by content) or 400 (unreadable workbook) naming the file, never 500', async () => {
      const corrupt = Buffer.concat([
        Buffer.from('PK\x03\x04', 'latin1'),
        randomBytes(2000),
        Buffer.from('[Content_Types].xml xl/worksheets/sheet1.xml'),
      ]);
      const wb = await a.agent
        .post(api(`/rounds/${r.round.id}/submission/upload.xlsx`))
        .set('x-csrf-token', a.csrf)
        .attach('file', corrupt, 'results.xlsx')
        .expect(415);
      expect(wb.body.error.message).toBe(
        'file: upload the .xlsx workbook downloaded from this round.',
      );
      const study = await coord.agent
        .post(api(`/rounds/${r.round.id}/homogeneity/upload`))
        .set('x-csrf-token', coord.csrf)
        .field('kind', 'homogeneity')
        .field('testItemId', r.items[0]!.id)
        .field('measurandId', r.zAverage.id)
        .attach('file', corrupt, 'study.xlsx')
        .expect(400);
      expect(study.body.error.code).toBe('workbook_unreadable');
      expect(study.body.error.message).toMatch(
        /^file: the workbook could not be read \(the zip has no end record/,
      );
    });

    it('reads file names as UTF-8 and drops control characters', async () => {
      const text = 'Instrument export\nRun 1: 101.2 nm\n';
      // A raw UTF-8 name (as browsers send it), with a bidi override that could disguise the extension.
      const utf8 = await raw(
        a,
        `/rounds/${r.round.id}/submission/attachments`,
        multipart([{ name: 'file', filename: 'Größe µm – Probe\u202Etxt.csv', data: text }]),
      ).expect(201);
      expect(utf8.body.fileName).toBe('Größe µm – Probetxt.csv');
      // Control characters arrive percent-encoded (RFC 6266 filename*) and are dropped.
      const star = await raw(
        a,
        `/rounds/${r.round.id}/submission/attachments`,
        multipart([{ name: 'file', filenameStar: 'Größe\u0007 µm\u0001 – Probe.csv', data: text }]),
      ).expect(201);
      expect(star.body.fileName).toBe('Größe µm – Probe.csv');
      // Raw control characters in the part header are not a well-formed form.
      const ctl = await raw(
        a,
        `/rounds/${r.round.id}/submission/attachments`,
        multipart([{ name: 'file', filename: 'a\u0007.csv', data: text }]),
      ).expect(400);
      expect(ctl.body.error.code).toBe('multipart_invalid');
      expect(cleanFileName('C:\\temp\\..\\\u0000x\u009F"y".txt')).toBe('xy.txt');
      expect(cleanFileName('\u0001\u0002')).toBe('file');
    });
  });

  describe('results workbook: limits checked before parsing, health answers meanwhile', () => {
    it('reads the largest allowed workbook while /health answers, and refuses one row too many with 413 naming the limit', async () => {
      const limit = RESULTS_WORKBOOK_LIMIT;
      await send(
        a,
        `/rounds/${r.round.id}/submission`,
        { data: cleanResults(r), baseRevision: 0 },
        'put',
      ).expect(200);

      // Largest allowed: the Results sheet filled to the row limit (rows without item and measurand
      // are skipped) and a notes sheet of random text, so the file is close to the byte limit.
      const wb = await template();
      const ws = wb.getWorksheet('Results')!;
      for (let row = ws.rowCount + 1; row <= limit.maxRows; row++)
        for (let c = 6; c <= 13; c++) ws.getCell(row, c).value = c;
      const notes = wb.addWorksheet('Notes');
      const perRow = Math.floor((limit.maxCells - 16_000) / limit.maxRows);
      for (let row = 1; row <= limit.maxRows; row++)
        notes.addRow(Array.from({ length: perRow }, () => randomBytes(30).toString('base64')));
      const largest = Buffer.from(await wb.xlsx.writeBuffer());
      expect(largest.length).toBeGreaterThan(0.5 * limit.maxBytes);
      expect(largest.length).toBeLessThan(limit.maxBytes);

      const ok = await whilePolling(
        a.agent
          .post(api(`/rounds/${r.round.id}/submission/upload.xlsx`))
          .set('x-csrf-token', a.csrf)
          .attach('file', largest, 'results.xlsx'),
      );
      expect(ok.result.status).toBe(200);
      expect(ok.result.body.data.items[0].results[0].replicates).toEqual([102, 102.5, 103]);
      // /health kept answering while the workbook was read (it is parsed in a worker thread).
      // How fast is the bench's business (bench/uploads.ts, 200 ms goal): a latency bound here
      // failed on a loaded machine, so the test only asks that answers kept coming.
      expect(ok.latencies.length).toBeGreaterThanOrEqual(3);

      // One row more than the limit: 413 naming the limit, before the workbook is parsed.
      ws.getCell(limit.maxRows + 1, 6).value = 1;
      const tooMany = Buffer.from(await wb.xlsx.writeBuffer());
      expect(tooMany.length).toBeLessThan(limit.maxBytes);
      const refused = await whilePolling(
        a.agent
          .post(api(`/rounds/${r.round.id}/submission/upload.xlsx`))
          .set('x-csrf-token', a.csrf)
          .attach('file', tooMany, 'results.xlsx'),
      );
      expect(refused.result.status).toBe(413);
      expect(refused.result.body.error.code).toBe('too_many_rows');
      expect(refused.result.body.error.message).toBe(
        'file: sheet "Results" has more than 1,000 rows; a results workbook has at most 1,000 rows per sheet.',
      );

      // Over the byte limit: 413 at the edge, naming the limit.
      const big = await a.agent
        .post(api(`/rounds/${r.round.id}/submission/upload.xlsx`))
        .set('x-csrf-token', a.csrf)
        .attach('file', Buffer.concat([largest, randomBytes(limit.maxBytes)]), 'results.xlsx')
        .expect(413);
      expect(big.body.error.message).toBe(
        'file: the results workbook is larger than 2 MB; the limit is 2 MB per file.',
      );
      const view = await a.agent.get(api(`/rounds/${r.round.id}/submission`)).expect(200);
      expect(view.body.draftRevision).toBe(2); // only the accepted upload changed the draft
    });

    it('refuses a zip bomb by its unpacked size', async () => {
      const wb = await template();
      wb.getWorksheet('Read me')!.getCell('A20').value = 'x'.repeat(
        RESULTS_WORKBOOK_LIMIT.maxUnpackedBytes / 4,
      );
      wb.getWorksheet('Read me')!.getCell('A21').value = 'y'.repeat(
        RESULTS_WORKBOOK_LIMIT.maxUnpackedBytes / 4,
      );
      wb.getWorksheet('Read me')!.getCell('A22').value = 'z'.repeat(
        RESULTS_WORKBOOK_LIMIT.maxUnpackedBytes / 4,
      );
      wb.getWorksheet('Read me')!.getCell('A23').value = 'w'.repeat(
        RESULTS_WORKBOOK_LIMIT.maxUnpackedBytes / 4,
      );
      const bomb = Buffer.from(await wb.xlsx.writeBuffer());
      expect(bomb.length).toBeLessThan(RESULTS_WORKBOOK_LIMIT.maxBytes);
      const res = await a.agent
        .post(api(`/rounds/${r.round.id}/submission/upload.xlsx`))
        .set('x-csrf-token', a.csrf)
        .attach('file', bomb, 'results.xlsx')
        .expect(413);
      expect(res.body.error.message).toBe(
        'file: the results workbook unpacks to more than 32 MB; the limit is 32 MB unpacked.',
      );
    });

    it('states the limits in the API description', async () => {
      const doc = (await request(t.app).get(api('/openapi.json')).expect(200)).body;
      expect(doc.paths['/api/v1/rounds/{id}/submission/upload.xlsx'].post.description).toContain(
        'Limit 2 MB, 1,000 rows per sheet, 50,000 cells. Multipart field `file` (one file)',
      );
      expect(doc.paths['/api/v1/rounds/{id}/homogeneity/upload'].post.description).toContain(
        'Limit 2 MB, 500 rows per sheet',
      );
      expect(doc.paths['/api/v1/rounds/{id}/submission/attachments'].post.description).toContain(
        'Limit 20 MB.',
      );
      expect(doc.paths['/api/v1/rounds/{id}/receipt'].put.description).toContain(
        'Limit 8 MB. Multipart field `photo`',
      );
    });

    it('names the cell of a formula instead of reading its cached result', async () => {
      const wb = await template();
      wb.getWorksheet('Results')!.getCell('F2').value = { formula: 'E2*1.01', result: 103.02 };
      const res = await a.agent
        .post(api(`/rounds/${r.round.id}/submission/upload.xlsx`))
        .set('x-csrf-token', a.csrf)
        .attach('file', Buffer.from(await wb.xlsx.writeBuffer()), 'results.xlsx')
        .expect(422);
      expect(res.body.error.details[0]).toEqual({
        sheet: 'Results',
        row: 2,
        column: 'F',
        message:
          'Results row 2, column F (Replicate 2): the cell holds a formula (=E2*1.01); type the value itself.',
      });
    });
  });

  describe('attachments and study files', () => {
    it('stores a correlation CSV longer than the re-analysis reads, without parsing it, and says so', async () => {
      const lines = ['lag time (s),g2-1'];
      for (let i = 0; i <= ATTACHMENT_LIMIT.maxCorrelationRows; i++)
        lines.push(
          `${(1e-7 * (1 + i)).toExponential(12)},${Math.exp(-i / 2000).toExponential(12)}`,
        );
      const csv = Buffer.from(lines.join('\n'));
      expect(csv.length).toBeGreaterThan(256 * 1024); // read in the worker
      const res = await a.agent
        .post(api(`/rounds/${r.round.id}/submission/attachments`))
        .set('x-csrf-token', a.csrf)
        .attach('file', csv, 'long.csv')
        .expect(201);
      expect(res.body.kind).toBe('correlation-csv');
      expect(res.body.sizeBytes).toBe(csv.length);
      expect(res.body.sha256).toBe(createHash('sha256').update(csv).digest('hex'));
      const stored = await a.agent
        .get(api(`/rounds/${r.round.id}/submission/attachments/${res.body.id}`))
        .buffer(true)
        .parse(binary)
        .expect(200);
      expect((stored.body as Buffer).equals(csv)).toBe(true); // the bytes went to the worker and back intact
      expect(res.body.reanalysis.ok).toBe(false);
      expect(res.body.reanalysis.error).toBe(
        'not re-analysed: the file has 10,002 lines and a correlation function is read up to 10,000 lag times. The file is stored as sent.',
      );
    });

    it('counts a study CSV’s lines before parsing it', async () => {
      const csv = [
        'item,rep1,rep2',
        ...Array.from({ length: STUDY_FILE_LIMIT.maxRows }, (_, i) => `H${i},100,101`),
      ].join('\n');
      const res = await coord.agent
        .post(api(`/rounds/${r.round.id}/homogeneity/upload`))
        .set('x-csrf-token', coord.csrf)
        .field('kind', 'homogeneity')
        .field('testItemId', r.items[0]!.id)
        .field('measurandId', r.zAverage.id)
        .attach('file', Buffer.from(csv), 'study.csv')
        .expect(413);
      expect(res.body.error.message).toBe(
        'file: 501 lines; a homogeneity or stability file has at most 500 rows.',
      );
    });
  });

  describe('the upload worker', () => {
    it('has a bounded heap: a job that exhausts it ends the worker with 413, and the next job runs', async () => {
      expect(UPLOAD_WORKER_LIMITS.maxOldGenerationSizeMb).toBeLessThanOrEqual(256);
      const err = await runInWorker({ type: 'exhaust-memory' }, 'test file').catch(
        (e: unknown) => e,
      );
      expect(err).toBeInstanceOf(HttpError);
      expect((err as HttpError).status).toBe(413);
      expect((err as HttpError).message).toBe(
        'file: reading the test file needs more than 192 MB of memory; send a smaller file.',
      );
      await request(t.app).get(api('/health')).expect(200);
      const again = await runInWorker<TextJobResult>(
        { type: 'text', data: new Uint8Array(Buffer.from('hello\n')), maxCorrelationRows: 10 },
        'test file',
      );
      expect(again.class.kind).toBe('text');
      expect(Buffer.from(again.bytes).toString()).toBe('hello\n'); // the bytes come back
      expect(again.sha256).toBe(createHash('sha256').update('hello\n').digest('hex'));
    });

    it('ends a job that runs past its time limit with 422', async () => {
      const err = await runInWorker({ type: 'spin' }, 'test file', 1500).catch((e: unknown) => e);
      expect((err as HttpError).status).toBe(422);
      expect((err as HttpError).code).toBe('file_too_complex');
      const again = await runInWorker<TextJobResult>(
        {
          type: 'text',
          data: new Uint8Array(Buffer.from('1e-6,0.9\n2e-6,0.8\n')),
          maxCorrelationRows: 10,
        },
        'test file',
      );
      expect(again.class.kind).toBe('correlation-csv');
    });
  });
});
