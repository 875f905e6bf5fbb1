/**
 * A precision study (ISO 5725-2 round robin) as one pure function: the labs' submitted replicates
 * per level × measurand, the levels' accepted reference values and the coordinator's decisions →
 * the analysis answer of `GET /api/v1/rounds/{id}/precision` (shared/contracts/precision.ts).
 * The server answers with it; the browser runs the same code to recompute while the coordinator
 * decides which flagged cells or replicates to set aside.
 *
 * Sources (via shared/stats): ISO 5725-2:1994 §7.3 (Mandel h/k, Cochran, Grubbs), §7.4 (s_r, s_L,
 * s_R, r, R), §7.5 (level dependence); ISO 5725-4:1994 §5.5 (bias against a reference value).
 */
import type {
  PrecisionAnalysis,
  PrecisionCellFlag,
  PrecisionCellResult,
  PrecisionClassification,
  PrecisionExclusion,
  PrecisionFit,
  PrecisionGrubbs,
  PrecisionLevelResult,
  PrecisionMeasurandResult,
  PrecisionPending,
  PrecisionStudyInput,
} from '../contracts/precision';
import { precisionAnalysis, type GrubbsResult, type PrecisionResult } from '../stats/precision';
import { fitLevelDependence } from '../stats/precision-fit';
import { methodBias } from '../stats/precision-bias';

/** The standards the analysis follows (printed by the page and the reports). */
export const PRECISION_SOURCES: readonly string[] = [
  'ISO 5725-2:1994 (confirmed 2019), Accuracy (trueness and precision) of measurement methods and results — Part 2: Basic method for the determination of repeatability and reproducibility of a standard measurement method',
  'ISO 5725-4:1994 (confirmed 2020), Part 4: Basic methods for the determination of the trueness of a standard measurement method',
  'ISO 5725-6:1994, Part 6: Use in practice of accuracy values (r = 2.8·s_r, R = 2.8·s_R)',
];

const SEVERITY: Record<PrecisionClassification, number> = { accepted: 0, straggler: 1, outlier: 2 };

function targetKey(
  itemCode: string,
  measurandKey: string,
  participantCode: string,
  replicate: number | null,
): string {
  return JSON.stringify([itemCode, measurandKey, participantCode, replicate]);
}

/** The decisions in force: newest per target, withdrawn ones ignored; newest first. */
export function decisionsInForce(all: readonly PrecisionExclusion[]): PrecisionExclusion[] {
  const sorted = [...all]
    .filter((e) => e.withdrawnAt === null)
    .sort((a, b) => (a.at < b.at ? 1 : a.at > b.at ? -1 : a.id < b.id ? 1 : -1));
  const seen = new Set<string>();
  const out: PrecisionExclusion[] = [];
  for (const e of sorted) {
    const k = targetKey(e.itemCode, e.measurandKey, e.participantCode, e.replicate);
    if (seen.has(k)) continue;
    seen.add(k);
    out.push(e);
  }
  return out;
}

function grubbsOut(g: GrubbsResult | null): PrecisionGrubbs | null {
  return g
    ? {
        G: g.G,
        critical5: g.critical5,
        critical1: g.critical1,
        classification: g.classification,
        participantCodes: g.cellCodes,
      }
    : null;
}

function worse(a: PrecisionClassification, b: PrecisionClassification): PrecisionClassification {
  return SEVERITY[b] > SEVERITY[a] ? b : a;
}

interface LevelContext {
  itemCode: string;
  itemLabel: string;
  measurandKey: string;
  cells: PrecisionStudyInput['cells'];
  reference: PrecisionStudyInput['references'][number] | null;
  inForce: Map<string, PrecisionExclusion>;
}

function analyseLevel(ctx: LevelContext): {
  level: PrecisionLevelResult;
  pending: PrecisionPending[];
} {
  const { itemCode, measurandKey, inForce } = ctx;
  const confirmed = (code: string, replicate: number | null) =>
    inForce.get(targetKey(itemCode, measurandKey, code, replicate))?.decision === 'confirmed';

  const sortedCells = [...ctx.cells].sort((a, b) =>
    a.participantCode.localeCompare(b.participantCode, 'en', { numeric: true }),
  );
  const kept: Array<{ code: string; values: number[] }> = [];
  const cellRows = sortedCells.map((c) => {
    const cellExcluded = confirmed(c.participantCode, null);
    const replicates = c.values.map((value, i) => ({
      replicate: i + 1,
      value,
      excluded: cellExcluded || confirmed(c.participantCode, i + 1),
    }));
    const keptValues = replicates
      .filter((r) => !r.excluded && Number.isFinite(r.value))
      .map((r) => r.value);
    if (!cellExcluded && keptValues.length > 0)
      kept.push({ code: c.participantCode, values: keptValues });
    return { code: c.participantCode, replicates, cellExcluded, keptValues, all: c.values };
  });

  const warnings: string[] = [];
  let result: PrecisionResult | null = null;
  if (kept.length > 0) {
    try {
      result = precisionAnalysis(kept);
    } catch (e) {
      // Stored data the statistics cannot take (never expected: values are bounded on entry).
      warnings.push(`Not computed: ${e instanceof Error ? e.message : String(e)}`);
    }
  }
  if (kept.length === 0) warnings.push('No results kept at this level.');
  if (result) warnings.push(...result.warnings);
  const byCode = new Map(result?.cells.map((c) => [c.code, c]) ?? []);

  // Flags per cell from the tests and indicators.
  const flags = new Map<string, PrecisionCellFlag[]>();
  const flag = (code: string, f: PrecisionCellFlag) => {
    const list = flags.get(code) ?? [];
    if (!list.some((x) => x.test === f.test && x.classification === f.classification)) list.push(f);
    flags.set(code, list);
  };
  if (result) {
    const co = result.cochran;
    if (co && co.classification !== 'accepted')
      flag(co.cellCode, { test: 'cochran', classification: co.classification });
    const g = result.grubbs;
    const singles = [g.singleHigh, g.singleLow];
    for (const s of singles)
      if (s && s.classification !== 'accepted')
        flag(s.cellCodes[0], { test: 'grubbs-single', classification: s.classification });
    // ISO 5725-2 §7.3.4.3: the double test applies when the single test found nothing.
    if (singles.every((s) => !s || s.classification === 'accepted')) {
      for (const d of [g.doubleHigh, g.doubleLow])
        if (d && d.classification !== 'accepted')
          for (const code of d.cellCodes)
            flag(code, { test: 'grubbs-double', classification: d.classification });
    }
    const mh = result.mandel.h;
    const mk = result.mandel.k;
    for (const c of result.cells) {
      if (mh && c.h !== null && Math.abs(c.h) > mh.indicator5)
        flag(c.code, {
          test: 'mandel-h',
          classification: Math.abs(c.h) > mh.indicator1 ? 'outlier' : 'straggler',
        });
      if (mk && c.k !== null && c.k > mk.indicator5)
        flag(c.code, {
          test: 'mandel-k',
          classification: c.k > mk.indicator1 ? 'outlier' : 'straggler',
        });
    }
  }

  const pending: PrecisionPending[] = [];
  const cells: PrecisionCellResult[] = cellRows.map((row) => {
    const stat = byCode.get(row.code);
    const cellFlags = flags.get(row.code) ?? [];
    let classification: PrecisionClassification = 'accepted';
    for (const f of cellFlags)
      if (f.test !== 'mandel-h' && f.test !== 'mandel-k')
        classification = worse(classification, f.classification);
    let suspectReplicate: number | null = null;
    if (cellFlags.some((f) => f.test === 'cochran') && stat && row.keptValues.length >= 2) {
      let far = -1;
      for (const r of row.replicates) {
        if (r.excluded) continue;
        const d = Math.abs(r.value - stat.mean);
        if (d > far) {
          far = d;
          suspectReplicate = r.replicate;
        }
      }
    }
    for (const f of cellFlags) {
      if (f.test === 'mandel-h' || f.test === 'mandel-k') continue;
      const decided =
        inForce.has(targetKey(itemCode, measurandKey, row.code, null)) ||
        (suspectReplicate !== null &&
          inForce.has(targetKey(itemCode, measurandKey, row.code, suspectReplicate)));
      if (!decided)
        pending.push({
          itemCode,
          measurandKey,
          participantCode: row.code,
          test: f.test,
          classification: f.classification,
          suspectReplicate: f.test === 'cochran' ? suspectReplicate : null,
        });
    }
    const shown = row.cellExcluded ? row.all : row.keptValues;
    const shownMean = shown.length ? shown.reduce((a, v) => a + v, 0) / shown.length : null;
    let shownSd: number | null = null;
    if (shown.length >= 2 && shownMean !== null) {
      const ss = shown.reduce((a, v) => a + (v - shownMean) ** 2, 0);
      shownSd = Math.sqrt(ss / (shown.length - 1));
    }
    return {
      participantCode: row.code,
      replicates: row.replicates,
      excluded: row.cellExcluded,
      n: row.cellExcluded ? 0 : row.keptValues.length,
      mean: stat ? stat.mean : shownMean,
      sd: stat ? stat.sd : shownSd,
      h: stat ? stat.h : null,
      k: stat ? stat.k : null,
      flags: cellFlags,
      classification,
      suspectReplicate,
    };
  });

  const mean = result ? result.generalMean : null;
  const pct = (s: number | null) =>
    s === null || mean === null || mean === 0 ? null : (s / Math.abs(mean)) * 100;

  let bias: PrecisionLevelResult['bias'] = null;
  if (ctx.reference) {
    if (
      result &&
      result.sr !== null &&
      result.sR !== null &&
      mean !== null &&
      Number.isFinite(mean) &&
      Number.isFinite(result.sR)
    ) {
      const n = result.totalResults / result.p;
      const b = methodBias({
        mean,
        reference: ctx.reference.value,
        referenceU: ctx.reference.u,
        sr: result.sr,
        sR: result.sR,
        p: result.p,
        n,
      });
      bias = {
        referenceValue: ctx.reference.value,
        referenceU: ctx.reference.u,
        referenceSource: ctx.reference.source,
        ...b,
        n,
      };
    } else {
      warnings.push('A reference value is set but s_r and s_R are not available: no bias.');
    }
  }

  const level: PrecisionLevelResult = {
    itemCode,
    itemLabel: ctx.itemLabel,
    p: result?.p ?? 0,
    n: result?.totalResults ?? 0,
    pReported: ctx.cells.length,
    cells,
    mean,
    sr: result?.sr ?? null,
    sL: result?.sL ?? null,
    sR: result?.sR ?? null,
    r: result?.repeatabilityLimit ?? null,
    R: result?.reproducibilityLimit ?? null,
    srPercent: pct(result?.sr ?? null),
    sRPercent: pct(result?.sR ?? null),
    betweenMeanSquare: result?.betweenMeanSquare ?? null,
    nBar: result?.nBar ?? null,
    sLNegativeNote: result?.isSLTruncated
      ? 'The between-laboratory variance s_L² came out negative (s_d² < s_r²) and is set to 0 (ISO 5725-2 §7.4.5): s_R = s_r.'
      : null,
    cochran: result?.cochran
      ? {
          C: result.cochran.C,
          critical5: result.cochran.critical5,
          critical1: result.cochran.critical1,
          classification: result.cochran.classification,
          participantCode: result.cochran.cellCode,
          p: result.cochran.p,
          n: result.cochran.n,
        }
      : null,
    grubbs: {
      singleHigh: grubbsOut(result?.grubbs.singleHigh ?? null),
      singleLow: grubbsOut(result?.grubbs.singleLow ?? null),
      doubleHigh: grubbsOut(result?.grubbs.doubleHigh ?? null),
      doubleLow: grubbsOut(result?.grubbs.doubleLow ?? null),
    },
    mandel: { h: result?.mandel.h ?? null, k: result?.mandel.k ?? null },
    bias,
    warnings,
  };
  return { level, pending };
}

function fmt(v: number): string {
  return Number(v.toPrecision(4)).toString();
}

function equation(name: string, relation: string, p: Record<string, number>): string {
  switch (relation) {
    case 'constant':
      return `${name} = ${fmt(p.c)}`;
    case 'proportional':
      return `${name} = ${fmt(p.b)}·m`;
    case 'linear':
      return `${name} = ${fmt(p.a)} + ${fmt(p.b)}·m`;
    default:
      return `lg ${name} = ${fmt(p.c)} + ${fmt(p.d)}·lg m`;
  }
}

function fitOf(levels: PrecisionLevelResult[], statistic: 'sr' | 'sR'): PrecisionFit | null {
  const used = levels.filter(
    (l) =>
      l.mean !== null &&
      Number.isFinite(l.mean) &&
      l.mean > 0 &&
      Number.isFinite(l[statistic] ?? NaN) &&
      (l[statistic] ?? 0) > 0,
  );
  if (levels.length < 2) return null;
  const m = used.map((l) => l.mean!);
  const s = used.map((l) => l[statistic]!);
  const name = statistic === 'sr' ? 's_r' : 's_R';
  if (used.length === 0)
    return {
      statistic,
      itemCodes: [],
      m,
      s,
      candidates: [],
      chosen: null,
      note: `No level has ${name} > 0 with a positive mean.`,
    };
  const fit = fitLevelDependence(m, s);
  return {
    statistic,
    itemCodes: used.map((l) => l.itemCode),
    m,
    s,
    candidates: fit.candidates.map((c) => ({
      relation: c.relation,
      parameters: c.parameters,
      fitted: c.fitted,
      relativeResidualSd: c.relativeResidualSd,
      degreesOfFreedom: c.degreesOfFreedom,
      equation: equation(name, c.relation, c.parameters),
    })),
    chosen: fit.chosen,
    note:
      fit.note ??
      (used.length < levels.length
        ? `${levels.length - used.length} level(s) without ${name} > 0 left out of the fit.`
        : null),
  };
}

/**
 * The whole analysis of a precision study.
 *
 * Cells are sorted by participant code (numeric-aware); levels and measurands keep the input
 * order. A confirmed decision on a cell sets the whole cell aside, one on a replicate only that
 * value; rejected decisions keep the data (the flag counts as reviewed). Cells, references and
 * decisions naming an unknown level, measurand or lab are ignored.
 */
export function analysePrecisionStudy(input: PrecisionStudyInput): PrecisionAnalysis {
  const inForceList = decisionsInForce(input.exclusions);
  const inForce = new Map(
    inForceList.map((e) => [
      targetKey(e.itemCode, e.measurandKey, e.participantCode, e.replicate),
      e,
    ]),
  );
  const pending: PrecisionPending[] = [];
  const measurands: PrecisionMeasurandResult[] = input.measurands.map((m) => {
    const levels = input.levels.map((lv) => {
      const out = analyseLevel({
        itemCode: lv.itemCode,
        itemLabel: lv.label,
        measurandKey: m.key,
        cells: input.cells.filter(
          (c) => c.itemCode === lv.itemCode && c.measurandKey === m.key && c.values.length > 0,
        ),
        reference:
          input.references.find((r) => r.itemCode === lv.itemCode && r.measurandKey === m.key) ??
          null,
        inForce,
      });
      pending.push(...out.pending);
      return out.level;
    });
    return {
      key: m.key,
      label: m.label,
      unit: m.unit,
      decimals: m.decimals,
      replicatesRequired: m.replicatesRequired,
      levels,
      fit: { sr: fitOf(levels, 'sr'), sR: fitOf(levels, 'sR') },
    };
  });
  const participants = new Set(
    input.cells.filter((c) => c.values.length > 0).map((c) => c.participantCode),
  );
  return {
    round: input.round,
    decisionsOpen: input.decisionsOpen,
    design: {
      levels: input.levels.length,
      measurands: input.measurands.length,
      participants: participants.size,
    },
    measurands,
    exclusions: inForceList,
    pending,
    references: input.references,
    sources: [...PRECISION_SOURCES],
  };
}
