/**
 * The frame every Ringlet PDF shares: A4, Noto Sans embedded, a footer on every page with the
 * round, the evaluation version, the record checksum and the page number, and a reissue banner
 * when the evaluation corrects an earlier version. Text helpers switch font subsets per run.
 *
 * Every PDF is a tagged PDF (PDF 1.7, language en-GB, title shown in the viewer's title bar):
 * headings are H1–H3 structure elements and entries of the document outline (bookmarks),
 * flowing text is P, tables are Table with one TR per row, charts are Figure with a text
 * alternative, and the footer and decorations are artifacts. So text extracts in reading order.
 */
import PDFDocument from 'pdfkit';
import { FONT, fontRuns, printable, registerFonts } from './fonts';
import { PALETTE } from '../text';

export type Doc = InstanceType<typeof PDFDocument>;

export interface DocMeta {
  title: string;
  subject: string;
  footer: string;
  landscape?: boolean;
  /** Who issued the file (the PT provider), for the Author field. */
  author?: string;
  keywords?: string;
  /** The file's dates: when the report was issued (creation) and when this file was made (modification). */
  createdAt?: Date;
  modifiedAt?: Date;
}

interface DocState {
  footer: string;
  root: PDFKit.PDFStructureElement;
  outline: PDFKit.PDFOutline[];
}

const STATE = new WeakMap<Doc, DocState>();

function state(doc: Doc): DocState {
  const s = STATE.get(doc);
  if (!s) throw new Error('not a Ringlet document');
  return s;
}

/** Adds content as a structure element of the given type under the document (tagged PDF). */
export function tagged(
  doc: Doc,
  type: string,
  draw: () => void,
  options: Parameters<Doc['struct']>[1] = {},
): void {
  state(doc).root.add(doc.struct(type, options, draw));
}

/** Draws decoration (rules, frames, page furniture) as an artifact, outside the logical structure. */
export function artifact(
  doc: Doc,
  draw: () => void,
  type: 'Pagination' | 'Layout' = 'Layout',
): void {
  doc.markContent('Artifact', { type });
  draw();
  doc.endMarkedContent();
}

export const MARGIN = 50;

export function createDoc(meta: DocMeta): { doc: Doc; done: Promise<Buffer> } {
  const doc = new PDFDocument({
    size: 'A4',
    layout: meta.landscape ? 'landscape' : 'portrait',
    margins: { top: MARGIN, bottom: MARGIN + 10, left: MARGIN, right: MARGIN },
    bufferPages: true,
    info: {
      Title: meta.title,
      Subject: meta.subject,
      Author: meta.author || 'PT provider',
      Keywords:
        meta.keywords ?? 'proficiency testing, ISO/IEC 17043, ISO 13528, dynamic light scattering',
      Creator: 'Ringlet',
      Producer: 'Ringlet (pdfkit)',
      CreationDate: meta.createdAt ?? new Date(),
      ModDate: meta.modifiedAt ?? meta.createdAt ?? new Date(),
    },
    pdfVersion: '1.7',
    tagged: true,
    lang: 'en-GB',
    displayTitle: true,
  });
  registerFonts(doc);
  const root = doc.struct('Document');
  doc.addStructure(root);
  doc.font(FONT.regular);
  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  STATE.set(doc, { footer: meta.footer, root, outline: [] });
  return { doc, done };
}

/** Writes the footer on every page and ends the document. */
export function finishDoc(doc: Doc): void {
  const { footer, root } = state(doc);
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const y = doc.page.height - MARGIN + 8;
    const bottom = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    artifact(
      doc,
      () => {
        doc
          .moveTo(MARGIN, y - 4)
          .lineTo(doc.page.width - MARGIN, y - 4)
          .lineWidth(0.5)
          .strokeColor(PALETTE.rule, 1)
          .stroke();
        doc.font(FONT.regular).fontSize(7).fillColor(PALETTE.grey, 1);
        doc.text(printable(footer), MARGIN, y, {
          width: doc.page.width - 2 * MARGIN - 60,
          lineBreak: false,
        });
        doc.text(`page ${i + 1} of ${range.count}`, doc.page.width - MARGIN - 60, y, {
          width: 60,
          align: 'right',
          lineBreak: false,
        });
      },
      'Pagination',
    );
    doc.page.margins.bottom = bottom;
  }
  root.end();
  doc.end();
}

export interface WriteOptions {
  size?: number;
  bold?: boolean;
  colour?: string;
  x?: number;
  y?: number;
  width?: number;
  align?: 'left' | 'right' | 'center' | 'justify';
  gap?: number;
  /** Structure type (tagged PDF); P unless told. */
  tag?: string;
}

/** Flowing text, wrapped to the page width, switching font subsets (σ, ζ) as needed. */
export function write(doc: Doc, text: string, o: WriteOptions = {}): void {
  tagged(doc, o.tag ?? 'P', () => writeRaw(doc, text, o));
}

function writeRaw(doc: Doc, text: string, o: WriteOptions): void {
  const base = o.bold ? FONT.bold : FONT.regular;
  const runs = fontRuns(printable(text));
  doc.fontSize(o.size ?? 10).fillColor(o.colour ?? '#1a1f26', 1);
  const width = o.width ?? doc.page.width - doc.page.margins.left - doc.page.margins.right;
  runs.forEach((r, i) => {
    doc.font(base + r.subset);
    const opts = {
      width,
      align: o.align ?? 'left',
      continued: i < runs.length - 1,
      paragraphGap: o.gap ?? 2,
    };
    if (i === 0 && (o.x !== undefined || o.y !== undefined))
      doc.text(r.text, o.x ?? doc.x, o.y ?? doc.y, opts);
    else doc.text(r.text, opts);
  });
  doc.x = o.x ?? doc.page.margins.left;
}

/** A heading: H1–H3 in the structure, and an entry in the document outline (bookmarks). */
export function heading(doc: Doc, text: string, level: 1 | 2 | 3 = 1): void {
  const size = level === 1 ? 16 : level === 2 ? 13 : 11;
  ensureSpace(doc, size * 4);
  doc.moveDown(level === 1 ? 0.6 : 0.4);
  const st = state(doc);
  const parent = level === 1 ? doc.outline : (st.outline[level - 2] ?? doc.outline);
  st.outline[level - 1] = parent.addItem(printable(text));
  st.outline.length = level;
  write(doc, text, { size, bold: true, colour: PALETTE.ink, gap: 4, tag: `H${level}` });
}

export interface PlotArea {
  /** 0-based page index. */
  page: number;
  x: number;
  y: number;
  width: number;
  height: number;
}

/**
 * Where the charts' plot areas landed (PDF points from the top left), recorded only while a
 * test turns it on: the page-rendering test checks that no flowing text lands inside one.
 */
export const layoutProbe: { enabled: boolean; plots: PlotArea[] } = { enabled: false, plots: [] };

/** A chart or picture: a Figure with its text alternative (and, for a chart, its plot area). */
export function figure(
  doc: Doc,
  alt: string,
  draw: () => void,
  plot?: Omit<PlotArea, 'page'>,
): void {
  tagged(doc, 'Figure', draw, { alt: printable(alt) });
  if (plot && layoutProbe.enabled) {
    const range = doc.bufferedPageRange();
    layoutProbe.plots.push({ page: range.start + range.count - 1, ...plot });
  }
}

/** The plot area (inside the axes) of an ECharts option drawn at (x, y), `width` points wide from an svgW × svgH rendering. */
export function plotArea(
  option: Record<string, unknown>,
  svgW: number,
  svgH: number,
  x: number,
  y: number,
  width: number,
): Omit<PlotArea, 'page'> {
  const g = (option['grid'] ?? {}) as {
    left?: number;
    right?: number;
    top?: number;
    bottom?: number;
  };
  const k = width / svgW;
  const left = g.left ?? 0;
  const top = g.top ?? 0;
  return {
    x: x + left * k,
    y: y + top * k,
    width: (svgW - left - (g.right ?? 0)) * k,
    height: (svgH - top - (g.bottom ?? 0)) * k,
  };
}

/** Starts a new page when less than `points` of height remain. */
export function ensureSpace(doc: Doc, points: number): void {
  if (doc.y + points > doc.page.height - doc.page.margins.bottom) doc.addPage();
}

/** A shaded banner (reissue notices, confidentiality). */
export function banner(doc: Doc, text: string, colour: string = PALETTE.carmine): void {
  const width = doc.page.width - 2 * MARGIN;
  doc.font(FONT.bold).fontSize(10);
  const h = doc.heightOfString(printable(text), { width: width - 16 }) + 12;
  ensureSpace(doc, h + 6);
  const y = doc.y;
  artifact(doc, () => doc.rect(MARGIN, y, width, h).lineWidth(1).strokeColor(colour, 1).stroke());
  write(doc, text, { x: MARGIN + 8, y: y + 6, width: width - 16, bold: true, colour });
  doc.y = y + h + 6;
}

export interface Column {
  title: string;
  width: number;
  align?: 'left' | 'right';
}

/**
 * A fast table: fixed row height, no wrapping, numbers right-aligned by measuring the string
 * (pdfkit's own wrapping is the slow part for thousands of cells). Repeats the header on each
 * new page.
 */
export function table(
  doc: Doc,
  columns: Column[],
  rows: (string | { text: string; colour?: string; bold?: boolean })[][],
  size = 7.5,
): void {
  const rowH = size * 1.55;
  const left = doc.page.margins.left;
  const tableEl = doc.struct('Table');
  state(doc).root.add(tableEl);
  const bigTable = rows.length > 200;
  const header = (repeat: boolean) => {
    let x = left;
    const y = doc.y;
    artifact(doc, () =>
      doc
        .rect(
          left,
          y - 1,
          columns.reduce((s, c) => s + c.width, 0),
          rowH + 1,
        )
        .fillColor('#e8edf3', 1)
        .fill(),
    );
    const draw = () => {
      let hx = left;
      for (const c of columns) {
        cell(doc, c.title, hx, y, c.width, c.align, size, true, PALETTE.ink);
        hx += c.width;
      }
    };
    // The header repeated on a new page is page furniture, not a second header row.
    if (repeat) artifact(doc, draw, 'Pagination');
    else {
      const cells = columns.map((c) => {
        const cx = x;
        x += c.width;
        return doc.struct('TH', {}, () =>
          cell(doc, c.title, cx, y, c.width, c.align, size, true, PALETTE.ink),
        );
      });
      tableEl.add(doc.struct('TR', {}, cells));
    }
    doc.y = y + rowH + 1;
  };
  ensureSpace(doc, rowH * 3);
  header(false);
  for (const r of rows) {
    if (doc.y + rowH > doc.page.height - doc.page.margins.bottom) {
      doc.addPage();
      header(true);
    }
    let x = left;
    const y = doc.y;
    const drawCell = (v: (typeof r)[number], i: number, cx: number) => {
      const c = columns[i]!;
      const spec = typeof v === 'string' ? { text: v } : v;
      cell(
        doc,
        spec.text,
        cx,
        y,
        c.width,
        c.align,
        size,
        spec.bold ?? false,
        spec.colour ?? '#1a1f26',
      );
    };
    if (bigTable) {
      // Large tables: one marked row (a TD per cell costs a structure object each, seconds for 1,000 rows).
      const start = x;
      tableEl.add(
        doc.struct('TR', {}, [
          doc.struct('TD', {}, () =>
            r.reduce<number>((cx, v, i) => (drawCell(v, i, cx), cx + columns[i]!.width), start),
          ),
        ]),
      );
    } else {
      const cells = r.map((v, i) => {
        const cx = x;
        x += columns[i]!.width;
        return doc.struct('TD', {}, () => drawCell(v, i, cx));
      });
      tableEl.add(doc.struct('TR', {}, cells));
    }
    doc.y = y + rowH;
  }
  tableEl.end();
  doc.x = left;
  doc.moveDown(0.5);
}

interface FastFont {
  id: string;
  ascender: number;
  ref(): unknown;
  encode(text: string): [string[], unknown[]];
}

/**
 * Writes one table cell as a bare text object. pdfkit's text() costs ~0.2 ms a call (option
 * merging, a graphics-state push per fragment), which is seconds for a 1,000-participant
 * report; this writes the same operators pdfkit's own text fragment writes (font resource,
 * Tm, Tf, TJ with the font's glyph encoding) without the per-call set-up. Kerning pairs are
 * ignored (table cells are codes and numbers). Uses pdfkit internals (`_font`, `page.fonts`),
 * checked against pdfkit 0.17.
 */
const charWidths = new Map<string, number>();

/** Width of a string at `size` from cached per-character advances (no kerning): fast. */
function quickWidth(doc: Doc, font: string, text: string, size: number): number {
  let w = 0;
  for (const ch of text) {
    const key = font + '\u0000' + ch;
    let cw = charWidths.get(key);
    if (cw === undefined) {
      cw = doc.font(font).fontSize(1000).widthOfString(ch) / 1000;
      charWidths.set(key, cw);
    }
    w += cw;
  }
  doc.fontSize(size);
  return w * size;
}

const glyphCache = new WeakMap<FastFont, Map<string, string>>();

/** Glyph codes of a string, one character at a time through pdfkit's encoder (cached per document font). */
function quickEncode(font: FastFont, text: string): string {
  let map = glyphCache.get(font);
  if (!map) glyphCache.set(font, (map = new Map<string, string>()));
  let out = '';
  for (const ch of text) {
    let hex = map.get(ch);
    if (hex === undefined) {
      hex = font.encode(ch)[0].join('');
      map.set(ch, hex);
    }
    out += hex;
  }
  return out;
}

const rgbCache = new Map<string, string>();
function rgb(hex: string): string {
  let v = rgbCache.get(hex);
  if (!v) {
    const n = parseInt(hex.slice(1), 16);
    v = [(n >> 16) & 255, (n >> 8) & 255, n & 255].map((c) => (c / 255).toFixed(3)).join(' ');
    rgbCache.set(hex, v);
  }
  return v;
}

function cell(
  doc: Doc,
  text: string,
  x: number,
  y: number,
  width: number,
  align: 'left' | 'right' | undefined,
  size: number,
  bold: boolean,
  colour: string,
): void {
  const base = bold ? FONT.bold : FONT.regular;
  const runs = fontRuns(printable(text));
  if (runs.length === 0) return;
  const widths = runs.map((r) => quickWidth(doc, base + r.subset, r.text, size));
  const total = widths.reduce((a, b) => a + b, 0);
  let cx = align === 'right' ? x + width - 3 - total : x + 2;
  const d = doc as unknown as {
    _font: FastFont;
    page: { height: number; fonts: Record<string, unknown> };
    addContent(s: string): void;
  };
  d.addContent(`q 1 0 0 -1 0 ${d.page.height} cm BT ${rgb(colour)} rg`);
  runs.forEach((r, i) => {
    doc.font(base + r.subset);
    const font = d._font;
    if (d.page.fonts[font.id] == null) d.page.fonts[font.id] = font.ref();
    const py = d.page.height - y - (font.ascender / 1000) * size;
    d.addContent(
      `1 0 0 1 ${cx.toFixed(2)} ${py.toFixed(2)} Tm /${font.id} ${size} Tf [<${quickEncode(font, r.text)}>] TJ`,
    );
    cx += widths[i]!;
  });
  d.addContent('ET Q');
}

/**
 * A table whose cells wrap (few rows: test items, studies, exclusions). Row height follows
 * the tallest cell; the header repeats on a new page.
 */
export function wrapTable(doc: Doc, columns: Column[], rows: string[][], size = 8): void {
  const left = doc.page.margins.left;
  const pad = 2;
  const total = columns.reduce((s, c) => s + c.width, 0);
  const tableEl = doc.struct('Table');
  state(doc).root.add(tableEl);
  const rowHeight = (r: string[], bold: boolean) => {
    doc.font(bold ? FONT.bold : FONT.regular).fontSize(size);
    return (
      Math.max(
        ...r.map((t, i) =>
          doc.heightOfString(printable(t) || ' ', { width: columns[i]!.width - 2 * pad }),
        ),
      ) +
      2 * pad
    );
  };
  const drawRow = (r: string[], bold: boolean, tag: 'TH' | 'TD', asArtifact: boolean) => {
    const h = rowHeight(r, bold);
    if (doc.y + h > doc.page.height - doc.page.margins.bottom) {
      doc.addPage();
      if (tag === 'TD')
        drawRow(
          columns.map((c) => c.title),
          true,
          'TH',
          true,
        );
    }
    const y = doc.y;
    if (bold) artifact(doc, () => doc.rect(left, y, total, h).fillColor('#e8edf3', 1).fill());
    else
      artifact(doc, () =>
        doc
          .moveTo(left, y + h)
          .lineTo(left + total, y + h)
          .lineWidth(0.3)
          .strokeColor(PALETTE.rule, 1)
          .stroke(),
      );
    let x = left;
    const lefts = columns.map((c) => {
      const cx = x;
      x += c.width;
      return cx;
    });
    const drawCell = (t: string, i: number) => {
      const c = columns[i]!;
      writeRaw(doc, t || ' ', {
        x: lefts[i]! + pad,
        y: y + pad,
        width: c.width - 2 * pad,
        size,
        bold,
        colour: bold ? PALETTE.ink : '#1a1f26',
        align: c.align ?? 'left',
        gap: 0,
      });
    };
    if (asArtifact) artifact(doc, () => r.forEach(drawCell), 'Pagination');
    else
      tableEl.add(
        doc.struct(
          'TR',
          {},
          r.map((t, i) => doc.struct(tag, {}, () => drawCell(t, i))),
        ),
      );
    doc.y = y + h;
  };
  ensureSpace(doc, 40);
  drawRow(
    columns.map((c) => c.title),
    true,
    'TH',
    false,
  );
  for (const r of rows) drawRow(r, false, 'TD', false);
  tableEl.end();
  doc.x = left;
  doc.moveDown(0.5);
}
