/**
 * Hints about likely blunders in a DLS result compared with the consensus (docs/DLS.md,
 * "Blunders worth detecting"). A hint is a question for the coordinator and the lab: it never
 * changes a value and never excludes a result.
 *
 * Tolerances (all "common practice", chosen by us, not from a standard):
 * - a factor f matches when the ratio r = x / x_pt satisfies |r/f − 1| ≤ FACTOR_TOLERANCE (10 %):
 *   wide enough for ordinary between-lab scatter (a few %), narrow enough to keep 0.5, 1, 2 and
 *   1000 apart;
 * - hints are only looked for when the result is not acceptable: |x − x_pt| > 2σ_pt when σ_pt
 *   is given, else |r − 1| > MIN_RELATIVE_DEVIATION (5 %);
 * - viscosity/temperature: the 20 °C-vs-25 °C water viscosity ratio 1.0016/0.8900 = 1.1254
 *   (IAPWS 2008 values in docs/DLS.md) within ±VISCOSITY_TOLERANCE (2.5 %, about 1 K), or a
 *   smaller bias of 2–10 % read as a temperature offset at ≈ 2.6 %/K (docs/DLS.md);
 * - dust/aggregates: PDI > max(DUST_PDI_MIN = 0.25, 2 × the consensus PDI) together with a
 *   size above the consensus by more than 5 %.
 */

export type BlunderCode =
  'radius-diameter' | 'unit-slip' | 'viscosity-temperature' | 'dust-aggregates';

export interface BlunderHint {
  readonly code: BlunderCode;
  /** Plain words for the coordinator and the lab. */
  readonly message: string;
  /** The factor x / x_pt that matched, if the hint is a factor. */
  readonly factor?: number;
}

export interface BlunderInput {
  /** The lab's result (e.g. Z-average), nm or the measurand's unit. */
  readonly result: number;
  /** Consensus or assigned value, same unit. */
  readonly assignedValue: number;
  /** σ_pt, same unit (optional: decides whether the result is unusual). */
  readonly sigmaPt?: number;
  /** The lab's PDI for the same item (dimensionless, 0–1), optional. */
  readonly pdi?: number;
  /** The consensus PDI of the item, optional. */
  readonly assignedPdi?: number;
  /** What the result is compared with, as the message names it (default "the assigned value"; the Lab bench compares with "the nominal size"). */
  readonly reference?: string;
}

export const FACTOR_TOLERANCE = 0.1;
export const MIN_RELATIVE_DEVIATION = 0.05;
/** η(20 °C)/η(25 °C) of water, IAPWS 2008 values 1.0016 / 0.8900 mPa s (docs/DLS.md). */
export const VISCOSITY_20_25_RATIO = 1.0016 / 0.89;
export const VISCOSITY_TOLERANCE = 0.025;
/** Size change per kelvin of unnoticed temperature offset near 25 °C (docs/DLS.md). */
export const SIZE_CHANGE_PER_KELVIN = 0.026;
export const DUST_PDI_MIN = 0.25;

const near = (r: number, f: number, tol: number) => Math.abs(r / f - 1) <= tol;

/**
 * Blunder hints for one result (see the file comment for the signatures and tolerances).
 * Returns an empty list when nothing looks like a known blunder or the inputs are unusable
 * (non-positive sizes, non-finite numbers).
 */
export function blunderHints(input: BlunderInput): BlunderHint[] {
  const { result: x, assignedValue: xpt, sigmaPt, pdi, assignedPdi } = input;
  const ref = input.reference ?? 'the assigned value';
  if (!Number.isFinite(x) || !Number.isFinite(xpt) || !(x > 0) || !(xpt > 0)) return [];
  const r = x / xpt;
  const isUnusual =
    sigmaPt !== undefined && sigmaPt > 0
      ? Math.abs(x - xpt) > 2 * sigmaPt
      : Math.abs(r - 1) > MIN_RELATIVE_DEVIATION;
  if (!isUnusual) return [];
  const hints: BlunderHint[] = [];
  const pct = (v: number) => `${(100 * v).toFixed(0)} %`;

  if (near(r, 0.5, FACTOR_TOLERANCE)) {
    hints.push({
      code: 'radius-diameter',
      factor: 0.5,
      message: `The result is about half ${ref}: was a radius reported instead of a diameter, or the decay rate of g2 − 1 (which is 2Γ) used as Γ?`,
    });
  } else if (near(r, 2, FACTOR_TOLERANCE)) {
    hints.push({
      code: 'radius-diameter',
      factor: 2,
      message: `The result is about twice ${ref}: was a diameter doubled, or a radius formula used for a diameter?`,
    });
  }
  if (near(r, 1000, FACTOR_TOLERANCE)) {
    hints.push({
      code: 'unit-slip',
      factor: 1000,
      message: `The result is about 1000 times ${ref}: was it entered in the wrong unit (e.g. pm or nm where µm/nm was asked)?`,
    });
  } else if (near(r, 0.001, FACTOR_TOLERANCE)) {
    hints.push({
      code: 'unit-slip',
      factor: 0.001,
      message: `The result is about 1/1000 of ${ref}: was it entered in µm instead of nm?`,
    });
  }
  if (
    near(r, VISCOSITY_20_25_RATIO, VISCOSITY_TOLERANCE) ||
    near(r, 1 / VISCOSITY_20_25_RATIO, VISCOSITY_TOLERANCE)
  ) {
    const high = r > 1;
    hints.push({
      code: 'viscosity-temperature',
      factor: high ? VISCOSITY_20_25_RATIO : 1 / VISCOSITY_20_25_RATIO,
      message: high
        ? `The result is about 12.5 % above ${ref}: was a sample at 20 °C analysed with the 25 °C water viscosity?`
        : `The result is about 11 % below ${ref}: was a sample at 25 °C analysed with the 20 °C water viscosity?`,
    });
  } else if (Math.abs(r - 1) >= 0.02 && Math.abs(r - 1) <= 0.1) {
    const kelvin = Math.log(r) / Math.log(1 + SIZE_CHANGE_PER_KELVIN);
    hints.push({
      code: 'viscosity-temperature',
      factor: r,
      message: `The result differs from ${ref} by ${pct(r - 1)}, as an unnoticed temperature offset of about ${Math.abs(
        kelvin,
      ).toFixed(
        1,
      )} K (or the matching viscosity error) would: check equilibration time, cell temperature and the dispersant viscosity entered.`,
    });
  }
  if (pdi !== undefined && Number.isFinite(pdi) && r > 1 + MIN_RELATIVE_DEVIATION) {
    const pdiLimit = Math.max(
      DUST_PDI_MIN,
      assignedPdi !== undefined && assignedPdi > 0 ? 2 * assignedPdi : 0,
    );
    if (pdi > pdiLimit) {
      hints.push({
        code: 'dust-aggregates',
        message: `Both size (${pct(r - 1)} above ${ref}) and PDI (${pdi.toFixed(
          2,
        )}) are high: dust or aggregates in the cell? Filter the dispersant, check the cuvette and repeat after mixing.`,
      });
    }
  }
  return hints;
}
