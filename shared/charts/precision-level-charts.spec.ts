import { mandelHIndicator, mandelKIndicator } from '../stats/critical-values';
import { precisionAnalysis } from '../stats/precision';
import creosote from '../stats/fixtures/creosote.json';
import {
  classifyMandel,
  levelDependenceOption,
  levelDependenceText,
  mandelOption,
  mandelText,
  type MandelBar,
} from './precision-level-charts';

interface BarSeries {
  data: { value: number; itemStyle: { color: string } }[];
  markLine: { data: { yAxis: number; name: string }[] };
}
interface ShapeSeries {
  data: { value: [string, number]; symbol: string; label: { show: boolean; formatter: string } }[];
}

describe('precision chart builders', () => {
  // ISO 5725-5:1998 creosote example, nine lab means (fixtures/creosote.json): as single-result
  // cells, Mandel's h is (ȳ_i − ȳ)/SD of the means. Lab 1 (24.14) has h = 2.10, between the
  // 5 % (1.78) and 1 % (2.13) indicators for p = 9 (computed by shared/stats/critical-values,
  // ISO 5725-2 Table 6 form).
  const creosoteCells = creosote.values.map((v, i) => ({ code: `L${i + 1}`, values: [v] }));
  const analysis = precisionAnalysis(creosoteCells);
  const hBars: MandelBar[] = analysis.cells.map((c) => ({ code: c.code, value: c.h }));
  const hLines = analysis.mandel.h!;

  it('classifies h two-sided and k one-sided against the 5 % and 1 % indicators', () => {
    const lines = { indicator1: 2.13, indicator5: 1.78 };
    expect(classifyMandel('h', 2.1, lines)).toBe('straggler');
    expect(classifyMandel('h', -2.2, lines)).toBe('outlier');
    expect(classifyMandel('h', -1.7, lines)).toBe('accepted');
    expect(classifyMandel('k', -2.2, lines)).toBe('accepted');
    expect(classifyMandel('k', 1.78, lines)).toBe('accepted');
    expect(classifyMandel('k', 2.2, lines)).toBe('outlier');
    expect(classifyMandel('h', 9, null)).toBe('accepted');
  });

  it('creosote means: lab 1 is a straggler by h, drawn saffron with a triangle and its word', () => {
    expect(hLines.indicator5).toBeCloseTo(mandelHIndicator(9, 0.05), 12);
    expect(hBars[0]!.value).toBeCloseTo(2.102, 3);
    const o = mandelOption('h', hBars, hLines, 'Creosote · h') as {
      xAxis: { data: string[] };
      yAxis: { min: number; max: number };
      series: [BarSeries, ShapeSeries];
    };
    expect(o.xAxis.data).toEqual(['L1', 'L2', 'L3', 'L4', 'L5', 'L6', 'L7', 'L8', 'L9']);
    const [bars, shapes] = o.series;
    expect(bars.data[0]!.itemStyle.color).toBe('#b7791f');
    expect(bars.data.slice(1).every((d) => d.itemStyle.color === '#1b7f79')).toBe(true);
    expect(shapes.data[0]!.symbol).toBe('triangle');
    expect(shapes.data[0]!.label).toMatchObject({ show: true, formatter: 'straggler' });
    expect(shapes.data[5]!.symbol).toBe('circle');
    expect(shapes.data[5]!.label.show).toBe(false);
    // Lines at ±5 % and ±1 %; the axis reaches beyond the 1 % line.
    expect(bars.markLine.data.map((m) => m.yAxis).sort((a, b) => a - b)).toEqual(
      [-hLines.indicator1, -hLines.indicator5, hLines.indicator5, hLines.indicator1].sort(
        (a, b) => a - b,
      ),
    );
    expect(o.yAxis.max).toBeGreaterThan(hLines.indicator1);
    expect(o.yAxis.min).toBe(-o.yAxis.max);
  });

  it('k: lines only above zero, a missing k is left out, an outlier is a carmine diamond', () => {
    const lines = { indicator1: mandelKIndicator(4, 3, 0.01), indicator5: 1.5 };
    const o = mandelOption(
      'k',
      [
        { code: 'A', value: 0.4 },
        { code: 'B', value: null },
        { code: 'C', value: 1.95 },
      ],
      lines,
      'k',
    ) as { xAxis: { data: string[] }; yAxis: { min: number }; series: [BarSeries, ShapeSeries] };
    expect(o.xAxis.data).toEqual(['A', 'C']);
    expect(o.yAxis.min).toBe(0);
    expect(o.series[0].markLine.data).toHaveLength(2);
    expect(o.series[1].data[1]).toMatchObject({ symbol: 'diamond' });
    expect(o.series[0].data[1]!.itemStyle.color).toBe('#a4262c');
  });

  it('writes a text alternative naming the indicators and the flagged labs', () => {
    expect(mandelText('h', hBars, hLines, 'Creosote')).toBe(
      `Creosote: Mandel's h of 9 labs, from -1.70 to 2.10. Indicators ±1.777 (5 %) and ±2.127 (1 %). Beyond them: L1 2.10 (straggler).`,
    );
    expect(mandelText('k', [{ code: 'A', value: null }], null, 'T')).toBe(
      "T: Mandel's k could not be computed.",
    );
  });

  it('level dependence: points per level and the fitted relation drawn across the levels', () => {
    const points = [
      { label: 'A', m: 100, sr: 1, sR: 2 },
      { label: 'B', m: 200, sr: 2, sR: 4 },
      { label: 'C', m: 400, sr: null, sR: 8 },
    ];
    const fits = {
      sr: { name: 's_r = 0.01·m', fn: (m: number) => 0.01 * m },
      sR: { name: 's_R = 0.02·m', fn: (m: number) => 0.02 * m },
    };
    const o = levelDependenceOption(points, fits, 'nm', 'Level dependence') as {
      series: { name: string; data: number[][] }[];
    };
    expect(o.series[0]!.data).toEqual([
      [100, 1],
      [200, 2],
    ]);
    expect(o.series[1]!.data).toHaveLength(3);
    const fitted = o.series[3]!.data;
    expect(fitted[0]).toEqual([100, 2]);
    expect(fitted[fitted.length - 1]![0]).toBe(400);
    expect(fitted[fitted.length - 1]![1]).toBeCloseTo(8, 12);
    expect(o.series[3]!.name).toBe('s_R: s_R = 0.02·m');
    expect(levelDependenceText(points, { sr: null, sR: fits.sR }, 'nm', 'T')).toContain(
      'C: m = 400.00 nm, s_r = —, s_R = 8.00. Fitted: s_r not fitted; s_R s_R = 0.02·m.',
    );
  });
});
