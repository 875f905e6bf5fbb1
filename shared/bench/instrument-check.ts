/**
 * Instrument check judgement: a lab measures a reference material (e.g. a nominal 92 nm
 * polystyrene latex) before measuring test items, and Ringlet judges the runs. Pure function, runs
 * in the browser (live verdict) and on the server (the record).
 */
import { mean } from '../stats/descriptive';

/** What the lab recorded (the shape of shared/contracts/bench InstrumentCheckInput). */
export interface InstrumentCheckSpec {
  /** Reference value of the material, nm. */
  readonly referenceValueNm: number;
  /** Allowed |mean − reference|, nm. */
  readonly toleranceNm: number;
  /** Highest PDI allowed for any run (dimensionless). */
  readonly pdiLimit: number;
  /** Temperature set point, °C, and the allowed deviation of each run, K. */
  readonly setPointC: number;
  readonly temperatureToleranceC: number;
  /** Shortest equilibration time a run needs, min. */
  readonly minEquilibrationMin: number;
  readonly runs: readonly {
    zAverageNm: number;
    pdi: number;
    temperatureC: number;
    equilibrationMin: number;
  }[];
}

export interface InstrumentCheckReason {
  readonly code:
    | 'too-few-runs'
    | 'mean-out-of-tolerance'
    | 'pdi-above-limit'
    | 'temperature-off-set-point'
    | 'equilibration-too-short';
  readonly message: string;
}

export interface InstrumentCheckVerdict {
  readonly passed: boolean;
  /** Mean Z-average of the runs, nm. */
  readonly meanZAverageNm: number;
  readonly meanPdi: number;
  readonly maxPdi: number;
  readonly reasons: InstrumentCheckReason[];
}

/** At least three runs (common practice, no published source). */
export const MIN_CHECK_RUNS = 3;

/**
 * Judges an instrument check. It passes when all hold:
 * - at least {@link MIN_CHECK_RUNS} runs;
 * - |mean Z-average − reference value| ≤ tolerance (nm);
 * - every run's PDI ≤ the PDI limit;
 * - every run's temperature within the set point ± its tolerance (°C);
 * - every run equilibrated for at least the minimum time (min).
 * Every failed criterion is listed, so the lab sees all of them at once.
 */
export function judgeInstrumentCheck(spec: InstrumentCheckSpec): InstrumentCheckVerdict {
  const runs = spec.runs;
  const reasons: InstrumentCheckReason[] = [];
  const sizes = runs.map((r) => r.zAverageNm);
  const pdis = runs.map((r) => r.pdi);
  const meanZ = sizes.length ? mean(sizes) : NaN;
  const meanPdi = pdis.length ? mean(pdis) : NaN;
  const maxPdi = pdis.length ? Math.max(...pdis) : NaN;
  const n = (v: number, d = 1) => v.toFixed(d);

  if (runs.length < MIN_CHECK_RUNS) {
    reasons.push({
      code: 'too-few-runs',
      message: `Record at least ${MIN_CHECK_RUNS} runs (${runs.length} given).`,
    });
  }
  if (runs.length > 0 && !(Math.abs(meanZ - spec.referenceValueNm) <= spec.toleranceNm)) {
    reasons.push({
      code: 'mean-out-of-tolerance',
      message: `Mean Z-average ${n(meanZ)} nm is ${n(Math.abs(meanZ - spec.referenceValueNm))} nm from the reference ${n(
        spec.referenceValueNm,
      )} nm (allowed ± ${n(spec.toleranceNm)} nm).`,
    });
  }
  const highPdi = runs.map((r, i) => ({ r, i })).filter(({ r }) => !(r.pdi <= spec.pdiLimit));
  if (highPdi.length) {
    reasons.push({
      code: 'pdi-above-limit',
      message: `PDI above the limit ${spec.pdiLimit} in replicate ${highPdi.map(({ i }) => i + 1).join(', ')} (highest ${n(maxPdi, 3)}).`,
    });
  }
  const offTemp = runs
    .map((r, i) => ({ r, i }))
    .filter(({ r }) => !(Math.abs(r.temperatureC - spec.setPointC) <= spec.temperatureToleranceC));
  if (offTemp.length) {
    reasons.push({
      code: 'temperature-off-set-point',
      message: `Temperature outside ${n(spec.setPointC)} ± ${spec.temperatureToleranceC} °C in replicate ${offTemp.map(({ i }) => i + 1).join(', ')}.`,
    });
  }
  const short = runs
    .map((r, i) => ({ r, i }))
    .filter(({ r }) => !(r.equilibrationMin >= spec.minEquilibrationMin));
  if (short.length) {
    reasons.push({
      code: 'equilibration-too-short',
      message: `Equilibration shorter than ${spec.minEquilibrationMin} min in replicate ${short.map(({ i }) => i + 1).join(', ')}.`,
    });
  }
  return { passed: reasons.length === 0, meanZAverageNm: meanZ, meanPdi, maxPdi, reasons };
}

/**
 * The form's starting values. They are placeholders: the lab replaces them with the values on its
 * own reference material's certificate and its own procedure (set point, equilibration).
 */
export const DEFAULT_CHECK = {
  material: '',
  referenceValueNm: 100,
  toleranceNm: 2,
  pdiLimit: 0.05,
  setPointC: 25,
  temperatureToleranceC: 0.5,
  minEquilibrationMin: 2,
} as const;
