// eslint-disable-next-line @typescript-eslint/no-require-imports
const pdfParse = require('pdf-parse') as (b: Buffer) => Promise<{ text: string }>;
import { demoLogoPng } from '../../../db/seed/demo-provider';
import { startFixtureCast, type EvaluationFixture } from '../testing/evaluation-fixtures';
import { commitAndPublish, download, send, type Client, type TestApp } from '../testing/test-app';

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
    const cast = await startFixtureCast({ participants: 12, labPrefix: 'Comment Lab' }, (fx) => [
      { email: 'coord@prov.test', roles: ['coordinator'], signIn: true },
      { email: 'admin@prov.test', roles: ['admin'], signIn: true },
      { email: 'lab@prov.test', lab: fx.labs[0]!.id, signIn: true },
    ]);
    ({ t, fx } = cast);
    coordinator = cast.as('coord@prov.test');
    admin = cast.as('admin@prov.test');
    lab = cast.as('lab@prov.test');
  });
  afterAll(() => t.close());

  const putProfile = (c: Client, body: object) => send(c, '/provider', body, 'put');
  const putLogo = (c: Client, file: Buffer) =>
    send(c, '/provider/logo', { dataBase64: file.toString('base64') }, 'put');
  const putComments = (c: Client, comments: string) =>
    send(c, `/rounds/${fx.round.id}/evaluation/comments`, { comments }, 'put');

  it('saves the profile for a coordinator or an admin; a lab member may read it, not change it', async () => {
    const saved = await putProfile(coordinator, profile).expect(200);
    expect(saved.body).toMatchObject({ ...profile, hasLogo: false });
    await putProfile(admin, { ...profile, authoriserRole: 'Quality manager' }).expect(200);
    expect((await lab.agent.get('/api/v1/provider').expect(200)).body.authoriserRole).toBe(
      'Quality manager',
    );
    await putProfile(lab, profile).expect(403);
  });

  it('answers 400 naming the field and keeps the stored profile', async () => {
    const bad = await putProfile(coordinator, {
      ...profile,
      contactEmail: 'not-an-address',
      name: 'Changed',
    }).expect(400);
    expect(JSON.stringify(bad.body.error.details)).toContain('contactEmail');
    const tooLong = await putProfile(coordinator, {
      ...profile,
      subcontracting: 'x'.repeat(2001),
    }).expect(400);
    expect(JSON.stringify(tooLong.body.error.details)).toContain('subcontracting');
    expect((await coordinator.agent.get('/api/v1/provider').expect(200)).body.name).toBe(
      'Invented PT Office',
    );
  });

  it('takes a PNG logo checked by its content and bounded in size; a renamed text file is refused', async () => {
    const png = demoLogoPng();
    const ok = await putLogo(coordinator, png).expect(200);
    expect(ok.body).toMatchObject({ hasLogo: true, logoType: 'image/png' });
    const got = await lab.agent.get('/api/v1/provider/logo').expect(200);
    expect(got.headers['content-type']).toBe('image/png');
    const fake = await putLogo(coordinator, Buffer.from('<svg onload="x()"/>')).expect(400);
    expect(JSON.stringify(fake.body.error.details)).toContain('dataBase64');
    const big = Buffer.concat([png, Buffer.alloc(300 * 1024)]);
    await putLogo(coordinator, big).expect(400);
    expect((await coordinator.agent.get('/api/v1/provider').expect(200)).body.logoType).toBe(
      'image/png',
    ); // unchanged
    await send(coordinator, '/provider/logo', undefined, 'delete').expect(200);
    await lab.agent.get('/api/v1/provider/logo').expect(404);
  });

  it('keeps the coordinator’s comments on the evaluation until it is published, and prints them in the round report', async () => {
    const id = fx.round.id;
    await coordinator.agent.get(`/api/v1/rounds/${id}/evaluation/comments`).expect(404); // no evaluation yet
    await send(coordinator, `/rounds/${id}/evaluation`, {}).expect(201);
    const saved = await putComments(
      coordinator,
      'Two items arrived warm; their labs were told.',
    ).expect(200);
    expect(saved.body).toEqual({
      comments: 'Two items arrived warm; their labs were told.',
      editable: true,
    });
    await putComments(coordinator, 'x'.repeat(4001)).expect(400);
    await putComments(lab, 'no').expect(403);
    await commitAndPublish(coordinator, id);
    const after = await putComments(coordinator, 'changed').expect(409);
    expect(after.body.error.code).toBe('evaluation_published');
    expect(
      (await coordinator.agent.get(`/api/v1/rounds/${id}/evaluation/comments`).expect(200)).body,
    ).toEqual({ comments: 'Two items arrived warm; their labs were told.', editable: false });
    const pdf = await download(coordinator, `/rounds/${id}/reports/round.pdf`).expect(200);
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
