/**
 * The Consensus board. The codes-only part (groups and rows) is computed once when the
 * evaluation is stored and kept in evaluation.board; a request adds who is asking: the codes
 * of the viewer's own lab and the lab names the viewer may see (the coordinator on request;
 * an assessor only the labs that granted access; a lab none). The codes-only JSON text is
 * cached per evaluation id and computed_at (immutable content, so each API instance may keep
 * its own copy) to answer a 1,000-participant board in a few milliseconds.
 */
import { createHash } from 'node:crypto';
import { promisify } from 'node:util';
import { gzip } from 'node:zlib';
import type { EntityManager } from 'typeorm';
import { Enrolment, Evaluation, Organisation } from '../../../db/entities';
import type { BoardListEntry } from '../../../shared/contracts/evaluation';
import { hasAnyRole, labIds, type SessionUser } from '../auth/session-user';
import { notFound } from './errors';
import type { AppContext } from './context';
import { audit } from './audit';
import { grantedLabIds } from './grants';
import { storedBoard } from './stored-rules';

const CACHE_LIMIT = 32;
const bodyCache = new Map<string, Buffer>();

/** The newest evaluation a viewer may see, with the viewer's own codes (one hot read, raw SQL). */
interface Head {
  id: string;
  version: number;
  state: 'draft' | 'committed' | 'published';
  published_at: Date | null;
  computed_at: Date;
  round_code: string;
  round_title: string;
  own_codes: string[];
}

/** Least recently used first: a hit moves to the end, the first entry goes when full. */
function remember<V>(cache: Map<string, V>, key: string, value: V, limit: number): V {
  if (cache.size >= limit) cache.delete(cache.keys().next().value!);
  cache.set(key, value);
  return value;
}

function recall<V>(cache: Map<string, V>, key: string): V | undefined {
  const hit = cache.get(key);
  if (hit !== undefined) {
    cache.delete(key);
    cache.set(key, hit);
  }
  return hit;
}

async function bodyBytes(em: EntityManager, head: Head): Promise<Buffer> {
  const key = bodyKey(head);
  const hit = recall(bodyCache, key);
  if (hit !== undefined) return hit;
  const stored = await em.findOne(Evaluation, {
    select: { id: true, board: true },
    where: { id: head.id },
  });
  const b = storedBoard(stored?.board, `Evaluation version ${head.version}`);
  const text = Buffer.from(
    `"groups":${JSON.stringify(b.groups)},"rows":${JSON.stringify(b.rows)}}`,
  );
  return remember(bodyCache, key, text, CACHE_LIMIT);
}

const bodyKey = (head: Head) => `${head.id}/${head.computed_at.getTime()}`;

/**
 * One board answer as sent: the whole JSON text, and its gzip form made at the first request that
 * accepts it. The same viewer head over the same evaluation gives the same bytes, so they are kept
 * (keyed by the evaluation, its computed_at and a hash of the head) and a repeated request costs
 * no serialising, copying or compressing. Each head names who may see it (its own codes, the names
 * shown), so a kept answer is only ever sent to a viewer whose own head is identical.
 */
export interface BoardAnswer {
  readonly json: Buffer;
  gzip?: Promise<Buffer>;
}

const ANSWER_LIMIT = 32;
const answerCache = new Map<string, BoardAnswer>();

const gzipAsync = promisify(gzip);

/** The answer gzip-compressed, once, on libuv's thread pool (the event loop goes on serving). */
export function gzipOf(answer: BoardAnswer): Promise<Buffer> {
  return (answer.gzip ??= gzipAsync(answer.json));
}

/** Lab names by participant code in the round: every enrolled lab, or only these labs. */
async function labNamesByCode(
  em: EntityManager,
  roundId: string,
  organisationIds?: string[],
): Promise<Record<string, string>> {
  const qb = em
    .createQueryBuilder(Enrolment, 'e')
    .innerJoinAndMapOne('e.lab', Organisation, 'o', 'o.id = e.organisationId')
    .where('e.roundId = :roundId', { roundId });
  if (organisationIds)
    qb.andWhere('e.organisationId IN (:...organisationIds)', { organisationIds });
  const enrolled = (await qb.getMany()) as (Enrolment & { lab: Organisation })[];
  const names: Record<string, string> = {};
  for (const e of enrolled) names[e.participantCode] = e.lab.name;
  return names;
}

type Viewer = 'coordinator' | 'lab' | 'assessor';

function viewerOf(user: SessionUser): Viewer {
  if (hasAnyRole(user, ['coordinator', 'admin'])) return 'coordinator';
  if (user.roles.includes('lab')) return 'lab';
  return 'assessor';
}

/**
 * GET /rounds/{id}/board as JSON bytes: the per-request head and the cached codes-only body. Coordinators see the newest evaluation (draft included);
 * labs and assessors the newest published one, and only for a round their lab (or a lab that
 * granted them access) took part in: otherwise 404.
 */
export async function boardJson(
  ctx: AppContext,
  user: SessionUser,
  roundId: string,
  revealNames: boolean,
): Promise<BoardAnswer> {
  const em = ctx.ds.manager;
  const viewer = viewerOf(user);
  let ownCodes: string[] = [];
  let labNames: Record<string, string> = {};
  const ownLabs =
    viewer === 'lab' || (viewer === 'assessor' && user.roles.includes('lab')) ? labIds(user) : [];
  if (viewer === 'assessor') {
    const granted = await grantedLabIds(em, user.id);
    if (granted.length) labNames = await labNamesByCode(em, roundId, granted);
  }

  // One round trip: the newest visible evaluation and the viewer's own participant codes.
  const heads: Head[] = await em.query(
    `SELECT e.id, e.version, e.state, e.published_at, e.computed_at, r.code AS round_code, r.title AS round_title,
            ARRAY(SELECT en.participant_code FROM enrolment en WHERE en.round_id = r.id AND en.organisation_id = ANY($2::uuid[])) AS own_codes
       FROM evaluation e JOIN round r ON r.id = e.round_id
      WHERE e.round_id = $1 ${viewer === 'coordinator' ? '' : `AND e.state = 'published'`}
      ORDER BY e.version DESC LIMIT 1`,
    [roundId, ownLabs],
  );
  const head = heads[0];
  if (head) ownCodes = head.own_codes;
  // A lab sees only rounds it took part in; an assessor only rounds of labs that granted access.
  if (viewer === 'lab' && ownCodes.length === 0) throw notFound('The board');
  if (viewer === 'assessor' && Object.keys(labNames).length === 0 && ownCodes.length === 0)
    throw notFound('The board');
  if (!head) throw notFound('The board');

  if (viewer === 'coordinator' && revealNames) {
    labNames = await labNamesByCode(em, roundId);
    await audit(em, user.id, 'board.names-revealed', 'round', roundId, {
      evaluationId: head.id,
      version: head.version,
      labs: Object.keys(labNames).length,
    });
  }
  const prefix =
    `{"roundId":${JSON.stringify(roundId)},"roundCode":${JSON.stringify(head.round_code)},"roundTitle":${JSON.stringify(head.round_title)},` +
    `"evaluationId":"${head.id}","version":${head.version},"state":"${head.state}",` +
    `"publishedAt":${head.published_at ? `"${head.published_at.toISOString()}"` : 'null'},` +
    `"ownCodes":${JSON.stringify(ownCodes)},"labNames":${JSON.stringify(labNames)},"canRevealNames":${viewer === 'coordinator'},`;
  const key = `${bodyKey(head)}/${createHash('sha256').update(prefix).digest('base64')}`;
  const kept = recall(answerCache, key);
  if (kept) return kept;
  const json = Buffer.concat([Buffer.from(prefix), await bodyBytes(em, head)]);
  return remember(answerCache, key, { json }, ANSWER_LIMIT);
}

/** A round with its newest visible evaluation and signal counts (lateral joins, raw SQL). */
interface BoardListRow {
  id: string;
  code: string;
  title: string;
  state: string;
  ev_state: BoardListEntry['evaluationState'];
  version: number | null;
  published_at: Date | null;
  acceptable: number | null;
  warning: number | null;
  action: number | null;
}

function boardListEntry(r: BoardListRow): BoardListEntry {
  return {
    roundId: r.id,
    roundCode: r.code,
    roundTitle: r.title,
    roundState: r.state,
    evaluationState: r.ev_state ?? null,
    version: r.version ?? null,
    publishedAt: r.published_at?.toISOString() ?? null,
    acceptable: r.acceptable ?? 0,
    warning: r.warning ?? 0,
    action: r.action ?? 0,
  };
}

/** GET /boards: the rounds whose board the user may open. */
/** PT rounds only: a precision study has no scores, so no board (its page is the study page). */
export async function listBoards(ctx: AppContext, user: SessionUser): Promise<BoardListEntry[]> {
  const viewer = viewerOf(user);
  const params: unknown[] = [];
  let where: string;
  if (viewer === 'coordinator') {
    where = `r.state IN ('closed', 'evaluated', 'published', 'reissued')`;
  } else {
    const labs =
      viewer === 'lab'
        ? labIds(user)
        : [...labIds(user), ...(await grantedLabIds(ctx.ds.manager, user.id))];
    params.push(labs);
    where = `e.state = 'published' AND EXISTS (SELECT 1 FROM enrolment en WHERE en.round_id = r.id AND en.organisation_id = ANY($1))`;
  }
  const rows: BoardListRow[] = await ctx.ds.query(
    `SELECT r.id, r.code, r.title, r.state, e.state AS ev_state, e.version, e.published_at,
              c.acceptable::int AS acceptable, c.warning::int AS warning, c.action::int AS action
         FROM round r
         LEFT JOIN LATERAL (
           SELECT * FROM evaluation x WHERE x.round_id = r.id ${viewer === 'coordinator' ? '' : `AND x.state = 'published'`}
           ORDER BY x.version DESC LIMIT 1) e ON true
         LEFT JOIN LATERAL (
           SELECT count(*) FILTER (WHERE p->>'signal' = 'acceptable') AS acceptable,
                  count(*) FILTER (WHERE p->>'signal' = 'warning') AS warning,
                  count(*) FILTER (WHERE p->>'signal' = 'action') AS action
             FROM evaluation_result er CROSS JOIN LATERAL jsonb_array_elements(er.participants) p
            WHERE er.evaluation_id = e.id) c ON true
        WHERE r.kind = 'pt' AND ${where}
        ORDER BY r.created_at DESC LIMIT 500`,
    params,
  );
  return rows.map(boardListEntry);
}
