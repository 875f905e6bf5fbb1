import { createHash, randomUUID } from 'node:crypto';
import { PostgresQueryRunner } from 'typeorm/driver/postgres/PostgresQueryRunner';
import { Invitation, Submission } from '../../../db/entities';
import { createTestDatabase, type TestDatabase } from '../../../db/testing';
import { createBenchRound, enrol } from '../testing/bench-fixtures';
import { createLab, testConfig } from '../testing/test-app';
import { listMyRounds } from './bench';
import type { AppContext } from './context';

jest.setTimeout(120_000);

/** GET /my/rounds reads a lab's rounds in a fixed number of queries (no query per enrolment). */
describe('listMyRounds: queries do not grow with the number of rounds', () => {
  let db: TestDatabase;
  let ctx: AppContext;

  beforeAll(async () => {
    db = await createTestDatabase();
    ctx = {
      ds: db.ds,
      config: testConfig(),
      mailer: { send: () => Promise.resolve(), close: () => undefined },
      log: () => undefined,
    };
  });
  afterAll(() => db.drop());

  /** A lab enrolled in `n` rounds (every other one with a submitted version) and invited to one more. */
  async function labWithRounds(n: number): Promise<string> {
    const labId = (await createLab(db.ds, `Lab of ${n} rounds ${randomUUID().slice(0, 6)}`)).id;
    for (let i = 0; i < n; i++) {
      const r = await createBenchRound(db.ds);
      const e = await enrol(db.ds, r.round.id, labId, `P${String(i + 1).padStart(3, '0')}`);
      if (i % 2 === 0)
        await db.ds.getRepository(Submission).save({
          enrolmentId: e.id,
          state: 'submitted',
          currentVersion: 1,
          submittedAt: new Date(),
        });
    }
    const invited = await createBenchRound(db.ds, { state: 'enrolling' });
    await db.ds.getRepository(Invitation).save({
      roundId: invited.round.id,
      organisationId: labId,
      email: 'lab@rounds.test',
      tokenHash: createHash('sha256').update(randomUUID()).digest('hex'),
      expiresAt: new Date(Date.now() + 86400_000),
    });
    // A draft round the lab is enrolled in stays hidden.
    const draft = await createBenchRound(db.ds, { state: 'draft' });
    await enrol(db.ds, draft.round.id, labId, 'P999');
    return labId;
  }

  async function countQueries<T>(fn: () => Promise<T>): Promise<{ result: T; queries: number }> {
    const spy = jest.spyOn(PostgresQueryRunner.prototype, 'query');
    try {
      const result = await fn();
      return { result, queries: spy.mock.calls.length };
    } finally {
      spy.mockRestore();
    }
  }

  it.each([1, 20])('%i enrolled rounds (+1 invitation): at most two queries', async (n) => {
    const labId = await labWithRounds(n);
    const { result, queries } = await countQueries(() => listMyRounds(ctx, labId));
    expect(queries).toBeGreaterThanOrEqual(1);
    expect(queries).toBeLessThanOrEqual(2);
    expect(result).toHaveLength(n + 1);
    expect(result.filter((r) => r.status === 'invited')).toHaveLength(1);
    expect(result.filter((r) => r.status === 'submitted')).toHaveLength(Math.ceil(n / 2));
    expect(result.filter((r) => r.submittedVersion === 1)).toHaveLength(Math.ceil(n / 2));
    expect(result.every((r) => r.state !== 'draft')).toBe(true);
    const enrolled = result.filter((r) => r.participantCode !== null);
    expect(enrolled.map((r) => r.participantCode).sort()).toEqual(
      Array.from({ length: n }, (_, i) => `P${String(i + 1).padStart(3, '0')}`),
    );
  });
});
