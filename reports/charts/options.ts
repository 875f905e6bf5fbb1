/**
 * Chart options for the reports, as pure functions of the stored record (ECharts option
 * objects; the same library the browser uses). Colours and shapes follow docs/QUALITY.md "Look":
 * acceptable teal circle, warning saffron triangle, action carmine diamond.
 */
import type { ParticipantScore, TrackSeries } from '../../shared/contracts/evaluation';
import { SIGNAL_LIMITS } from '../../shared/stats/scores';
import { mainScore, type ReportGroup } from '../model';
import { SCORE_LIMIT_LINES, SIGNAL_SHAPES as SHAPES } from '../../shared/charts/signals';
import { PALETTE, SIGNAL_COLOURS } from '../text';

type Option = Record<string, unknown>;
const W = SIGNAL_LIMITS.warning;

const BASE = { animation: false, textStyle: { fontFamily: 'sans-serif', color: PALETTE.ink } };

/** A chart's title, centred above it. */
function chartTitle(text: string): Option {
  return { text, left: 'center', top: 2, textStyle: { fontSize: 12, color: PALETTE.ink } };
}

/** A score axis from −limit to +limit, one grid line a unit. */
function scoreAxis(limit: number): Option {
  return {
    type: 'value',
    min: -limit,
    max: limit,
    interval: 1,
    axisLabel: { fontSize: 9 },
    splitLine: { lineStyle: { color: '#e6e9ed' } },
  };
}

/** The ±2 / ±3 limits (shared/charts/signals.ts, from shared/stats/scores.ts) as a markLine. */
function limitLines(): Option {
  return {
    silent: true,
    symbol: 'none',
    label: { show: true, position: 'end', formatter: '{b}', fontSize: 9 },
    lineStyle: { type: 'dashed', width: 1 },
    data: SCORE_LIMIT_LINES.map((v) => ({
      yAxis: v.value,
      name: v.label,
      lineStyle: { color: v.colour },
    })),
  };
}

/**
 * Scores of every participant in ascending order (bars coloured by signal), with the warning
 * (±2) and action (±3) limits of ISO 13528:2015 §9. Scores beyond ±5 are drawn at ±5.
 */
export function scoreBarOption(g: ReportGroup, highlightCode?: string): Option {
  const rows = g.participants
    .map((p) => ({ p, s: mainScore(p) }))
    .filter((r): r is { p: ParticipantScore; s: number } => r.s !== null)
    .sort((a, b) => a.s - b.s);
  const kind = g.uNegligible === false ? 'z′' : 'z';
  return {
    ...BASE,
    grid: { left: 40, right: 40, top: 34, bottom: 30 },
    title: chartTitle(`${kind}-scores, item ${g.itemCode}, ${g.measurandName}`),
    xAxis: {
      type: 'category',
      data: rows.map((r) => r.p.code),
      axisLabel: { show: rows.length <= 40, fontSize: 8, rotate: 90 },
      axisTick: { show: false },
    },
    yAxis: scoreAxis(5),
    // Past 200 participants the sorted scores are one line (one SVG path instead of a bar each).
    series: [
      rows.length > 200
        ? {
            type: 'line',
            symbol: 'none',
            data: rows.map((r) => Math.max(-5, Math.min(5, r.s))),
            lineStyle: { color: PALETTE.ink, width: 1.5 },
            markLine: limitLines(),
            ...(highlightCode && rows.some((r) => r.p.code === highlightCode)
              ? {
                  markPoint: {
                    symbol: 'pin',
                    symbolSize: 24,
                    itemStyle: { color: PALETTE.carmine },
                    label: { fontSize: 8, formatter: 'you' },
                    data: [
                      {
                        coord: [
                          rows.findIndex((r) => r.p.code === highlightCode),
                          Math.max(
                            -5,
                            Math.min(5, rows.find((r) => r.p.code === highlightCode)!.s),
                          ),
                        ],
                      },
                    ],
                  },
                }
              : {}),
          }
        : {
            type: 'bar',
            barCategoryGap: '20%',
            data: rows.map((r) => ({
              value: Math.max(-5, Math.min(5, r.s)),
              itemStyle: {
                color:
                  r.p.code === highlightCode
                    ? PALETTE.ink
                    : SIGNAL_COLOURS[r.p.signal ?? 'acceptable'],
              },
              // A score beyond the axis is drawn at ±5 with its value written across the bar.
              ...(Math.abs(r.s) > 5
                ? {
                    label: {
                      show: true,
                      position: r.s > 0 ? 'insideTop' : 'insideBottom',
                      rotate: 90,
                      fontSize: 7,
                      color: '#ffffff',
                      formatter: r.s.toFixed(1),
                    },
                  }
                : {}),
            })),
            markLine: limitLines(),
          },
    ],
  };
}

/** Results outside the histogram's axis (x_pt ± 5σ_pt), lowest and highest, with their codes. */
export function offScale(g: ReportGroup): {
  below: { code: string; result: number }[];
  above: { code: string; result: number }[];
} {
  const values = g.participants.filter((p) => Number.isFinite(p.result));
  if (g.assignedValue === null || g.sigmaPt === null) return { below: [], above: [] };
  const lo = g.assignedValue - 5 * g.sigmaPt;
  const hi = g.assignedValue + 5 * g.sigmaPt;
  const pick = (f: (v: number) => boolean) =>
    values
      .filter((p) => f(p.result))
      .map((p) => ({ code: p.code, result: p.result }))
      .sort((a, b) => a.result - b.result);
  return { below: pick((v) => v < lo), above: pick((v) => v > hi) };
}

/** Scores the score chart draws at its ±5 edge (their true value is written on the bar and listed in the report). */
export function scoresOffScale(g: ReportGroup): { code: string; score: number }[] {
  return g.participants
    .map((p) => ({ code: p.code, score: mainScore(p) }))
    .filter((r): r is { code: string; score: number } => r.score !== null && Math.abs(r.score) > 5);
}

/**
 * Histogram of the participants' means with the assigned value and x_pt ± 2σ_pt marked; the
 * viewer's own result (individual report) as a marked line.
 */
export function distributionOption(g: ReportGroup, ownResult?: number): Option {
  const values = g.participants.map((p) => p.result).filter((v) => Number.isFinite(v));
  const x = g.assignedValue ?? values[0] ?? 0;
  const s = g.sigmaPt ?? ((Math.max(...values) - Math.min(...values)) / 8 || 1);
  const lo = x - 5 * s;
  const hi = x + 5 * s;
  const bins = 40;
  const w = (hi - lo) / bins;
  const counts = new Array<number>(bins).fill(0);
  // Results outside x_pt ± 5σ_pt are not put into an edge bin (that would show them at a value
  // they do not have): the chart notes how many lie beyond each end, and the report lists them.
  const { below, above } = offScale(g);
  for (const v of values)
    if (v >= lo && v <= hi) counts[Math.min(bins - 1, Math.floor((v - lo) / w))]!++;
  const centre = (i: number) => lo + (i + 0.5) * w;
  const lines: Option[] = [
    { xAxis: x, name: 'x_pt', lineStyle: { color: PALETTE.ink, type: 'solid', width: 1.5 } },
  ];
  if (g.sigmaPt !== null) {
    lines.push(
      { xAxis: x - W * s, name: `−${W}σ`, lineStyle: { color: SIGNAL_COLOURS.warning } },
      { xAxis: x + W * s, name: `+${W}σ`, lineStyle: { color: SIGNAL_COLOURS.warning } },
    );
  }
  if (ownResult !== undefined) {
    const off = ownResult < lo || ownResult > hi;
    lines.push({
      xAxis: Math.max(lo, Math.min(hi, ownResult)),
      name: off ? 'you (off scale)' : 'you',
      lineStyle: { color: PALETTE.carmine, type: 'solid', width: 2 },
    });
  }
  const d = Math.max(0, g.decimals);
  // Below the axis labels, outside the plot area: how many results the axis leaves out (listed under the chart).
  const off = [
    below.length ? `${below.length} below` : '',
    above.length ? `${above.length} above` : '',
  ]
    .filter(Boolean)
    .join(', ');
  const notes: Option[] = off
    ? [
        {
          type: 'text',
          left: 40,
          bottom: 3,
          style: {
            text: `Off the axis: ${off} (listed under the chart)`,
            fontSize: 9,
            fill: PALETTE.carmine,
          },
        },
      ]
    : [];
  return {
    ...BASE,
    // The title sits above the limit-line labels (x_pt, ±2σ), which sit above the plot area.
    grid: { left: 40, right: 20, top: 52, bottom: off ? 42 : 30 },
    title: chartTitle(
      `Results, item ${g.itemCode}, ${g.measurandName}${g.unit ? ` (${g.unit})` : ''}`,
    ),
    graphic: notes,
    xAxis: {
      type: 'value',
      min: lo,
      max: hi,
      axisLabel: { fontSize: 9, formatter: (v: number) => v.toFixed(d) },
    },
    yAxis: {
      type: 'value',
      minInterval: 1,
      axisLabel: { fontSize: 9 },
      splitLine: { lineStyle: { color: '#e6e9ed' } },
    },
    series: [
      {
        type: 'bar',
        barWidth: '95%',
        data: counts.map((c, i) => [centre(i), c]),
        itemStyle: { color: '#8fb3c9' },
        markLine: {
          silent: true,
          symbol: 'none',
          label: { show: true, position: 'end', formatter: '{b}', fontSize: 9 },
          lineStyle: { type: 'dashed' },
          data: lines,
        },
      },
    ],
  };
}

/** A lab's Track record: its z (or z′) per round, one line per measurand, limits ±2 and ±3. */
export function trackRecordOption(series: TrackSeries[]): Option {
  const labels = [
    ...new Set(series.flatMap((s) => s.points.map((p) => `${p.roundCode} ${p.itemCode}`))),
  ];
  return {
    ...BASE,
    grid: { left: 40, right: 40, top: 48, bottom: 50 },
    title: chartTitle('Track record'),
    legend: { top: 22, textStyle: { fontSize: 9 } },
    xAxis: { type: 'category', data: labels, axisLabel: { fontSize: 8, rotate: 30 } },
    yAxis: scoreAxis(4),
    series: series.map((s, i) => ({
      type: 'line',
      name: s.measurandName,
      lineStyle: { color: i === 0 ? PALETTE.ink : PALETTE.teal },
      itemStyle: { color: i === 0 ? PALETTE.ink : PALETTE.teal },
      data: labels.map((l) => {
        const p = s.points.find((q) => `${q.roundCode} ${q.itemCode}` === l);
        return p
          ? {
              value: Math.max(-4, Math.min(4, p.z)),
              symbol: SHAPES[p.signal],
              symbolSize: 8,
              itemStyle: { color: SIGNAL_COLOURS[p.signal] },
              // Drawn at the ±4 edge: the true score is written beside the mark.
              ...(Math.abs(p.z) > 4
                ? {
                    label: {
                      show: true,
                      position: p.z > 0 ? 'bottom' : 'top',
                      fontSize: 8,
                      color: PALETTE.carmine,
                      formatter: p.z.toFixed(1),
                    },
                  }
                : {}),
            }
          : null;
      }),
      markLine: i === 0 ? limitLines() : undefined,
    })),
  };
}
