/**
 * ECharts option builders for precision studies (ISO 5725-2): Mandel's h and k per participant
 * code, one bar per level, with the 1 % and 5 % indicator lines. Pure functions, no DOM: the
 * browser and the server-side report charts draw the same chart. Each has a text alternative.
 */
import type { PrecisionMeasurandResult } from '../contracts/precision';
import { CHART_COLORS, type ChartOption } from './board-charts';

/** Bar colours of the levels, in level order (then repeated). */
const LEVEL_COLOURS = ['#1f3a5f', '#1b7f79', '#6b4c9a', '#8a5a2b', '#3d6b8f', '#5b6470'];

/** The indicator values of the level with the most laboratories (the lines drawn). */
export function mandelLines(
  m: PrecisionMeasurandResult,
  stat: 'h' | 'k',
): { indicator1: number; indicator5: number; itemCode: string } | null {
  let best: { indicator1: number; indicator5: number; itemCode: string; p: number } | null = null;
  for (const l of m.levels) {
    const ind = l.mandel[stat];
    if (ind && (!best || l.p > best.p))
      best = {
        indicator1: ind.indicator1,
        indicator5: ind.indicator5,
        itemCode: l.itemCode,
        p: l.p,
      };
  }
  return best;
}

/** Mandel's h (between-laboratory) or k (within-laboratory) as grouped bars per participant code. */
export function mandelOption(m: PrecisionMeasurandResult, stat: 'h' | 'k'): ChartOption {
  const codes = [...new Set(m.levels.flatMap((l) => l.cells.map((c) => c.participantCode)))].sort(
    (a, b) => a.localeCompare(b, 'en', { numeric: true }),
  );
  const lines = mandelLines(m, stat);
  const markLine = lines
    ? {
        silent: true,
        symbol: 'none',
        label: { show: true, position: 'end', fontSize: 9, formatter: '{b}' },
        data: [
          {
            name: '1 %',
            yAxis: lines.indicator1,
            lineStyle: { color: CHART_COLORS.action, type: 'solid' },
          },
          {
            name: '5 %',
            yAxis: lines.indicator5,
            lineStyle: { color: CHART_COLORS.warning, type: 'dashed' },
          },
          ...(stat === 'h'
            ? [
                {
                  name: '−1 %',
                  yAxis: -lines.indicator1,
                  lineStyle: { color: CHART_COLORS.action, type: 'solid' },
                },
                {
                  name: '−5 %',
                  yAxis: -lines.indicator5,
                  lineStyle: { color: CHART_COLORS.warning, type: 'dashed' },
                },
              ]
            : []),
        ],
      }
    : undefined;
  const extent = Math.max(
    lines ? lines.indicator1 * 1.15 : 1,
    ...m.levels.flatMap((l) => l.cells.map((c) => Math.abs(c[stat] ?? 0) * 1.1)),
  );
  return {
    animation: false,
    textStyle: { fontFamily: 'Noto Sans, sans-serif', color: CHART_COLORS.text },
    title: {
      text: stat === 'h' ? `Mandel's h: ${m.label}` : `Mandel's k: ${m.label}`,
      left: 8,
      top: 4,
      textStyle: { fontSize: 13, fontWeight: 600, color: CHART_COLORS.ink },
    },
    legend: { top: 4, right: 8, textStyle: { fontSize: 10 } },
    grid: { left: 48, right: 44, top: 40, bottom: 52, containLabel: false },
    xAxis: {
      type: 'category',
      data: codes,
      name: 'Participant code',
      nameLocation: 'middle',
      nameGap: 30,
      axisLabel: { fontSize: 10, interval: 0, rotate: codes.length > 12 ? 45 : 0 },
    },
    yAxis: {
      type: 'value',
      min: stat === 'h' ? -extent : 0,
      max: extent,
      axisLabel: { fontSize: 10, formatter: (v: number) => v.toFixed(1) },
      splitLine: { lineStyle: { color: CHART_COLORS.grid } },
    },
    series: m.levels.map((l, i) => {
      const byCode = new Map(l.cells.map((c) => [c.participantCode, c[stat]]));
      return {
        type: 'bar',
        name: l.itemCode,
        data: codes.map((c) => byCode.get(c) ?? null),
        itemStyle: { color: LEVEL_COLOURS[i % LEVEL_COLOURS.length] },
        barMaxWidth: 14,
        ...(i === 0 && markLine ? { markLine } : {}),
      };
    }),
  };
}

/** The chart in words (text alternative). */
export function mandelAlt(m: PrecisionMeasurandResult, stat: 'h' | 'k'): string {
  const lines = mandelLines(m, stat);
  const beyond = m.levels.flatMap((l) =>
    l.cells
      .filter((c) => c.flags.some((f) => f.test === (stat === 'h' ? 'mandel-h' : 'mandel-k')))
      .map((c) => `${c.participantCode} at ${l.itemCode} (${stat} = ${c[stat]?.toFixed(2)})`),
  );
  return (
    `Mandel's ${stat} of ${m.label} for every participant code, one bar per level (${m.levels.map((l) => l.itemCode).join(', ')})` +
    (lines
      ? `, with indicator lines at ${lines.indicator5.toFixed(2)} (5 %) and ${lines.indicator1.toFixed(2)} (1 %) for level ${lines.itemCode}. `
      : '. ') +
    (beyond.length ? `Beyond the 5 % line: ${beyond.join('; ')}.` : 'No bar passes the 5 % line.')
  );
}
