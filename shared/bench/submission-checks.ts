/**
 * Checks on a lab's results, run while the lab types (browser) and again on submit (server):
 * hard errors refuse the value; warnings flag it and need the lab's acknowledgement.
 * Pure functions, no I/O.
 */
import { waterViscosity } from '../dls/water';
import { mean } from '../stats/descriptive';
import { blunderHints } from '../stats/blunder-hints';

/** The parts of a round the checks need. */
export interface RoundRules {
  /** The measuring temperature the protocol asks for, °C. */
  readonly protocolTemperatureC: number;
  readonly items: readonly { id: string; code: string; nominalSizeNm: number | null }[];
  readonly measurands: readonly {
    id: string;
    key: string;
    name: string;
    unit: string;
    replicatesRequired: number;
  }[];
}

/** The results shape (shared/contracts/submission SubmissionData), loosely typed for partial drafts. */
export interface ResultsLike {
  readonly items: readonly {
    testItemId: string;
    results: readonly {
      measurandId: string;
      replicates: readonly (number | null)[];
      uncertainty?: unknown;
    }[];
    conditions?: {
      temperatureC?: number | null;
      viscosityMPas?: number | null;
      dispersant?: string;
    };
  }[];
  readonly acknowledgedWarnings?: readonly string[];
}

export interface BenchIssue {
  /** Path into the results, e.g. `items.0.results.1.replicates.2`. */
  readonly path: string;
  readonly code:
    | 'pdi-out-of-range'
    | 'diameter-not-positive'
    | 'missing-replicate'
    | 'missing-item'
    | 'unknown-item'
    | 'unknown-measurand';
  readonly message: string;
}

export type BenchWarningKind = 'temperature-far' | 'wide-spread' | 'viscosity-mismatch' | 'blunder';

export interface BenchWarning {
  /** Stable code the lab acknowledges, e.g. `wide-spread:<item id>:<measurand id>`. */
  readonly code: string;
  readonly kind: BenchWarningKind;
  readonly path: string;
  readonly message: string;
}

export interface CheckOutcome {
  readonly errors: BenchIssue[];
  readonly warnings: BenchWarning[];
  /** Warnings whose code is not in acknowledgedWarnings. */
  readonly unacknowledged: BenchWarning[];
}

/** |T − protocol| above this flags the temperature, K (common practice, project choice). */
export const TEMPERATURE_WARN_K = 1;
/** (max − min)/mean of diameter replicates above this flags the spread (common practice, project choice: 5 %). */
export const DIAMETER_SPREAD_WARN = 0.05;
/** max − min of PDI replicates above this flags the spread (common practice, project choice). */
export const PDI_SPREAD_WARN = 0.05;
/** |η − η_water(T)|/η_water(T) above this flags the viscosity (project choice: 2 %, about 1 K of water). */
export const VISCOSITY_WARN = 0.02;

/** True for a PDI measurand. */
export function isPdiMeasurand(m: { key: string }): boolean {
  return m.key === 'pdi';
}
/** True for a size measurand (Z-average, or any measurand in nm). */
export function isDiameterMeasurand(m: { key: string; unit: string }): boolean {
  return m.key === 'z_average' || m.unit === 'nm';
}

const looksLikeWater = (s: string | undefined) => /water|h2o|h₂o/i.test(s ?? 'water');
const finite = (xs: readonly (number | null)[]) =>
  xs.filter((x): x is number => typeof x === 'number' && Number.isFinite(x));

/**
 * Checks results against a round.
 * @param complete true on submit: every item × measurand needs its required replicates.
 */
export function checkResults(
  data: ResultsLike,
  round: RoundRules,
  complete: boolean,
): CheckOutcome {
  const errors: BenchIssue[] = [];
  const warnings: BenchWarning[] = [];
  const measurandById = new Map(round.measurands.map((m) => [m.id, m]));
  const itemById = new Map(round.items.map((i) => [i.id, i]));

  data.items.forEach((item, ii) => {
    const roundItem = itemById.get(item.testItemId);
    if (!roundItem) {
      errors.push({
        path: `items.${ii}.testItemId`,
        code: 'unknown-item',
        message: 'This test item is not part of the round.',
      });
      return;
    }
    let meanSize: number | undefined;
    let meanPdi: number | undefined;
    let sizeAt: { path: string; measurandId: string } | undefined;
    item.results.forEach((res, ri) => {
      const m = measurandById.get(res.measurandId);
      const base = `items.${ii}.results.${ri}`;
      if (!m) {
        errors.push({
          path: `${base}.measurandId`,
          code: 'unknown-measurand',
          message: 'This measurand is not part of the round.',
        });
        return;
      }
      const label = `${roundItem.code} ${m.name}`;
      res.replicates.forEach((v, vi) => {
        if (v === null || v === undefined) return;
        if (isPdiMeasurand(m) && !(v >= 0 && v <= 1)) {
          errors.push({
            path: `${base}.replicates.${vi}`,
            code: 'pdi-out-of-range',
            message: `${label}, replicate ${vi + 1}: PDI must be between 0 and 1.`,
          });
        } else if (isDiameterMeasurand(m) && !(v > 0)) {
          errors.push({
            path: `${base}.replicates.${vi}`,
            code: 'diameter-not-positive',
            message: `${label}, replicate ${vi + 1}: a diameter must be above 0 ${m.unit}.`,
          });
        }
      });
      if (complete) {
        for (let vi = 0; vi < m.replicatesRequired; vi++) {
          const v = res.replicates[vi];
          if (v === null || v === undefined) {
            errors.push({
              path: `${base}.replicates.${vi}`,
              code: 'missing-replicate',
              message: `${label}: replicate ${vi + 1} of ${m.replicatesRequired} is missing.`,
            });
          }
        }
      }
      const xs = finite(res.replicates);
      if (xs.length >= 2) {
        const lo = Math.min(...xs);
        const hi = Math.max(...xs);
        const mu = mean(xs);
        if (isPdiMeasurand(m) && hi - lo > PDI_SPREAD_WARN) {
          warnings.push({
            code: `wide-spread:${item.testItemId}:${m.id}`,
            kind: 'wide-spread',
            path: `${base}.replicates`,
            message: `${label}: the replicates differ by ${(hi - lo).toFixed(3)} (more than ${PDI_SPREAD_WARN}). Check for settling, dust or a drifting temperature.`,
          });
        } else if (isDiameterMeasurand(m) && mu > 0 && (hi - lo) / mu > DIAMETER_SPREAD_WARN) {
          warnings.push({
            code: `wide-spread:${item.testItemId}:${m.id}`,
            kind: 'wide-spread',
            path: `${base}.replicates`,
            message: `${label}: the replicates spread over ${((100 * (hi - lo)) / mu).toFixed(1)} % of their mean (more than ${100 * DIAMETER_SPREAD_WARN} %). Check for settling, dust or a drifting temperature.`,
          });
        }
      }
      if (xs.length > 0 && isPdiMeasurand(m)) meanPdi = mean(xs);
      if (xs.length > 0 && isDiameterMeasurand(m) && !isPdiMeasurand(m) && meanSize === undefined) {
        meanSize = mean(xs);
        sizeAt = { path: `${base}.replicates`, measurandId: m.id };
      }
    });
    if (complete) {
      for (const m of round.measurands) {
        if (!item.results.some((r) => r.measurandId === m.id)) {
          errors.push({
            path: `items.${ii}.results`,
            code: 'missing-replicate',
            message: `${roundItem.code} ${m.name}: no result given.`,
          });
        }
      }
    }

    const t = item.conditions?.temperatureC;
    if (
      typeof t === 'number' &&
      Number.isFinite(t) &&
      Math.abs(t - round.protocolTemperatureC) > TEMPERATURE_WARN_K
    ) {
      warnings.push({
        code: `temperature-far:${item.testItemId}`,
        kind: 'temperature-far',
        path: `items.${ii}.conditions.temperatureC`,
        message: `${roundItem.code}: measured at ${t} °C, the protocol asks for ${round.protocolTemperatureC} °C (more than ${TEMPERATURE_WARN_K} K apart).`,
      });
    }
    const eta = item.conditions?.viscosityMPas;
    if (
      typeof t === 'number' &&
      typeof eta === 'number' &&
      t >= 0 &&
      t <= 40 &&
      looksLikeWater(item.conditions?.dispersant)
    ) {
      const water = waterViscosity(t) * 1000; // Pa s → mPa s (IAPWS R12-08)
      if (Math.abs(eta - water) / water > VISCOSITY_WARN) {
        warnings.push({
          code: `viscosity-mismatch:${item.testItemId}`,
          kind: 'viscosity-mismatch',
          path: `items.${ii}.conditions.viscosityMPas`,
          message: `${roundItem.code}: viscosity ${eta} mPa·s does not match water at ${t} °C (${water.toFixed(4)} mPa·s, IAPWS): was the viscosity of another temperature used?`,
        });
      }
    }
    if (meanSize !== undefined && sizeAt && roundItem.nominalSizeNm) {
      // The nominal size is not a consensus: only the factor-like slips (radius for diameter, a unit
      // slip) and dust are worth a hint here; small offsets are left to the temperature/viscosity checks.
      const hints = blunderHints({
        result: meanSize,
        assignedValue: roundItem.nominalSizeNm,
        pdi: meanPdi,
        reference: 'the nominal size',
      }).filter((h) => h.code !== 'viscosity-temperature');
      for (const hint of hints) {
        warnings.push({
          code: `blunder-${hint.code}:${item.testItemId}:${sizeAt.measurandId}`,
          kind: 'blunder',
          path: sizeAt.path,
          message: `${roundItem.code} (nominal ${roundItem.nominalSizeNm} nm): ${hint.message}`,
        });
      }
    }
  });

  if (complete) {
    for (const ri of round.items) {
      if (!data.items.some((i) => i.testItemId === ri.id)) {
        errors.push({
          path: 'items',
          code: 'missing-item',
          message: `${ri.code}: no results given.`,
        });
      }
    }
  }
  const acked = new Set(data.acknowledgedWarnings ?? []);
  return { errors, warnings, unacknowledged: warnings.filter((w) => !acked.has(w.code)) };
}

/** What a missing or failed instrument check means for a submission (the lab explains it). */
export function instrumentCheckNotice(
  latest: { passed: boolean; instrument: string; checkedAt: string } | null,
): string | null {
  if (!latest)
    return 'No instrument check is recorded for your lab. Record one, or explain below why you submit without it.';
  if (!latest.passed)
    return `The latest instrument check (${latest.instrument}) failed. Explain below why you submit anyway.`;
  return null;
}
