/**
 * Server-side chart rendering: ECharts' own SSR renderer turns an option into an SVG string
 * (no browser, no canvas). The PDF builders draw that SVG with reports/pdf/svg.ts.
 */
import * as echarts from 'echarts';

/** Renders an ECharts option to SVG text at width × height (CSS px = PDF pt at scale 1). */
export function renderChartSvg(
  option: Record<string, unknown>,
  width: number,
  height: number,
): string {
  const chart = echarts.init(null, null, { renderer: 'svg', ssr: true, width, height });
  try {
    chart.setOption(option);
    return chart.renderToSVGString();
  } finally {
    chart.dispose();
  }
}
