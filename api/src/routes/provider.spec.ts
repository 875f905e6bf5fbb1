// eslint-disable-next-line @typescript-eslint/no-require-imports
const pdfParse = require('pdf-parse') as (b: Buffer) => Promise<{ text: string }>;
import { demoLogoPng } from '../../../db/seed/demo-provider';
import { buildEvaluationFixture, type EvaluationFixture } from '../testing/evaluation-fixtures';
import { createUser, signedIn, startTestApp, type Client, type TestApp } from '../testing/test-app';

/** Binary bodies for supertest. */
const binary = (res: unknown, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  const stream = res as NodeJS.ReadableStream;
  stream.on('data', (c: Buffer) => chunks.push(c));
  stream.on('end', () => cb(null, Buffer.concat(chunks)));
};

const profile = {
  name: 'Invented PT Office',
  address: '1 Nowhere Road\nTestville',
  contactEmail: 'pt@invented.example',
  contactPhone: '+00 1',
  website: 'https://invented.example',
  accreditationBody: '',
  accreditationNumber: '',
  authoriserName: 'Dr A. Person',
  authoriserRole: 'Scheme coordinator',
  subcontracting: 'None.',
};

describe('provider profile and round comments', () => {
  let t: TestApp;
  let fx: EvaluationFixture;
  let coordinator: Client;
  let admin: Client;
  let lab: Client;

  beforeAll(async () => {
    t = await startTestApp();
    fx = await buildEvaluationFixture(t.ds, { participants: 12, labPrefix: 'Comment Lab' });
    await createUser(t.ds, { email: 'coord@prov.test', roles: ['coordinator'] });
    await createUser(t.ds, { email: 'admin@prov.test', roles: ['admin'] });
    await createUser(t.ds, { email: 'lab@prov.test', lab: fx.labs[0]!.id });
    coordinator = await signedIn(t, 'coord@prov.test');
    admin = await signedIn(t, 'admin@prov.test');
    lab = await signedIn(t, 'lab@prov.test');
  });
  afterAll(() => t.close());

  it('saves the profile for a coordinator or an admin; a lab member may read it, not change it', async () => {
    const saved = await coordinator.agent
      .put('/api/v1/provider')
      .set('x-csrf-token', coordinator.csrf)
      .send(profile)
      .expect(200);
    expect(saved.body).toMatchObject({ ...profile, hasLogo: false });
    await admin.agent
      .put('/api/v1/provider')
      .set('x-csrf-token', admin.csrf)
      .send({ ...profile, authoriserRole: 'Quality manager' })
      .expect(200);
    expect((await lab.agent.get('/api/v1/provider').expect(200)).body.authoriserRole).toBe(
      'Quality manager',
    );
    await lab.agent.put('/api/v1/provider').set('x-csrf-token', lab.csrf).send(profile).expect(403);
  });

  it('answers 400 naming the field and keeps the stored profile', async () => {
    const bad = await coordinator.agent
      .put('/api/v1/provider')
      .set('x-csrf-token', coordinator.csrf)
      .send({ ...profile, contactEmail: 'not-an-address', name: 'Changed' })
      .expect(400);
    expect(JSON.stringify(bad.body.error.details)).toContain('contactEmail');
    const tooLong = await coordinator.agent
      .put('/api/v1/provider')
      .set('x-csrf-token', coordinator.csrf)
      .send({ ...profile, subcontracting: 'x'.repeat(2001) })
      .expect(400);
    expect(JSON.stringify(tooLong.body.error.details)).toContain('subcontracting');
    expect((await coordinator.agent.get('/api/v1/provider').expect(200)).body.name).toBe(
      'Invented PT Office',
    );
  });

  it('takes a PNG logo checked by its content and bounded in size; a renamed text file is refused', async () => {
    const png = demoLogoPng();
    const ok = await coordinator.agent
      .put('/api/v1/provider/logo')
      .set('x-csrf-token', coordinator.csrf)
      .send({ dataBase64: png.toString('base64') })
      .expect(200);
    expect(ok.body).toMatchObject({ hasLogo: true, logoType: 'image/png' });
    const got = await lab.agent.get('/api/v1/provider/logo').expect(200);
    expect(got.headers['content-type']).toBe('image/png');
    const fake = await coordinator.agent
      .put('/api/v1/provider/logo')
      .set('x-csrf-token', coordinator.csrf)
      .send({ dataBase64: Buffer.from('<svg onload="x()"/>').toString('base64') })
      .expect(400);
    expect(JSON.stringify(fake.body.error.details)).toContain('dataBase64');
    const big = Buffer.concat([png, Buffer.alloc(300 * 1024)]);
    await coordinator.agent
      .put('/api/v1/provider/logo')
      .set('x-csrf-token', coordinator.csrf)
      .send({ dataBase64: big.toString('base64') })
      .expect(400);
    expect((await coordinator.agent.get('/api/v1/provider').expect(200)).body.logoType).toBe(
      'image/png',
    ); // unchanged
    await coordinator.agent
      .delete('/api/v1/provider/logo')
      .set('x-csrf-token', coordinator.csrf)
      .expect(200);
    await lab.agent.get('/api/v1/provider/logo').expect(404);
  });

  it('keeps the coordinator’s comments on the evaluation until it is published, and prints them in the round report', async () => {
    const id = fx.round.id;
    await coordinator.agent.get(`/api/v1/rounds/${id}/evaluation/comments`).expect(404); // no evaluation yet
    await coordinator.agent
      .post(`/api/v1/rounds/${id}/evaluation`)
      .set('x-csrf-token', coordinator.csrf)
      .send({})
      .expect(201);
    const saved = await coordinator.agent
      .put(`/api/v1/rounds/${id}/evaluation/comments`)
      .set('x-csrf-token', coordinator.csrf)
      .send({ comments: 'Two items arrived warm; their labs were told.' })
      .expect(200);
    expect(saved.body).toEqual({
      comments: 'Two items arrived warm; their labs were told.',
      editable: true,
    });
    await coordinator.agent
      .put(`/api/v1/rounds/${id}/evaluation/comments`)
      .set('x-csrf-token', coordinator.csrf)
      .send({ comments: 'x'.repeat(4001) })
      .expect(400);
    await lab.agent
      .put(`/api/v1/rounds/${id}/evaluation/comments`)
      .set('x-csrf-token', lab.csrf)
      .send({ comments: 'no' })
      .expect(403);
    await coordinator.agent
      .post(`/api/v1/rounds/${id}/evaluation/commit`)
      .set('x-csrf-token', coordinator.csrf)
      .send({})
      .expect(200);
    await coordinator.agent
      .post(`/api/v1/rounds/${id}/publish`)
      .set('x-csrf-token', coordinator.csrf)
      .send({})
      .expect(200);
    const after = await coordinator.agent
      .put(`/api/v1/rounds/${id}/evaluation/comments`)
      .set('x-csrf-token', coordinator.csrf)
      .send({ comments: 'changed' })
      .expect(409);
    expect(after.body.error.code).toBe('evaluation_published');
    expect(
      (await coordinator.agent.get(`/api/v1/rounds/${id}/evaluation/comments`).expect(200)).body,
    ).toEqual({ comments: 'Two items arrived warm; their labs were told.', editable: false });
    const pdf = await coordinator.agent
      .get(`/api/v1/rounds/${id}/reports/round.pdf`)
      .buffer(true)
      .parse(binary)
      .expect(200);
    const text = (await pdfParse(pdf.body)).text.replace(/\s+/g, ' ');
    expect(text).toContain('Two items arrived warm; their labs were told.');
    expect(text).toContain('Authorised by Dr A. Person, Quality manager, for Invented PT Office');
  });

  it('signs the e-mails with the provider’s name', async () => {
    let rows: { text: string }[] = [];
    for (let i = 0; i < 50 && rows.length === 0; i++) {
      rows = await t.ds.query(
        `SELECT text FROM mail_message WHERE subject ILIKE '%${fx.round.code}%'`,
      );
      if (rows.length === 0) await new Promise((r) => setTimeout(r, 100));
    }
    expect(rows.length).toBeGreaterThan(0);
    for (const r of rows) expect(r.text).toMatch(/\n-- \nInvented PT Office\n?$/);
  });
});
