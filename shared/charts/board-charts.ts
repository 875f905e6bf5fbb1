/**
 * ECharts option builders for the Consensus board and the reports: pure functions, no DOM, so
 * the browser (ngx-echarts) and the server (echarts SSR, SVG) draw the same charts from the same
 * data. Each builder has a text alternative beside it (for screen readers and the report text).
 *
 * Charts use our palette (docs/QUALITY.md "Look"): signals acceptable teal, warning saffron, action
 * carmine; x_pt ink blue; ±2σ_pt and ±3σ_pt bands in saffron and carmine tints.
 * The option type is kept loose (Record) so this file imports nothing from echarts.
 */
import { kde } from '../stats/kde';
import { SIGNAL_LIMITS } from '../stats/scores';
import { PALETTE, SCORE_LIMIT_LINES, SIGNAL_COLOURS, SIGNAL_SHAPES, SIGNAL_WORDS } from './signals';

export type ChartOption = Record<string, unknown>;
export type ChartSignal = 'acceptable' | 'warning' | 'action';

/** Signal limits (shared/stats/scores.ts): warning beyond W, action from A on. */
const { warning: W, action: A } = SIGNAL_LIMITS;

/** Chart colours: the palette and signal colours of ./signals, plus chart-only tints. */
export const CHART_COLORS = {
  ink: PALETTE.ink,
  acceptable: SIGNAL_COLOURS.acceptable,
  warning: SIGNAL_COLOURS.warning,
  action: SIGNAL_COLOURS.action,
  own: PALETTE.ink,
  band2: 'rgba(183, 121, 31, 0.10)',
  band3: 'rgba(164, 38, 44, 0.08)',
  grid: '#d5dbe3',
  text: '#1b2430',
} as const;

const SYMBOLS = SIGNAL_SHAPES;
const WORDS = SIGNAL_WORDS;

/** Chart margins inside the drawing area (ECharts `grid`). */
export interface ChartMargins {
  readonly left: number;
  readonly right: number;
  readonly top: number;
  readonly bottom: number;
}

/** The part every Ringlet chart shares: no animation, our font and ink, the title top left. */
export const chartBase = (title: string, margins: ChartMargins): ChartOption => ({
  animation: false,
  textStyle: { fontFamily: 'Noto Sans, sans-serif', color: CHART_COLORS.text },
  title: {
    text: title,
    left: 8,
    top: 4,
    textStyle: { fontSize: 13, fontWeight: 600, color: CHART_COLORS.ink },
  },
  grid: { ...margins, containLabel: true },
});

const base = (title: string): ChartOption =>
  chartBase(title, { left: 56, right: 24, top: 40, bottom: 48 });

/** A mark in its signal's colour; the viewer's own participant is outlined in ink. */
const signalMarkStyle = (signal: ChartSignal, own: boolean | undefined) => ({
  color: CHART_COLORS[signal],
  borderColor: own ? CHART_COLORS.ink : undefined,
  borderWidth: own ? 2 : 0,
});

/**
 * The category axis of participant codes under a chart of one mark per lab; the codes are hidden
 * past 60 labs (too dense to read).
 */
export const participantCodeAxis = (
  codes: readonly string[],
  nameGap: number,
  rotate: number,
): ChartOption => ({
  type: 'category',
  name: 'participant code',
  nameLocation: 'middle',
  nameGap,
  data: codes,
  axisLabel: { show: codes.length <= 60, rotate, fontSize: 10 },
});

/** The tooltip of a bar chart: the whole category (one lab) under the pointer. */
export const BAR_TOOLTIP = { trigger: 'axis', axisPointer: { type: 'shadow' } } as const;

/**
 * The x_pt line and the ±W·σ_pt warning lines (dashed) on the value axis `axis`, with the ±A·σ_pt
 * action lines when `action` is set, as markLine data.
 */
function assignedValueLines(
  axis: 'xAxis' | 'yAxis',
  x: number,
  s: number,
  action: boolean,
): ChartOption[] {
  const at = (value: number, name: string, lineStyle: ChartOption) => ({
    [axis]: value,
    name,
    lineStyle,
  });
  const warningStyle = { color: CHART_COLORS.warning, type: 'dashed' };
  return [
    at(x, 'x_pt', { color: CHART_COLORS.ink, width: 2 }),
    at(x - W * s, `−${W}σ_pt`, warningStyle),
    at(x + W * s, `+${W}σ_pt`, warningStyle),
    ...(action
      ? [
          at(x - A * s, `−${A}σ_pt`, { color: CHART_COLORS.action }),
          at(x + A * s, `+${A}σ_pt`, { color: CHART_COLORS.action }),
        ]
      : []),
  ];
}

const fmt = (v: number, d = 3) => (Number.isFinite(v) ? v.toFixed(d) : '–');

/* ---------------------------------------------------------------- z-scores as ordered bars */

export interface ScoreBar {
  readonly code: string;
  readonly score: number;
  readonly signal: ChartSignal;
  /** The viewer's own participant code: outlined. */
  readonly own?: boolean;
}

/** Bars sorted by score, coloured by signal, reference lines at ±2 and ±3. */
export function zBarsOption(
  bars: readonly ScoreBar[],
  title: string,
  scoreName = 'z',
): ChartOption {
  const sorted = [...bars].sort((a, b) => a.score - b.score);
  const lim = Math.max(3.5, ...sorted.map((b) => Math.min(Math.abs(b.score), 10) + 0.5));
  return {
    ...base(title),
    tooltip: BAR_TOOLTIP,
    xAxis: participantCodeAxis(
      sorted.map((b) => b.code),
      32,
      90,
    ),
    yAxis: {
      type: 'value',
      name: scoreName,
      min: -lim,
      max: lim,
      splitLine: { lineStyle: { color: CHART_COLORS.grid } },
    },
    series: [
      {
        type: 'bar',
        name: scoreName,
        barCategoryGap: sorted.length > 200 ? '0%' : '20%',
        data: sorted.map((b) => ({
          value: Math.max(-lim, Math.min(lim, b.score)),
          itemStyle: signalMarkStyle(b.signal, b.own),
        })),
        markLine: {
          silent: true,
          symbol: 'none',
          label: { formatter: '{b}', position: 'insideEndTop', fontSize: 10 },
          data: SCORE_LIMIT_LINES.map((l) => ({
            yAxis: l.value,
            name: l.label,
            lineStyle: { color: l.colour, type: l.signal === 'warning' ? 'dashed' : 'solid' },
          })),
        },
      },
    ],
  };
}

export function zBarsText(bars: readonly ScoreBar[], title: string, scoreName = 'z'): string {
  const n = bars.length;
  const count = (s: ChartSignal) => bars.filter((b) => b.signal === s).length;
  const sorted = [...bars].sort((a, b) => a.score - b.score);
  const own = bars.find((b) => b.own);
  return (
    `${title}: ${scoreName}-scores of ${n} participants ordered from lowest to highest` +
    (n
      ? ` (${fmt(sorted[0]!.score, 2)} for ${sorted[0]!.code} to ${fmt(sorted[n - 1]!.score, 2)} for ${sorted[n - 1]!.code}). `
      : '. ') +
    `${count('acceptable')} acceptable, ${count('warning')} warning signals, ${count('action')} action signals.` +
    (own ? ` Your code ${own.code}: ${fmt(own.score, 2)}, ${WORDS[own.signal]}.` : '')
  );
}

/* ---------------------------------------------------------------- kernel density with bands */

export interface DensityInput {
  readonly results: readonly number[];
  readonly assignedValue: number;
  readonly sigmaPt: number;
  readonly unit: string;
  /** The viewer's own result, marked on the axis. */
  readonly own?: number;
}

/** Gaussian kernel density (Silverman bandwidth, shared/stats kde) with x_pt, ±2σ_pt, ±3σ_pt. */
export function densityOption(d: DensityInput, title: string): ChartOption {
  const xs = d.results.filter((v) => Number.isFinite(v));
  const lo = d.assignedValue - 4 * d.sigmaPt;
  const hi = d.assignedValue + 4 * d.sigmaPt;
  // Density over the central region (outliers far away would flatten the curve).
  const central = xs.filter((v) => v >= lo && v <= hi);
  const k = central.length >= 2 ? kde(central, { points: 200 }) : { x: [], density: [] };
  const scale = central.length / Math.max(1, xs.length);
  const unit = d.unit ? ` (${d.unit})` : '';
  const band = (a: number, b: number, color: string) => [
    { xAxis: a, itemStyle: { color } },
    { xAxis: b },
  ];
  const x = d.assignedValue;
  const s = d.sigmaPt;
  return {
    ...base(title),
    tooltip: { trigger: 'axis' },
    xAxis: {
      type: 'value',
      name: `result${unit}`,
      nameLocation: 'middle',
      nameGap: 28,
      min: lo,
      max: hi,
      axisLabel: { formatter: (v: number) => v.toPrecision(4) },
    },
    yAxis: {
      type: 'value',
      name: 'density',
      axisLabel: { show: false },
      splitLine: { lineStyle: { color: CHART_COLORS.grid } },
    },
    series: [
      {
        type: 'line',
        name: 'kernel density',
        showSymbol: false,
        smooth: false,
        lineStyle: { color: CHART_COLORS.ink, width: 2 },
        areaStyle: { color: 'rgba(31, 58, 95, 0.08)' },
        data: k.x.map((xv, i) => [xv, k.density[i]! * scale]),
        markArea: {
          silent: true,
          data: [
            band(x - A * s, x - W * s, CHART_COLORS.band3),
            band(x + W * s, x + A * s, CHART_COLORS.band3),
            band(x - W * s, x + W * s, CHART_COLORS.band2),
          ],
        },
        markLine: {
          silent: true,
          symbol: 'none',
          label: { formatter: '{b}', fontSize: 10 },
          data: [
            ...assignedValueLines('xAxis', x, s, true),
            ...(d.own !== undefined
              ? [
                  {
                    xAxis: d.own,
                    name: 'your result',
                    lineStyle: { color: CHART_COLORS.acceptable, width: 2, type: 'dotted' },
                  },
                ]
              : []),
          ],
        },
      },
    ],
  };
}

export function densityText(d: DensityInput, title: string): string {
  const within2 = d.results.filter((v) => Math.abs(v - d.assignedValue) <= W * d.sigmaPt).length;
  const beyond3 = d.results.filter((v) => Math.abs(v - d.assignedValue) >= A * d.sigmaPt).length;
  const u = d.unit ? ` ${d.unit}` : '';
  return (
    `${title}: distribution of ${d.results.length} results around the assigned value x_pt = ${d.assignedValue.toPrecision(5)}${u} ` +
    `with σ_pt = ${d.sigmaPt.toPrecision(4)}${u}. ${within2} results lie within ±${W}σ_pt, ${beyond3} at or beyond ±${A}σ_pt.` +
    (d.own !== undefined ? ` Your result: ${d.own.toPrecision(5)}${u}.` : '')
  );
}

/* ---------------------------------------------------------------- results with uncertainty bars */

export interface UncertaintyPoint {
  readonly code: string;
  readonly result: number;
  /** Expanded uncertainty U (k = 2), same unit; null when none was reported. */
  readonly expandedU: number | null;
  readonly signal: ChartSignal;
  readonly own?: boolean;
}

/** Results ordered by value with ±U bars, against x_pt and x_pt ± 2σ_pt. */
export function uncertaintyOption(
  points: readonly UncertaintyPoint[],
  assignedValue: number,
  sigmaPt: number,
  unit: string,
  title: string,
): ChartOption {
  const sorted = [...points].sort((a, b) => a.result - b.result);
  const codes = sorted.map((p) => p.code);
  return {
    ...base(title),
    tooltip: { trigger: 'item' },
    xAxis: participantCodeAxis(codes, 32, 90),
    yAxis: {
      type: 'value',
      name: unit ? `result (${unit})` : 'result',
      scale: true,
      splitLine: { lineStyle: { color: CHART_COLORS.grid } },
    },
    series: [
      {
        type: 'custom',
        name: 'U (k = 2)',
        silent: true,
        data: sorted.map((p, i) =>
          p.expandedU === null
            ? [i, p.result, p.result]
            : [i, p.result - p.expandedU, p.result + p.expandedU],
        ),
        renderItem: (
          _params: unknown,
          api: { value: (i: number) => number; coord: (v: number[]) => number[] },
        ) => {
          const i = api.value(0);
          const a = api.coord([i, api.value(1)]);
          const b = api.coord([i, api.value(2)]);
          return {
            type: 'group',
            children: [
              {
                type: 'line',
                shape: { x1: a[0], y1: a[1], x2: b[0], y2: b[1] },
                style: { stroke: CHART_COLORS.ink, lineWidth: 1 },
              },
              {
                type: 'line',
                shape: { x1: a[0]! - 3, y1: a[1], x2: a[0]! + 3, y2: a[1] },
                style: { stroke: CHART_COLORS.ink, lineWidth: 1 },
              },
              {
                type: 'line',
                shape: { x1: b[0]! - 3, y1: b[1], x2: b[0]! + 3, y2: b[1] },
                style: { stroke: CHART_COLORS.ink, lineWidth: 1 },
              },
            ],
          };
        },
      },
      {
        type: 'scatter',
        name: 'result',
        symbolSize: 7,
        data: sorted.map((p) => ({
          value: [p.code, p.result],
          symbol: SYMBOLS[p.signal],
          itemStyle: signalMarkStyle(p.signal, p.own),
        })),
        markLine: {
          silent: true,
          symbol: 'none',
          label: { formatter: '{b}', fontSize: 10 },
          data: assignedValueLines('yAxis', assignedValue, sigmaPt, false),
        },
      },
    ],
  };
}

export function uncertaintyText(
  points: readonly UncertaintyPoint[],
  assignedValue: number,
  sigmaPt: number,
  unit: string,
  title: string,
): string {
  const withU = points.filter((p) => p.expandedU !== null);
  const covering = withU.filter((p) => Math.abs(p.result - assignedValue) <= p.expandedU!).length;
  const u = unit ? ` ${unit}` : '';
  return (
    `${title}: ${points.length} results with their expanded uncertainties against x_pt = ${assignedValue.toPrecision(5)}${u} ` +
    `(dashed lines at ±${W}σ_pt = ±${(W * sigmaPt).toPrecision(3)}${u}). ${withU.length} labs reported an uncertainty; ` +
    `for ${covering} of them the interval result ± U contains x_pt.`
  );
}

/* ---------------------------------------------------------------- Youden plot */

export interface YoudenPoint {
  readonly code: string;
  readonly a: number;
  readonly b: number;
  readonly own?: boolean;
}

/**
 * Youden plot of two paired items: each lab's result on item A against item B, with the two
 * assigned values and the ±2σ_pt box. Points along the diagonal show a systematic (lab) effect,
 * points off it a random one.
 */
export function youdenOption(
  points: readonly YoudenPoint[],
  xA: number,
  xB: number,
  sA: number,
  sB: number,
  labels: [string, string],
  unit: string,
  title: string,
): ChartOption {
  const u = unit ? ` (${unit})` : '';
  const inRange = (p: YoudenPoint) => Math.abs(p.a - xA) <= 5 * sA && Math.abs(p.b - xB) <= 5 * sB;
  return {
    ...base(title),
    tooltip: { trigger: 'item' },
    xAxis: {
      type: 'value',
      name: `${labels[0]}${u}`,
      nameLocation: 'middle',
      nameGap: 28,
      min: xA - 5 * sA,
      max: xA + 5 * sA,
      axisLabel: { formatter: (v: number) => v.toPrecision(4) },
    },
    yAxis: {
      type: 'value',
      name: `${labels[1]}${u}`,
      min: xB - 5 * sB,
      max: xB + 5 * sB,
      axisLabel: { formatter: (v: number) => v.toPrecision(4) },
    },
    series: [
      {
        type: 'scatter',
        name: 'labs',
        symbolSize: 6,
        data: points.filter(inRange).map((p) => ({
          value: [p.a, p.b],
          name: p.code,
          itemStyle: { color: p.own ? CHART_COLORS.action : CHART_COLORS.acceptable },
        })),
        markArea: {
          silent: true,
          data: [
            [
              { coord: [xA - W * sA, xB - W * sB], itemStyle: { color: CHART_COLORS.band2 } },
              { coord: [xA + W * sA, xB + W * sB] },
            ],
          ],
        },
        markLine: {
          silent: true,
          symbol: 'none',
          data: [
            { xAxis: xA, name: `x_pt ${labels[0]}`, lineStyle: { color: CHART_COLORS.ink } },
            { yAxis: xB, name: `x_pt ${labels[1]}`, lineStyle: { color: CHART_COLORS.ink } },
          ],
        },
      },
    ],
  };
}

export function youdenText(
  points: readonly YoudenPoint[],
  xA: number,
  xB: number,
  sA: number,
  sB: number,
  labels: [string, string],
  title: string,
): string {
  const box = points.filter(
    (p) => Math.abs(p.a - xA) <= W * sA && Math.abs(p.b - xB) <= W * sB,
  ).length;
  const same = points.filter((p) => Math.sign(p.a - xA) === Math.sign(p.b - xB)).length;
  const own = points.find((p) => p.own);
  return (
    `${title}: results on ${labels[0]} against ${labels[1]} for ${points.length} labs. ${box} lie inside the ±${W}σ_pt box; ` +
    `${same} are on the same side of both assigned values (a lab effect shows as points along the diagonal).` +
    (own ? ` Your code ${own.code}: ${own.a.toPrecision(5)} and ${own.b.toPrecision(5)}.` : '')
  );
}

/* ---------------------------------------------------------------- Track record */

export interface TrackChartPoint {
  readonly label: string;
  readonly z: number;
  readonly signal: ChartSignal;
}

/** z-scores across rounds (oldest first) with ±2 and ±3 lines; symbols by signal. */
export function trackOption(points: readonly TrackChartPoint[], title: string): ChartOption {
  const lim = Math.max(3.5, ...points.map((p) => Math.min(Math.abs(p.z), 10) + 0.5));
  return {
    ...base(title),
    tooltip: { trigger: 'axis' },
    xAxis: {
      type: 'category',
      data: points.map((p) => p.label),
      axisLabel: { rotate: points.length > 8 ? 45 : 0, fontSize: 10 },
    },
    yAxis: {
      type: 'value',
      name: 'z',
      min: -lim,
      max: lim,
      splitLine: { lineStyle: { color: CHART_COLORS.grid } },
    },
    series: [
      {
        type: 'line',
        name: 'z',
        lineStyle: { color: CHART_COLORS.ink },
        data: points.map((p) => ({
          value: Math.max(-lim, Math.min(lim, p.z)),
          symbol: SYMBOLS[p.signal],
          symbolSize: 9,
          itemStyle: { color: CHART_COLORS[p.signal] },
        })),
        markLine: {
          silent: true,
          symbol: 'none',
          data: [
            ...SCORE_LIMIT_LINES.map((l) => ({
              yAxis: l.value,
              lineStyle:
                l.signal === 'warning' ? { color: l.colour, type: 'dashed' } : { color: l.colour },
            })),
            { yAxis: 0, lineStyle: { color: CHART_COLORS.grid } },
          ],
        },
      },
    ],
  };
}

export function trackText(
  points: readonly TrackChartPoint[],
  rsz: number | null,
  title: string,
): string {
  if (points.length === 0) return `${title}: no scores yet.`;
  const last = points[points.length - 1]!;
  return (
    `${title}: ${points.length} z-scores from ${points[0]!.label} to ${last.label}; latest ${last.z.toFixed(2)} (${WORDS[last.signal]}). ` +
    `${points.filter((p) => p.signal !== 'acceptable').length} outside ±${W}.` +
    (rsz !== null ? ` Rescaled sum of z-scores RSZ = ${rsz.toFixed(2)}.` : '')
  );
}
