import { mkdtempSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { createApp } from '../api/src/app';
import { buildEvaluationFixture } from '../api/src/testing/evaluation-fixtures';
import {
  publishAsCoordinator,
  startTestApp,
  testConfig,
  TEST_PASSWORD,
  type TestApp,
} from '../api/src/testing/test-app';
import { backupDatabase, restoreDatabase } from './backup';
import { createDataSource } from './data-source';
import { createEmptyDatabase } from './testing';

jest.setTimeout(180_000);

/** npm run db:backup / db:restore: pg_dump and pg_restore, restored into a fresh database. */
describe('backup and restore', () => {
  let t: TestApp;
  let roundId: string;
  let published: { assigned: number[]; publishedAt: string };
  const dir = mkdtempSync(join(tmpdir(), 'ringlet-backup-'));

  beforeAll(async () => {
    t = await startTestApp();
    const fx = await buildEvaluationFixture(t.ds, { participants: 7, seed: 7 });
    roundId = fx.round.id;
    await publishAsCoordinator(t, roundId, 'coord@backup.test');
    const rows: { assigned_value: number; published_at: Date }[] = await t.ds.query(
      `SELECT r.assigned_value, e.published_at FROM evaluation e JOIN evaluation_result r ON r.evaluation_id = e.id
       WHERE e.round_id = $1 AND e.state = 'published' ORDER BY r.item_code, r.measurand_key`,
      [roundId],
    );
    published = {
      assigned: rows.map((r) => r.assigned_value),
      publishedAt: rows[0]!.published_at.toISOString(),
    };
  });
  afterAll(async () => {
    await t.close();
    rmSync(dir, { recursive: true, force: true });
  });

  it('restores a backup into a fresh database where the server role reads the published round', async () => {
    expect(published.assigned.length).toBe(4); // 2 items × 2 measurands
    const file = join(dir, 'ringlet.dump');
    await backupDatabase(t.db.ownerUrl, file);
    expect(statSync(file).size).toBeGreaterThan(10_000);

    const fresh = await createEmptyDatabase();
    try {
      await restoreDatabase(fresh.ownerUrl, file);
      // The restored database, read as the runtime role through the real app.
      const ds = await createDataSource(fresh.url).initialize();
      try {
        const rows: { assigned_value: number; published_at: Date; state: string }[] =
          await ds.query(
            `SELECT r.assigned_value, e.published_at, e.state FROM evaluation e JOIN evaluation_result r ON r.evaluation_id = e.id
           WHERE e.round_id = $1 ORDER BY r.item_code, r.measurand_key`,
            [roundId],
          );
        expect(rows.map((r) => r.assigned_value)).toEqual(published.assigned);
        expect(
          rows.every(
            (r) =>
              r.state === 'published' && r.published_at.toISOString() === published.publishedAt,
          ),
        ).toBe(true);
        // the append-only guard came back with the data
        await expect(
          ds.query(`UPDATE evaluation SET published_at = now() WHERE round_id = $1`, [roundId]),
        ).rejects.toThrow(/immutable/);

        const app = createApp({ ds, config: testConfig(), mailer: t.mailer, log: () => undefined });
        const agent = request.agent(app.app);
        const csrf = (await agent.get('/api/v1/auth/csrf-token').expect(200)).body.token as string;
        await agent
          .post('/api/v1/auth/sign-in')
          .set('x-csrf-token', csrf)
          .send({ email: 'coord@backup.test', password: TEST_PASSWORD })
          .expect(200);
        const round = await agent.get(`/api/v1/rounds/${roundId}`).expect(200);
        expect(round.body.state).toBe('published');
        const ev = await agent.get(`/api/v1/rounds/${roundId}/evaluation`).expect(200);
        expect(ev.body.state).toBe('published');
        expect(
          ev.body.results.map((r: { assignedValue: number }) => r.assignedValue).sort(),
        ).toEqual([...published.assigned].sort());
      } finally {
        await ds.destroy();
      }
    } finally {
      await fresh.drop();
    }
  });
});
