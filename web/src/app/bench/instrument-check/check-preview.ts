import {
  judgeInstrumentCheck,
  type InstrumentCheckSpec,
} from '@ringlet/shared/bench/instrument-check';

/** One replicate of the check as typed (empty boxes are null). */
export interface CheckRunValue {
  zAverageNm: number | null;
  pdi: number | null;
  temperatureC: number | null;
  equilibrationMin: number | null;
}

/** The form's values: the reference material's limits, the set point and the runs. */
export type CheckFormValue = Omit<InstrumentCheckSpec, 'runs'> & {
  runs: CheckRunValue[];
};

/** The verdict while typing: the runs with a Z-average and a PDI, judged; none before the first. */
export function checkPreview(v: CheckFormValue) {
  const runs = v.runs.filter((r) => r.zAverageNm !== null && r.pdi !== null);
  if (runs.length === 0) return null;
  return judgeInstrumentCheck({
    ...v,
    runs: runs.map((r) => ({
      zAverageNm: r.zAverageNm!,
      pdi: r.pdi!,
      temperatureC: r.temperatureC ?? NaN,
      equilibrationMin: r.equilibrationMin ?? NaN,
    })),
  });
}
