/** Turns a precision study's results into the shared chart builders' inputs, with table views. */
import type {
  PrecisionLevelResult,
  PrecisionMeasurandResult,
} from '@ringlet/shared/contracts/precision';
import {
  classifyMandel,
  levelDependenceOption,
  levelDependenceText,
  mandelOption,
  mandelText,
  PRECISION_CLASS_WORDS,
  type FittedCurve,
  type LevelPoint,
} from '@ringlet/shared/charts/precision-level-charts';
import type { PanelChart } from '../board/chart-panel';
import { curveOf, mandelBars } from './precision-view';

export type PrecisionChart = PanelChart;

/** Mandel's h and k of one level, each with its text alternative and table. */
export function mandelCharts(
  level: PrecisionLevelResult,
  measurand: PrecisionMeasurandResult,
): PrecisionChart[] {
  const title = `${level.itemLabel} · ${measurand.label}`;
  return (['h', 'k'] as const).map((statistic) => {
    const bars = mandelBars(level, statistic);
    const lines = level.mandel[statistic];
    const caption = `${title}: Mandel's ${statistic}`;
    return {
      name: `mandel-${statistic}-${level.itemCode}-${measurand.key}`,
      caption,
      option: mandelOption(statistic, bars, lines, `Mandel's ${statistic} · ${level.itemCode}`),
      text: mandelText(statistic, bars, lines, title),
      table: {
        columns: ['Participant code', statistic, 'Class'],
        rows: bars.map((b) => [
          b.code,
          b.value === null ? '—' : Number(b.value.toFixed(3)),
          b.value === null ? '—' : PRECISION_CLASS_WORDS[classifyMandel(statistic, b.value, lines)],
        ]),
      },
    };
  });
}

/** The chosen relation of a fit as a drawable curve, or null. */
function chosenCurve(fit: PrecisionMeasurandResult['fit']['sr']): FittedCurve | null {
  const c = fit?.candidates.find((x) => x.relation === fit.chosen);
  return c ? curveOf(c) : null;
}

/** s_r and s_R against the level mean with the chosen relations (ISO 5725-2 §7.5). */
export function levelDependenceChart(measurand: PrecisionMeasurandResult): PrecisionChart | null {
  const points: LevelPoint[] = measurand.levels
    .filter((l) => l.mean !== null)
    .map((l) => ({ label: l.itemLabel, m: l.mean!, sr: l.sr, sR: l.sR }));
  if (points.length < 2) return null;
  const fits = { sr: chosenCurve(measurand.fit.sr), sR: chosenCurve(measurand.fit.sR) };
  const caption = `${measurand.label}: s_r and s_R against the level`;
  const d = measurand.decimals + 2;
  return {
    name: `level-dependence-${measurand.key}`,
    caption,
    option: levelDependenceOption(points, fits, measurand.unit, 's_r and s_R against the level'),
    text: levelDependenceText(points, fits, measurand.unit, caption),
    table: {
      columns: ['Level', 'm', 's_r', 's_R'],
      rows: points.map((p) => [
        p.label,
        Number(p.m.toFixed(d)),
        p.sr === null ? '—' : Number(p.sr.toFixed(d)),
        p.sR === null ? '—' : Number(p.sR.toFixed(d)),
      ]),
    },
  };
}
