/**
 * ECharts option builders for one level of a precision study (ISO 5725-2): Mandel's h and k per
 * lab with the 1 % and 5 % indicator lines and each bar's class by shape and word, and the level
 * dependence of s_r and s_R (§7.5). (./precision-charts.ts draws h and k of all levels grouped per
 * lab, for the report.) Pure functions, no
 * DOM, so the browser (ngx-echarts) and the server report (echarts SSR) draw the same charts.
 * Each builder has a text alternative beside it.
 *
 * Marks follow docs/QUALITY.md "Look", never colour alone: accepted teal circle, straggler
 * saffron triangle, outlier carmine diamond; the word is printed above every bar that is not
 * accepted and in the text alternative.
 */
import {
  BAR_TOOLTIP,
  CHART_COLORS,
  chartBase,
  participantCodeAxis,
  type ChartOption,
} from './board-charts';

/** ISO 5725-2 outcome of a consistency check or outlier test. */
export type PrecisionClass = 'accepted' | 'straggler' | 'outlier';

export const PRECISION_CLASS_WORDS: Readonly<Record<PrecisionClass, string>> = {
  accepted: 'accepted',
  straggler: 'straggler',
  outlier: 'outlier',
};
const CLASS_COLORS: Readonly<Record<PrecisionClass, string>> = {
  accepted: CHART_COLORS.acceptable,
  straggler: CHART_COLORS.warning,
  outlier: CHART_COLORS.action,
};
const CLASS_SYMBOLS: Readonly<Record<PrecisionClass, string>> = {
  accepted: 'circle',
  straggler: 'triangle',
  outlier: 'diamond',
};

/** Indicator values of Mandel's h or k at the 1 % and 5 % significance levels. */
export interface MandelIndicatorLines {
  readonly indicator1: number;
  readonly indicator5: number;
}

/** One lab's h or k; null when it could not be computed (e.g. a single result for k). */
export interface MandelBar {
  readonly code: string;
  readonly value: number | null;
}

/**
 * Classifies h (two-sided, |h|) or k (one-sided) against its indicators: beyond the 1 % value
 * → outlier, beyond the 5 % value → straggler, else accepted (ISO 5725-2 §7.3.1 reads the 1 %
 * and 5 % indicators as the outlier and straggler levels of the Cochran and Grubbs tests).
 * Without indicators (fewer than 3 labs) every value is accepted.
 */
export function classifyMandel(
  statistic: 'h' | 'k',
  value: number,
  lines: MandelIndicatorLines | null,
): PrecisionClass {
  if (!lines) return 'accepted';
  const v = statistic === 'h' ? Math.abs(value) : value;
  if (v > lines.indicator1) return 'outlier';
  if (v > lines.indicator5) return 'straggler';
  return 'accepted';
}

const base = (title: string): ChartOption =>
  chartBase(title, { left: 48, right: 56, top: 44, bottom: 40 });

const line = (value: number, name: string, color: string, type: 'dashed' | 'solid') => ({
  yAxis: value,
  name,
  lineStyle: { color, type, width: 1.5 },
});

/**
 * Mandel's h (signed, lines at ±h₅ % and ±h₁ %) or k (lines at k₅ % and k₁ %) as bars per lab in
 * the labs' order, each bar coloured by its class and topped by the class's shape.
 */
export function mandelOption(
  statistic: 'h' | 'k',
  bars: readonly MandelBar[],
  lines: MandelIndicatorLines | null,
  title: string,
): ChartOption {
  const shown = bars.filter((b): b is { code: string; value: number } => b.value !== null);
  const cls = (v: number) => classifyMandel(statistic, v, lines);
  const top = Math.max(
    statistic === 'h' ? 2 : 1.5,
    (lines?.indicator1 ?? 0) * 1.15,
    ...shown.map((b) => Math.abs(b.value) * 1.1),
  );
  const marks = lines
    ? [
        line(lines.indicator5, '5 %', CHART_COLORS.warning, 'dashed'),
        line(lines.indicator1, '1 %', CHART_COLORS.action, 'solid'),
        ...(statistic === 'h'
          ? [
              line(-lines.indicator5, '5 %', CHART_COLORS.warning, 'dashed'),
              line(-lines.indicator1, '1 %', CHART_COLORS.action, 'solid'),
            ]
          : []),
      ]
    : [];
  return {
    ...base(title),
    tooltip: BAR_TOOLTIP,
    xAxis: participantCodeAxis(
      shown.map((b) => b.code),
      30,
      shown.length > 12 ? 90 : 0,
    ),
    yAxis: {
      type: 'value',
      name: statistic,
      min: statistic === 'h' ? -Number(top.toFixed(2)) : 0,
      max: Number(top.toFixed(2)),
      splitLine: { lineStyle: { color: CHART_COLORS.grid } },
    },
    series: [
      {
        type: 'bar',
        name: statistic,
        barMaxWidth: 28,
        data: shown.map((b) => ({
          value: b.value,
          itemStyle: { color: CLASS_COLORS[cls(b.value)] },
        })),
        markLine: {
          silent: true,
          symbol: 'none',
          label: { formatter: '{b}', position: 'end', fontSize: 10 },
          data: marks,
        },
      },
      {
        type: 'scatter',
        name: 'class',
        silent: true,
        symbolSize: 9,
        data: shown.map((b) => {
          const c = cls(b.value);
          return {
            value: [b.code, b.value],
            symbol: CLASS_SYMBOLS[c],
            symbolOffset: [0, b.value >= 0 ? -7 : 7],
            itemStyle: { color: CLASS_COLORS[c] },
            label: {
              show: c !== 'accepted',
              formatter: PRECISION_CLASS_WORDS[c],
              position: b.value >= 0 ? 'top' : 'bottom',
              distance: 10,
              fontSize: 10,
              color: CLASS_COLORS[c],
            },
          };
        }),
      },
    ],
  };
}

const f = (v: number, d = 2) => v.toFixed(d);

/** Text alternative of {@link mandelOption}: range, indicators, and every lab beyond them. */
export function mandelText(
  statistic: 'h' | 'k',
  bars: readonly MandelBar[],
  lines: MandelIndicatorLines | null,
  title: string,
): string {
  const shown = bars.filter((b): b is { code: string; value: number } => b.value !== null);
  if (shown.length === 0) return `${title}: Mandel's ${statistic} could not be computed.`;
  const flagged = shown
    .map((b) => ({ ...b, c: classifyMandel(statistic, b.value, lines) }))
    .filter((b) => b.c !== 'accepted')
    .map((b) => `${b.code} ${f(b.value)} (${PRECISION_CLASS_WORDS[b.c]})`);
  const values = shown.map((b) => b.value);
  const sign = statistic === 'h' ? '±' : '';
  return (
    `${title}: Mandel's ${statistic} of ${shown.length} labs, from ${f(Math.min(...values))} to ${f(Math.max(...values))}. ` +
    (lines
      ? `Indicators ${sign}${f(lines.indicator5, 3)} (5 %) and ${sign}${f(lines.indicator1, 3)} (1 %). `
      : 'No indicator values (fewer than 3 labs). ') +
    (flagged.length ? `Beyond them: ${flagged.join(', ')}.` : 'No lab beyond the 5 % indicator.')
  );
}

/* ---------------------------------------------------------------- level dependence (§7.5) */

/** One level's precision against its general mean m. */
export interface LevelPoint {
  readonly label: string;
  readonly m: number;
  readonly sr: number | null;
  readonly sR: number | null;
}

/** A fitted curve s = fn(m), drawn over [mMin, mMax]. */
export interface FittedCurve {
  readonly name: string;
  readonly fn: (m: number) => number;
}

/**
 * s_r and s_R against the level mean m (ISO 5725-2 §7.5), points per level with the fitted
 * relations drawn as lines (s_r dashed ink blue, s_R solid teal).
 */
export function levelDependenceOption(
  points: readonly LevelPoint[],
  fits: { readonly sr: FittedCurve | null; readonly sR: FittedCurve | null },
  unit: string,
  title: string,
): ChartOption {
  const ms = points.map((p) => p.m);
  const lo = Math.min(...ms);
  const hi = Math.max(...ms);
  const curve = (c: FittedCurve | null) => {
    if (!c || !(hi > lo)) return [];
    return Array.from({ length: 41 }, (_, i) => {
      const m = lo + ((hi - lo) * i) / 40;
      return [m, c.fn(m)];
    }).filter(([, s]) => Number.isFinite(s!));
  };
  const u = unit ? ` (${unit})` : '';
  /** One SD's points per level (s_r ink blue circles, s_R teal squares). */
  const measured = (name: string, sd: 'sr' | 'sR', symbol: string, color: string) => ({
    type: 'scatter',
    name,
    symbol,
    symbolSize: 8,
    itemStyle: { color },
    data: points.filter((p) => p[sd] !== null).map((p) => [p.m, p[sd]]),
  });
  /** One SD's fitted relation as a line (s_r dashed, s_R solid). */
  const fitted = (name: string, fit: FittedCurve | null, color: string, type: string) => ({
    type: 'line',
    name: fit ? `${name}: ${fit.name}` : `${name} fitted`,
    showSymbol: false,
    lineStyle: { color, type },
    itemStyle: { color },
    data: curve(fit),
  });
  const srColor = CHART_COLORS.ink;
  const sRColor = CHART_COLORS.acceptable;
  return {
    ...base(title),
    legend: { bottom: 0, textStyle: { fontSize: 11 } },
    grid: { left: 48, right: 24, top: 44, bottom: 56, containLabel: true },
    tooltip: { trigger: 'item' },
    xAxis: {
      type: 'value',
      name: `level mean m${u}`,
      nameLocation: 'middle',
      nameGap: 28,
      scale: true,
      axisLabel: { formatter: (v: number) => v.toPrecision(4) },
    },
    yAxis: {
      type: 'value',
      name: `SD${u}`,
      min: 0,
      splitLine: { lineStyle: { color: CHART_COLORS.grid } },
    },
    series: [
      measured('s_r', 'sr', 'circle', srColor),
      measured('s_R', 'sR', 'rect', sRColor),
      fitted('s_r', fits.sr, srColor, 'dashed'),
      fitted('s_R', fits.sR, sRColor, 'solid'),
    ],
  };
}

/** Text alternative of {@link levelDependenceOption}. */
export function levelDependenceText(
  points: readonly LevelPoint[],
  fits: { readonly sr: FittedCurve | null; readonly sR: FittedCurve | null },
  unit: string,
  title: string,
): string {
  const u = unit ? ` ${unit}` : '';
  const each = points
    .map(
      (p) =>
        `${p.label}: m = ${p.m.toPrecision(5)}${u}, s_r = ${p.sr === null ? '—' : p.sr.toPrecision(3)}, s_R = ${p.sR === null ? '—' : p.sR.toPrecision(3)}`,
    )
    .join('; ');
  return (
    `${title}: ${points.length} levels. ${each}. ` +
    `Fitted: s_r ${fits.sr ? fits.sr.name : 'not fitted'}; s_R ${fits.sR ? fits.sR.name : 'not fitted'}.`
  );
}
