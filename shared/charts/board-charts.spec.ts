import {
  densityOption,
  densityText,
  uncertaintyText,
  youdenText,
  zBarsOption,
  zBarsText,
  type ScoreBar,
} from './board-charts';

describe('board chart builders', () => {
  const bars: ScoreBar[] = [
    { code: 'P3', score: 3.4, signal: 'action' },
    { code: 'P1', score: -0.5, signal: 'acceptable' },
    { code: 'P2', score: 2.2, signal: 'warning', own: true },
  ];
  it('orders z bars by score and colours them by signal', () => {
    const o = zBarsOption(bars, 'Item A · Z-average') as {
      xAxis: { data: string[] };
      series: { data: { value: number; itemStyle: { color: string } }[] }[];
    };
    expect(o.xAxis.data).toEqual(['P1', 'P2', 'P3']);
    expect(o.series[0]!.data.map((d) => d.itemStyle.color)).toEqual([
      '#1b7f79',
      '#b7791f',
      '#a4262c',
    ]);
  });
  it('writes a text alternative with counts and the own code', () => {
    expect(zBarsText(bars, 'T')).toBe(
      'T: z-scores of 3 participants ordered from lowest to highest (-0.50 for P1 to 3.40 for P3). 1 acceptable, 1 warning signals, 1 action signals. Your code P2: 2.20, warning signal.',
    );
  });
  it('density: x_pt and band lines at x_pt ± 2σ_pt and ± 3σ_pt; counts in the text', () => {
    const d = {
      results: [98, 99, 100, 100.5, 101, 102, 110],
      assignedValue: 100,
      sigmaPt: 1.5,
      unit: 'nm',
    };
    const o = densityOption(d, 'T') as { series: { markLine: { data: { xAxis: number }[] } }[] };
    expect(o.series[0]!.markLine.data.map((m) => m.xAxis)).toEqual([100, 97, 103, 95.5, 104.5]);
    expect(densityText(d, 'T')).toContain('6 results lie within ±2σ_pt, 1 at or beyond ±3σ_pt');
  });
  it('uncertainty and Youden text alternatives count what they say', () => {
    expect(
      uncertaintyText(
        [
          { code: 'P1', result: 101, expandedU: 2, signal: 'acceptable' },
          { code: 'P2', result: 105, expandedU: 2, signal: 'action' },
        ],
        100,
        1,
        'nm',
        'T',
      ),
    ).toContain('2 labs reported an uncertainty; for 1 of them');
    expect(
      youdenText(
        [
          { code: 'P1', a: 101, b: 202 },
          { code: 'P2', a: 99, b: 203 },
        ],
        100,
        200,
        1,
        2,
        ['A', 'B'],
        'T',
      ),
    ).toContain('2 lie inside the ±2σ_pt box; 1 are on the same side');
  });
});
