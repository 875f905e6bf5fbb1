import ExcelJS from 'exceljs';
import JSZip from 'jszip';
import { createHash } from 'node:crypto';
import { AssessorGrant } from '../../../db/entities';
import { startFixtureCast, type EvaluationFixture } from '../testing/evaluation-fixtures';
import { commitAndPublish, download, send, type Client, type TestApp } from '../testing/test-app';
// eslint-disable-next-line @typescript-eslint/no-require-imports
const pdfParse = require('pdf-parse') as (b: Buffer) => Promise<{ text: string }>;

describe('reports and assessor access', () => {
  let t: TestApp;
  let fx: EvaluationFixture;
  let coordinator: Client;
  let lab: Client;
  let assessor: Client;
  let stranger: Client;
  let evaluation: {
    results: {
      decimals: number;
      itemCode: string;
      measurandKey: string;
      assignedValue: number;
      sigmaPt: number;
      uAssigned: number;
      n: number;
      participants: { code: string; z: number; result: number }[];
    }[];
  };

  beforeAll(async () => {
    const cast = await startFixtureCast(
      { participants: 20, labPrefix: 'Secretive Lab', blunders: { 2: 2 } },
      (fx) => [
        { email: 'coord@rep.test', roles: ['coordinator'], signIn: true },
        { email: 'lab@rep.test', lab: fx.labs[0]!.id, manager: true, signIn: true },
        { email: 'assessor@rep.test', roles: ['assessor'], signIn: true },
        { email: 'stranger@rep.test', roles: ['assessor'], signIn: true },
      ],
    );
    ({ t, fx } = cast);
    coordinator = cast.as('coord@rep.test');
    lab = cast.as('lab@rep.test');
    assessor = cast.as('assessor@rep.test');
    stranger = cast.as('stranger@rep.test');
    const id = fx.round.id;
    evaluation = (await send(coordinator, `/rounds/${id}/evaluation`, {}).expect(201)).body;
    await commitAndPublish(coordinator, id);
    await t.ds.getRepository(AssessorGrant).insert({
      organisationId: fx.labs[0]!.id,
      assessorId: cast.users[2]!.id,
      grantedBy: null,
      startsOn: '2020-01-01',
      endsOn: null,
      revokedAt: null,
    });
  });
  afterAll(() => t.close());

  it('serves the workbook whose numbers are the stored evaluation’s', async () => {
    const res = await download(coordinator, `/rounds/${fx.round.id}/reports/round.xlsx`).expect(
      200,
    );
    expect(res.headers['content-type']).toContain('spreadsheetml');
    expect(res.headers['x-content-sha256']).toBe(
      createHash('sha256').update(res.body).digest('hex'),
    );
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(res.body);
    const g = evaluation.results[0]!;
    const summary = wb.getWorksheet('Summary')!.getRow(15); // 12 report rows, a blank row, the header
    expect(summary.getCell(1).value).toBe(g.itemCode);
    expect(summary.getCell(6).value).toBe(g.assignedValue);
    expect(summary.getCell(8).value).toBe(g.sigmaPt);
    expect(summary.getCell(10).value).toBe(g.n);
    const sheet = wb.worksheets[1]!;
    g.participants.forEach((p, i) => {
      expect(sheet.getRow(5 + i).getCell(1).value).toBe(p.code);
      expect(sheet.getRow(5 + i).getCell(5).value).toBe(p.result);
      expect(sheet.getRow(5 + i).getCell(8).value).toBe(p.z);
    });
    // Cached: the second answer is the same bytes.
    const again = await download(coordinator, `/rounds/${fx.round.id}/reports/round.xlsx`).expect(
      200,
    );
    expect(again.headers['x-content-sha256']).toBe(res.headers['x-content-sha256']);
  });

  it('serves the round PDF with assigned values and codes and no lab names, to a lab of the round', async () => {
    const res = await download(lab, `/rounds/${fx.round.id}/reports/round.pdf`).expect(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    const { text } = await pdfParse(res.body);
    for (const g of evaluation.results)
      expect(text).toContain(`x_pt = ${g.assignedValue.toFixed(g.decimals + 1)}`); // the measurand's decimals + 1
    expect(text).toContain(evaluation.results[0]!.participants[0]!.code);
    expect(text).toContain(evaluation.results[0]!.participants[19]!.code);
    expect(text).not.toContain('Secretive Lab');
    expect(text).toMatch(/ISO 13528/);
    expect(text).toMatch(/Confidentiality/);
  });

  it('serves a lab its own individual report and certificate with its own name only', async () => {
    const code = fx.enrolments[0]!.participantCode;
    const res = await download(lab, `/rounds/${fx.round.id}/reports/participant.pdf`).expect(200);
    const { text } = await pdfParse(res.body);
    expect(text).toContain(`Participant code: ${code}`);
    expect(text).toContain(fx.labs[0]!.name);
    expect(text).not.toContain(fx.labs[1]!.name);
    const cert = await download(lab, `/rounds/${fx.round.id}/reports/certificate.pdf`).expect(200);
    expect((await pdfParse(cert.body)).text).toContain('Certificate of participation');
  });

  it('answers 404 to an assessor without a grant, on every assessor and report route', async () => {
    const labId = fx.labs[0]!.id;
    await stranger.agent.get(`/api/v1/assessor/labs/${labId}/rounds`).expect(404);
    await stranger.agent.get(`/api/v1/assessor/labs/${labId}/evidence.zip`).expect(404);
    await stranger.agent.get(`/api/v1/rounds/${fx.round.id}/reports/round.pdf`).expect(404);
    await stranger.agent
      .get(`/api/v1/rounds/${fx.round.id}/reports/participant.pdf?labId=${labId}`)
      .expect(404);
    expect((await stranger.agent.get('/api/v1/assessor/labs').expect(200)).body).toEqual([]);
  });

  it('lists the granting lab and its rounds for the assessor', async () => {
    const labs = await assessor.agent.get('/api/v1/assessor/labs').expect(200);
    expect(labs.body.map((l: { name: string }) => l.name)).toEqual([fx.labs[0]!.name]);
    const detail = await assessor.agent
      .get(`/api/v1/assessor/labs/${fx.labs[0]!.id}/rounds`)
      .expect(200);
    expect(detail.body.rounds).toHaveLength(1);
    expect(detail.body.rounds[0]).toMatchObject({
      roundCode: fx.round.code,
      participantCode: fx.enrolments[0]!.participantCode,
      version: 1,
    });
  });

  it('builds an evidence pack whose manifest checksums match its files', async () => {
    const res = await download(assessor, `/assessor/labs/${fx.labs[0]!.id}/evidence.zip`).expect(
      200,
    );
    expect(res.headers['content-type']).toBe('application/zip');
    const zip = await JSZip.loadAsync(res.body);
    const manifest = JSON.parse(await zip.file('manifest.json')!.async('string')) as {
      files: { path: string; sha256: string; bytes: number }[];
    };
    const paths = Object.keys(zip.files)
      .filter((p) => !zip.files[p]!.dir && p !== 'manifest.json')
      .sort();
    expect(manifest.files.map((f) => f.path).sort()).toEqual(paths);
    // Round report, individual report, certificate, and the readable investigations and instrument checks.
    expect(paths.filter((p) => p.endsWith('.pdf'))).toHaveLength(5);
    expect(paths).toEqual(
      expect.arrayContaining([
        'investigations.pdf',
        'investigations.json',
        'instrument-checks.pdf',
        'instrument-checks.json',
        'audit-extract.json',
        'README.txt',
      ]),
    );
    // README, manifest and zip agree: the README names the zip's file count and the manifest's.
    const readme = await zip.file('README.txt')!.async('string');
    const allInZip = Object.keys(zip.files).filter((p) => !zip.files[p]!.dir);
    expect(allInZip).toHaveLength(manifest.files.length + 1);
    expect(readme).toContain(
      `The zip holds ${allInZip.length} files: the ${manifest.files.length} listed in manifest.json`,
    );
    for (const p of paths.filter((x) => !x.includes('/'))) expect(readme).toContain(`- ${p}:`);
    expect(
      (await pdfParse(await zip.file('investigations.pdf')!.async('nodebuffer'))).text,
    ).toContain('Investigations');
    for (const f of manifest.files) {
      const data = await zip.file(f.path)!.async('nodebuffer');
      expect({
        path: f.path,
        sha256: createHash('sha256').update(data).digest('hex'),
        bytes: data.length,
      }).toEqual(f);
    }
    // The lab's blunder (lab index 2 is not ours) does not leak names: the round PDF in the pack holds codes only.
    const roundPdf = paths.find((p) => p.endsWith('-round.pdf'))!;
    expect((await pdfParse(await zip.file(roundPdf)!.async('nodebuffer'))).text).not.toContain(
      'Secretive Lab',
    );
  });

  it('ends access when the grant ends', async () => {
    await t.ds
      .getRepository(AssessorGrant)
      .update({ organisationId: fx.labs[0]!.id }, { endsOn: '2021-01-01' });
    await assessor.agent.get(`/api/v1/assessor/labs/${fx.labs[0]!.id}/rounds`).expect(404);
    await assessor.agent.get(`/api/v1/rounds/${fx.round.id}/reports/round.pdf`).expect(404);
    expect((await assessor.agent.get('/api/v1/assessor/labs').expect(200)).body).toEqual([]);
  });
});
