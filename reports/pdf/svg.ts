/**
 * Draws the SVG that ECharts' server-side renderer writes into a pdfkit document with pdfkit's
 * own vector primitives (pdfkit has no SVG import and `svg-to-pdfkit` is not installed). It
 * understands what that renderer emits: <rect>, <path> (pdfkit parses SVG path data), <circle>,
 * <line>, <text> and <g> groups, with `transform`, fill/stroke colours and opacities, stroke
 * width and dash arrays, and clip paths (`<g clip-path="url(#id)">` clips to the path in
 * <defs>). Nothing inside <defs> or <style> is drawn: ECharts writes `<defs >` with a space and
 * puts it after the shapes, and a clip path's own shape is filled black (drawing it painted the
 * black box over the Track record chart). CSS hover rules are ignored.
 *
 * svg-to-pdfkit was considered: it draws text with one font per element, while our PDFs switch
 * between Noto Sans subset files inside one string (σ, ζ live in the greek file), so the small
 * drawer below stays.
 */
import type PDFDocument from 'pdfkit';
import { FONT, fontRuns, printable } from './fonts';

type Doc = InstanceType<typeof PDFDocument>;
type Matrix = [number, number, number, number, number, number];

interface Paint {
  colour: string;
  opacity: number;
}

function attrs(src: string): Record<string, string> {
  const out: Record<string, string> = {};
  for (const m of src.matchAll(/([\w:-]+)="([^"]*)"/g)) out[m[1]!] = m[2]!;
  return out;
}

function unescapeXml(s: string): string {
  return s
    .replace(/&lt;/g, '<')
    .replace(/&gt;/g, '>')
    .replace(/&quot;/g, '"')
    .replace(/&#39;|&apos;/g, "'")
    .replace(/&#x([0-9a-f]+);/gi, (_m, h: string) => String.fromCodePoint(parseInt(h, 16)))
    .replace(/&#(\d+);/g, (_m, d: string) => String.fromCodePoint(Number(d)))
    .replace(/&amp;/g, '&');
}

/** SVG colour → pdfkit colour and opacity; null for none/transparent. */
export function paint(value: string | undefined, opacity = 1): Paint | null {
  if (!value || value === 'none' || value === 'transparent') return null;
  const rgba = /^rgba?\(([^)]+)\)$/.exec(value.trim());
  if (rgba) {
    const [r, g, b, a] = rgba[1]!.split(',').map((x) => Number(x.trim()));
    const hex =
      '#' +
      [r, g, b]
        .map((v) =>
          Math.max(0, Math.min(255, Math.round(v ?? 0)))
            .toString(16)
            .padStart(2, '0'),
        )
        .join('');
    const alpha = (a ?? 1) * opacity;
    return alpha <= 0 ? null : { colour: hex, opacity: alpha };
  }
  return opacity <= 0 ? null : { colour: value, opacity };
}

function parseTransform(t: string | undefined): Matrix | null {
  if (!t) return null;
  let m: Matrix = [1, 0, 0, 1, 0, 0];
  for (const part of t.matchAll(/(matrix|translate|scale|rotate)\(([^)]*)\)/g)) {
    const n = part[2]!
      .split(/[\s,]+/)
      .filter(Boolean)
      .map(Number);
    let next: Matrix;
    if (part[1] === 'matrix') next = [n[0]!, n[1]!, n[2]!, n[3]!, n[4]!, n[5]!];
    else if (part[1] === 'translate') next = [1, 0, 0, 1, n[0] ?? 0, n[1] ?? 0];
    else if (part[1] === 'scale') next = [n[0]!, 0, 0, n[1] ?? n[0]!, 0, 0];
    else {
      const a = ((n[0] ?? 0) * Math.PI) / 180;
      next = [Math.cos(a), Math.sin(a), -Math.sin(a), Math.cos(a), 0, 0];
    }
    m = multiply(m, next);
  }
  return m;
}

function multiply(a: Matrix, b: Matrix): Matrix {
  return [
    a[0] * b[0] + a[2] * b[1],
    a[1] * b[0] + a[3] * b[1],
    a[0] * b[2] + a[2] * b[3],
    a[1] * b[2] + a[3] * b[3],
    a[0] * b[4] + a[2] * b[5] + a[4],
    a[1] * b[4] + a[3] * b[5] + a[5],
  ];
}

function styleValue(style: string | undefined, key: string): string | undefined {
  if (!style) return undefined;
  const m = new RegExp(`(?:^|;)\\s*${key}\\s*:\\s*([^;]+)`).exec(style);
  return m?.[1]?.trim();
}

function applyPaint(
  doc: Doc,
  a: Record<string, string>,
): { fill: Paint | null; stroke: Paint | null } {
  const op = Number(a['opacity'] ?? 1);
  const fill = paint(
    a['fill'] ?? (a['fill'] === undefined && a['stroke'] === undefined ? '#000' : undefined),
    op * Number(a['fill-opacity'] ?? 1),
  );
  const stroke =
    a['stroke-width'] === '0' ? null : paint(a['stroke'], op * Number(a['stroke-opacity'] ?? 1));
  if (fill) doc.fillColor(fill.colour, fill.opacity);
  if (stroke) {
    doc.strokeColor(stroke.colour, stroke.opacity);
    doc.lineWidth(Number(a['stroke-width'] ?? 1));
    const dash = a['stroke-dasharray'];
    if (dash && dash !== 'none') {
      const [on, off] = dash.split(/[\s,]+/).map(Number);
      doc.dash(on ?? 2, { space: off ?? on ?? 2 });
    } else doc.undash();
    if (a['stroke-linecap']) doc.lineCap(a['stroke-linecap'] as 'round');
  }
  return { fill, stroke };
}

function finish(doc: Doc, p: { fill: Paint | null; stroke: Paint | null }): void {
  if (p.fill && p.stroke) doc.fillAndStroke();
  else if (p.fill) doc.fill();
  else if (p.stroke) doc.stroke();
}

function drawText(doc: Doc, a: Record<string, string>, raw: string): void {
  const text = printable(unescapeXml(raw));
  if (!text.trim()) return;
  const size = parseFloat(styleValue(a['style'], 'font-size') ?? '12');
  const bold = /bold|[6-9]00/.test(styleValue(a['style'], 'font-weight') ?? '');
  const fill = paint(
    a['fill'] ?? '#000',
    Number(a['fill-opacity'] ?? 1) * Number(a['opacity'] ?? 1),
  );
  if (!fill) return;
  const font = bold ? FONT.bold : FONT.regular;
  const runs = fontRuns(text);
  let width = 0;
  for (const r of runs)
    width += doc
      .font(font + r.subset)
      .fontSize(size)
      .widthOfString(r.text);
  const anchor = a['text-anchor'] ?? 'start';
  let x = Number(a['x'] ?? 0) - (anchor === 'middle' ? width / 2 : anchor === 'end' ? width : 0);
  const baseline = a['dominant-baseline'] ?? 'alphabetic';
  // pdfkit places the top of the line box at y; Noto's ascender is ~1.07 em, cap centre ~0.72 em.
  const y =
    Number(a['y'] ?? 0) -
    size *
      (baseline === 'central' || baseline === 'middle'
        ? 0.72
        : baseline === 'hanging'
          ? 0.35
          : 1.07);
  doc.fillColor(fill.colour, fill.opacity);
  for (const r of runs) {
    doc
      .font(font + r.subset)
      .fontSize(size)
      .text(r.text, x, y, { lineBreak: false });
    x += doc.widthOfString(r.text);
  }
}

/**
 * Draws an SVG string at (x, y), scaled to `width` points wide.
 * @returns the height drawn, in points.
 */
export function drawSvg(doc: Doc, svg: string, x: number, y: number, width: number): number {
  const root = /<svg([^>]*)>/.exec(svg);
  const ra = attrs(root?.[1] ?? '');
  const vw = Number(ra['width'] ?? 400);
  const vh = Number(ra['height'] ?? 300);
  const scale = width / vw;
  doc.save();
  doc.transform(scale, 0, 0, scale, x, y);
  const clips = new Map<string, string>();
  for (const c of svg.matchAll(/<clipPath\b([^>]*)>([\s\S]*?)<\/clipPath>/g)) {
    const id = attrs(c[1]!)['id'];
    const d = /<path\b[^>]*\bd="([^"]*)"/.exec(c[2]!)?.[1];
    if (id && d) clips.set(id, d);
  }
  const body = svg
    .replace(/<defs\b[\s\S]*?<\/defs\s*>/g, '')
    .replace(/<style\b[\s\S]*?<\/style\s*>/g, '');
  const keepX = doc.x;
  const keepY = doc.y;
  const re =
    /<(\/?)(g|rect|path|circle|ellipse|line|polyline|polygon|text)\b([^>]*?)(\/?)>(?:([^<]*)<\/text>)?/g;
  let depth = 0;
  for (const m of body.matchAll(re)) {
    const [, close, tag, src, selfClose, textBody] = m;
    if (tag === 'g') {
      if (close) {
        if (depth > 0) {
          doc.restore();
          depth--;
        }
      } else if (!selfClose) {
        doc.save();
        depth++;
        const ga = attrs(src!);
        const t = parseTransform(ga['transform']);
        if (t) doc.transform(...t);
        const clipId = /url\(#([^)]+)\)/.exec(ga['clip-path'] ?? '')?.[1];
        const clip = clipId ? clips.get(clipId) : undefined;
        if (clip) doc.path(clip).clip();
      }
      continue;
    }
    if (close) continue;
    const a = attrs(src!);
    const t = parseTransform(a['transform']);
    doc.save();
    if (t) doc.transform(...t);
    if (tag === 'text') drawText(doc, a, textBody ?? '');
    else {
      const p = applyPaint(doc, a);
      if (p.fill || p.stroke) {
        if (tag === 'path') doc.path(a['d'] ?? '');
        else if (tag === 'rect')
          doc.rect(
            Number(a['x'] ?? 0),
            Number(a['y'] ?? 0),
            Number(a['width'] ?? 0),
            Number(a['height'] ?? 0),
          );
        else if (tag === 'circle')
          doc.circle(Number(a['cx'] ?? 0), Number(a['cy'] ?? 0), Number(a['r'] ?? 0));
        else if (tag === 'ellipse')
          doc.ellipse(
            Number(a['cx'] ?? 0),
            Number(a['cy'] ?? 0),
            Number(a['rx'] ?? 0),
            Number(a['ry'] ?? 0),
          );
        else if (tag === 'line')
          doc
            .moveTo(Number(a['x1'] ?? 0), Number(a['y1'] ?? 0))
            .lineTo(Number(a['x2'] ?? 0), Number(a['y2'] ?? 0));
        else {
          const pts = (a['points'] ?? '')
            .trim()
            .split(/[\s,]+/)
            .map(Number);
          const poly: [number, number][] = [];
          for (let i = 0; i + 1 < pts.length; i += 2) poly.push([pts[i]!, pts[i + 1]!]);
          if (poly.length) {
            if (tag === 'polygon') doc.polygon(...poly);
            else {
              doc.moveTo(...poly[0]!);
              for (const q of poly.slice(1)) doc.lineTo(...q);
            }
          }
        }
        finish(doc, p);
      }
    }
    doc.restore();
  }
  while (depth-- > 0) doc.restore();
  doc.restore();
  doc.undash();
  // Text drawn inside the chart moved pdfkit's cursor; the caller flows on below the chart.
  doc.x = keepX;
  doc.y = keepY;
  return vh * scale;
}
