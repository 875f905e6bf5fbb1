import { renderChartSvg } from '../charts/render';
import { figure, plotArea, type Doc } from './document';
import { drawSvg } from './svg';

/** Where a chart lands on the page: its top left corner and its width, in PDF points. */
export interface ChartBox {
  x: number;
  y: number;
  width: number;
}

/**
 * Draws an ECharts option, rendered at svgW × svgH, as a Figure with its text alternative and its
 * plot area (for the page-layout checks), scaled to the box's width; returns the height drawn.
 */
export function chartFigure(
  doc: Doc,
  option: Record<string, unknown>,
  alt: string,
  svg: { w: number; h: number },
  box: ChartBox,
): number {
  let height = 0;
  figure(
    doc,
    alt,
    () => {
      height = drawSvg(doc, renderChartSvg(option, svg.w, svg.h), box.x, box.y, box.width);
    },
    plotArea(option, svg.w, svg.h, box.x, box.y, box.width),
  );
  return height;
}
