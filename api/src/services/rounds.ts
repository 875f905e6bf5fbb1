import type { EntityManager } from 'typeorm';
import {
  HomogeneityStudy,
  Measurand,
  Round,
  RoundTransition,
  Scheme,
  TestItem,
  User,
} from '../../../db/entities';
import {
  isDescriptionOpen,
  isDesignOpen,
  isFeeOpen,
  MeasurandInput,
  type Measurand as MeasurandDto,
  type MeasurandUpdate,
  type RoundCreate,
  type RoundDetail,
  type RoundSummary,
  type RoundUpdate,
  type Scheme as SchemeDto,
  type SchemeCreate,
  type TestItem as TestItemDto,
  type TestItemInput,
  type TestItemUpdate,
} from '../../../shared/contracts/rounds';
import type { RoundState } from '../../../shared/contracts/round-states';
import { withSafetyBlock } from '../../../shared/contracts/safety';
import type * as z from 'zod';
import type { SessionUser } from '../auth/session-user';
import { conflict, notFound, ruleBroken } from './errors';
import { audit } from './audit';
import type { AppContext } from './context';
import { hasOpenHomogeneityFailure, lockRound } from './round-lifecycle';
import { assertSigmaSource } from './precision';
import { measurandRules, storedDefaultMeasurands } from './stored-rules';

type Out<T extends z.ZodType> = z.output<T>;

function schemeDto(s: Scheme): SchemeDto {
  return {
    id: s.id,
    code: s.code,
    name: s.name,
    description: s.description,
    rules: s.rules,
    defaultMeasurands: storedDefaultMeasurands(s.defaultMeasurands, `Scheme ${s.code}`),
    createdAt: s.createdAt.toISOString(),
  };
}

export async function listSchemes(ctx: AppContext): Promise<SchemeDto[]> {
  const rows = await ctx.ds.getRepository(Scheme).find({ order: { code: 'ASC' } });
  return rows.map(schemeDto);
}

export async function createScheme(
  ctx: AppContext,
  actor: SessionUser,
  input: Out<typeof SchemeCreate>,
): Promise<SchemeDto> {
  return ctx.ds.transaction(async (em) => {
    if (await em.findOne(Scheme, { where: { code: input.code } })) {
      throw conflict('code_taken', `code: a scheme with the code ${input.code} already exists.`);
    }
    const s = await em.save(
      Scheme,
      em.create(Scheme, { ...input, defaultMeasurands: [...input.defaultMeasurands] }),
    );
    await audit(em, actor.id, 'scheme.created', 'scheme', s.id, { code: s.code });
    return schemeDto(s);
  });
}

function itemDto(i: TestItem): TestItemDto {
  return {
    id: i.id,
    roundId: i.roundId,
    code: i.code,
    material: i.material,
    nominalSizeNm: i.nominalSizeNm,
    storageNotes: i.storageNotes,
    handlingNotes: i.handlingNotes,
    position: i.position,
  };
}

function measurandDto(m: Measurand): MeasurandDto {
  return {
    id: m.id,
    roundId: m.roundId,
    key: m.key,
    name: m.name,
    unit: m.unit,
    decimals: m.decimals,
    replicatesRequired: m.replicatesRequired,
    ...measurandRules(m),
    minParticipants: m.minParticipants,
    position: m.position,
  };
}

const SUMMARY_SQL = `
  SELECT r.id, r.scheme_id, s.code AS scheme_code, r.code, r.title, r.kind, r.state,
         r.enrolment_closes_on::text AS enrolment_closes_on, r.dispatch_on::text AS dispatch_on,
         r.results_due_at, r.fee_minor, r.currency, r.created_at,
         (SELECT count(*)::int FROM test_item t WHERE t.round_id = r.id) AS item_count,
         (SELECT count(*)::int FROM enrolment e WHERE e.round_id = r.id AND e.state = 'enrolled') AS enrolled_count
  FROM round r JOIN scheme s ON s.id = r.scheme_id`;

interface SummaryRow {
  id: string;
  scheme_id: string;
  scheme_code: string;
  code: string;
  title: string;
  kind: 'pt' | 'precision';
  state: RoundState;
  enrolment_closes_on: string | null;
  dispatch_on: string | null;
  results_due_at: Date | null;
  fee_minor: number;
  currency: string;
  created_at: Date;
  item_count: number;
  enrolled_count: number;
}

function summaryDto(r: SummaryRow): RoundSummary {
  return {
    id: r.id,
    schemeId: r.scheme_id,
    schemeCode: r.scheme_code,
    code: r.code,
    title: r.title,
    kind: r.kind,
    state: r.state,
    enrolmentClosesOn: r.enrolment_closes_on,
    dispatchOn: r.dispatch_on,
    resultsDueAt: r.results_due_at ? new Date(r.results_due_at).toISOString() : null,
    feeMinor: r.fee_minor,
    currency: r.currency,
    itemCount: r.item_count,
    enrolledCount: r.enrolled_count,
    createdAt: new Date(r.created_at).toISOString(),
  };
}

export async function listRounds(ctx: AppContext): Promise<RoundSummary[]> {
  const rows: SummaryRow[] = await ctx.ds.query(`${SUMMARY_SQL} ORDER BY r.created_at DESC`);
  return rows.map(summaryDto);
}

/** The round with its items, measurands and transition history. */
export async function getRoundDetail(em: EntityManager, id: string): Promise<RoundDetail> {
  const rows: SummaryRow[] = await em.query(`${SUMMARY_SQL} WHERE r.id = $1`, [id]);
  const row = rows[0];
  if (!row) throw notFound('The round');
  const round = await em.findOneOrFail(Round, { where: { id } });
  const items = await em.find(TestItem, {
    where: { roundId: id },
    order: { position: 'ASC', code: 'ASC' },
  });
  const measurands = await em.find(Measurand, {
    where: { roundId: id },
    order: { position: 'ASC', key: 'ASC' },
  });
  const transitions = await em.find(RoundTransition, {
    where: { roundId: id },
    order: { at: 'ASC' },
  });
  const actorIds = [...new Set(transitions.map((t) => t.actorId).filter((x): x is string => !!x))];
  const actors = actorIds.length
    ? await em
        .getRepository(User)
        .createQueryBuilder('u')
        .where('u.id IN (:...ids)', { ids: actorIds })
        .getMany()
    : [];
  const names = new Map(actors.map((u) => [u.id, u.name]));
  return {
    ...summaryDto(row),
    instructions: withSafetyBlock(round.instructions),
    protocolTemperatureC: round.protocolTemperatureC,
    items: items.map(itemDto),
    measurands: measurands.map(measurandDto),
    transitions: transitions.map((t) => ({
      fromState: t.fromState,
      toState: t.toState,
      actorName: t.actorId ? (names.get(t.actorId) ?? null) : null,
      reason: t.reason,
      forced: t.forced,
      at: t.at.toISOString(),
    })),
    hasOpenHomogeneityFailure: await hasOpenHomogeneityFailure(em, id),
  };
}

async function insertItems(
  em: EntityManager,
  roundId: string,
  items: Out<typeof TestItemInput>[],
): Promise<void> {
  const existing = await em.find(TestItem, { where: { roundId } });
  const codes = new Set(existing.map((i) => i.code.toLowerCase()));
  let position = existing.reduce((p, i) => Math.max(p, i.position + 1), 0);
  for (const [n, item] of items.entries()) {
    if (codes.has(item.code.toLowerCase())) {
      throw conflict(
        'item_code_taken',
        `items.${n}.code: the round already has a test item ${item.code}.`,
      );
    }
    codes.add(item.code.toLowerCase());
    await em.insert(TestItem, { ...item, roundId, position: position++ });
  }
}

async function insertMeasurands(
  em: EntityManager,
  roundId: string,
  measurands: Out<typeof MeasurandInput>[],
): Promise<void> {
  const existing = await em.find(Measurand, { where: { roundId } });
  const keys = new Set(existing.map((m) => m.key));
  let position = existing.reduce((p, m) => Math.max(p, m.position + 1), 0);
  for (const [n, m] of measurands.entries()) {
    if (keys.has(m.key))
      throw conflict(
        'measurand_key_taken',
        `measurands.${n}.key: the round already measures ${m.key}.`,
      );
    keys.add(m.key);
    await assertSigmaSource(em, roundId, m.sigmaPtRule, `measurands.${n}.sigmaPtRule.study`);
    await em.save(
      Measurand,
      em.create(Measurand, {
        ...m,
        sigmaPtRule: { ...m.sigmaPtRule },
        assignedValueRule: { ...m.assignedValueRule },
        roundId,
        position: position++,
      }),
    );
  }
}

export async function createRound(
  ctx: AppContext,
  actor: SessionUser,
  input: Out<typeof RoundCreate>,
): Promise<RoundDetail> {
  return ctx.ds.transaction(async (em) => {
    const scheme = await em.findOne(Scheme, { where: { id: input.schemeId } });
    if (!scheme) throw ruleBroken('scheme_unknown', 'schemeId: that scheme does not exist.');
    if (await em.findOne(Round, { where: { code: input.code } })) {
      throw conflict('code_taken', `code: a round with the code ${input.code} already exists.`);
    }
    const { items, useSchemeMeasurands, resultsDueAt, ...fields } = input;
    const round = await em.save(
      Round,
      em.create(Round, {
        ...fields,
        instructions: withSafetyBlock(fields.instructions),
        resultsDueAt: resultsDueAt ? new Date(resultsDueAt) : null,
        state: 'draft',
      }),
    );
    await insertItems(em, round.id, items);
    if (useSchemeMeasurands) {
      // Parsed again so a scheme stored before a contract change still gets its defaults filled in.
      const defaults = (scheme.defaultMeasurands ?? []).map((m) => MeasurandInput.parse(m));
      await insertMeasurands(em, round.id, defaults);
    }
    await audit(em, actor.id, 'round.created', 'round', round.id, {
      code: round.code,
      schemeId: scheme.id,
      items: items.length,
    });
    return getRoundDetail(em, round.id);
  });
}

export async function updateRound(
  ctx: AppContext,
  actor: SessionUser,
  id: string,
  patch: Out<typeof RoundUpdate>,
): Promise<RoundDetail> {
  return ctx.ds.transaction(async (em) => {
    const round = await lockRound(em, id);
    if (!isDescriptionOpen(round.state)) {
      throw conflict('round_locked', 'A published round does not change in place; reissue it.');
    }
    if (
      patch.feeMinor !== undefined &&
      patch.feeMinor !== round.feeMinor &&
      !isFeeOpen(round.state)
    ) {
      throw conflict(
        'fee_locked',
        'feeMinor: the participation fee is fixed once enrolment has opened.',
      );
    }
    const next = {
      enrolmentClosesOn:
        patch.enrolmentClosesOn !== undefined ? patch.enrolmentClosesOn : round.enrolmentClosesOn,
      dispatchOn: patch.dispatchOn !== undefined ? patch.dispatchOn : round.dispatchOn,
      resultsDueAt:
        patch.resultsDueAt !== undefined
          ? patch.resultsDueAt
          : (round.resultsDueAt?.toISOString() ?? null),
    };
    if (next.enrolmentClosesOn && next.dispatchOn && next.dispatchOn < next.enrolmentClosesOn) {
      throw ruleBroken(
        'dates_out_of_order',
        'dispatchOn: dispatch cannot come before enrolment closes.',
      );
    }
    if (next.dispatchOn && next.resultsDueAt && next.resultsDueAt.slice(0, 10) < next.dispatchOn) {
      throw ruleBroken(
        'dates_out_of_order',
        'resultsDueAt: results cannot be due before dispatch.',
      );
    }
    const { resultsDueAt, ...rest } = patch;
    await em.update(
      Round,
      { id },
      {
        ...rest,
        // the basic cautions cannot be removed: the coordinator's text follows them
        ...(rest.instructions !== undefined
          ? { instructions: withSafetyBlock(rest.instructions) }
          : {}),
        ...(resultsDueAt !== undefined
          ? { resultsDueAt: resultsDueAt ? new Date(resultsDueAt) : null }
          : {}),
      },
    );
    await audit(em, actor.id, 'round.updated', 'round', id, { ...patch });
    return getRoundDetail(em, id);
  });
}

async function lockDesignable(em: EntityManager, id: string): Promise<Round> {
  const round = await lockRound(em, id);
  if (!isDesignOpen(round.state)) {
    throw conflict(
      'round_not_editable',
      'Test items and measurands change only while the round is a draft or enrolling.',
    );
  }
  return round;
}

export async function addItems(
  ctx: AppContext,
  actor: SessionUser,
  roundId: string,
  items: Out<typeof TestItemInput>[],
): Promise<TestItemDto[]> {
  return ctx.ds.transaction(async (em) => {
    await lockDesignable(em, roundId);
    await insertItems(em, roundId, items);
    await audit(em, actor.id, 'round.items-added', 'round', roundId, {
      codes: items.map((i) => i.code),
    });
    return (await em.find(TestItem, { where: { roundId }, order: { position: 'ASC' } })).map(
      itemDto,
    );
  });
}

export async function addMeasurands(
  ctx: AppContext,
  actor: SessionUser,
  roundId: string,
  measurands: Out<typeof MeasurandInput>[],
): Promise<MeasurandDto[]> {
  return ctx.ds.transaction(async (em) => {
    await lockDesignable(em, roundId);
    await insertMeasurands(em, roundId, measurands);
    await audit(em, actor.id, 'round.measurands-added', 'round', roundId, {
      keys: measurands.map((m) => m.key),
    });
    return (await em.find(Measurand, { where: { roundId }, order: { position: 'ASC' } })).map(
      measurandDto,
    );
  });
}

/**
 * Changes one test item (draft or enrolling). The code stays unique within the round
 * (case-insensitive, as when adding).
 */
export async function updateItem(
  ctx: AppContext,
  actor: SessionUser,
  roundId: string,
  itemId: string,
  patch: Out<typeof TestItemUpdate>,
): Promise<TestItemDto> {
  return ctx.ds.transaction(async (em) => {
    await lockDesignable(em, roundId);
    const item = await em.findOne(TestItem, { where: { id: itemId, roundId } });
    if (!item) throw notFound('The test item');
    if (patch.code !== undefined && patch.code.toLowerCase() !== item.code.toLowerCase()) {
      const others = await em.find(TestItem, { where: { roundId } });
      if (
        others.some((o) => o.id !== itemId && o.code.toLowerCase() === patch.code!.toLowerCase())
      ) {
        throw conflict('item_code_taken', `code: the round already has a test item ${patch.code}.`);
      }
    }
    await em.update(TestItem, { id: itemId }, patch);
    await audit(em, actor.id, 'round.item-updated', 'round', roundId, {
      itemId,
      code: item.code,
      changes: { ...patch },
    });
    return itemDto(await em.findOneOrFail(TestItem, { where: { id: itemId } }));
  });
}

/**
 * Removes one test item (draft or enrolling). Refused while homogeneity/stability checks are
 * recorded for it (they are evidence), and for the last item of an enrolling round (labs were
 * invited to measure something).
 */
export async function deleteItem(
  ctx: AppContext,
  actor: SessionUser,
  roundId: string,
  itemId: string,
): Promise<void> {
  await ctx.ds.transaction(async (em) => {
    const round = await lockDesignable(em, roundId);
    const item = await em.findOne(TestItem, { where: { id: itemId, roundId } });
    if (!item) throw notFound('The test item');
    if (await em.count(HomogeneityStudy, { where: { testItemId: itemId } })) {
      throw conflict(
        'item_has_checks',
        `Item ${item.code} has homogeneity or stability studies recorded; it cannot be removed.`,
      );
    }
    if (round.state === 'enrolling' && (await em.count(TestItem, { where: { roundId } })) === 1) {
      throw ruleBroken('round_incomplete', 'An enrolling round keeps at least one test item.');
    }
    await em.delete(TestItem, { id: itemId });
    await audit(em, actor.id, 'round.item-removed', 'round', roundId, { itemId, code: item.code });
  });
}

/** Changes one measurand (draft or enrolling); a σ_pt or assigned-value rule is replaced whole. */
export async function updateMeasurand(
  ctx: AppContext,
  actor: SessionUser,
  roundId: string,
  measurandId: string,
  patch: Out<typeof MeasurandUpdate>,
): Promise<MeasurandDto> {
  return ctx.ds.transaction(async (em) => {
    await lockDesignable(em, roundId);
    const m = await em.findOne(Measurand, { where: { id: measurandId, roundId } });
    if (!m) throw notFound('The measurand');
    if (
      patch.key !== undefined &&
      patch.key !== m.key &&
      (await em.count(Measurand, { where: { roundId, key: patch.key } }))
    ) {
      throw conflict('measurand_key_taken', `key: the round already measures ${patch.key}.`);
    }
    const { sigmaPtRule, assignedValueRule, ...rest } = patch;
    const key = m.key;
    Object.assign(m, rest);
    if (sigmaPtRule) await assertSigmaSource(em, roundId, sigmaPtRule, 'sigmaPtRule.study');
    if (sigmaPtRule) m.sigmaPtRule = { ...sigmaPtRule };
    if (assignedValueRule) m.assignedValueRule = { ...assignedValueRule };
    const saved = await em.save(Measurand, m);
    await audit(em, actor.id, 'round.measurand-updated', 'round', roundId, {
      measurandId,
      key,
      changes: { ...patch },
    });
    return measurandDto(saved);
  });
}

/** Removes one measurand (draft or enrolling), with the same guards as removing a test item. */
export async function deleteMeasurand(
  ctx: AppContext,
  actor: SessionUser,
  roundId: string,
  measurandId: string,
): Promise<void> {
  await ctx.ds.transaction(async (em) => {
    const round = await lockDesignable(em, roundId);
    const m = await em.findOne(Measurand, { where: { id: measurandId, roundId } });
    if (!m) throw notFound('The measurand');
    if (await em.count(HomogeneityStudy, { where: { measurandId } })) {
      throw conflict(
        'measurand_has_checks',
        `${m.name} has homogeneity or stability studies recorded; it cannot be removed.`,
      );
    }
    if (round.state === 'enrolling' && (await em.count(Measurand, { where: { roundId } })) === 1) {
      throw ruleBroken('round_incomplete', 'An enrolling round keeps at least one measurand.');
    }
    await em.delete(Measurand, { id: measurandId });
    await audit(em, actor.id, 'round.measurand-removed', 'round', roundId, {
      measurandId,
      key: m.key,
    });
  });
}
