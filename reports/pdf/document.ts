/**
 * The frame every Ringlet PDF shares: A4, Noto Sans embedded, a footer on every page with the
 * round, the evaluation version, the record checksum and the page number, and a reissue banner
 * when the evaluation corrects an earlier version. Text helpers switch font subsets per run.
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
}

export const MARGIN = 50;

export function createDoc(meta: DocMeta): { doc: Doc; done: Promise<Buffer> } {
  const doc = new PDFDocument({
    size: 'A4',
    layout: meta.landscape ? 'landscape' : 'portrait',
    margins: { top: MARGIN, bottom: MARGIN + 10, left: MARGIN, right: MARGIN },
    bufferPages: true,
    // A fixed creation date keeps the bytes of a rebuilt report comparable.
    info: { Title: meta.title, Subject: meta.subject, Author: 'Ringlet', Creator: 'Ringlet', Producer: 'Ringlet', CreationDate: new Date(0) },
    pdfVersion: '1.7',
  });
  registerFonts(doc);
  doc.font(FONT.regular);
  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  (doc as Doc & { ringletFooter?: string }).ringletFooter = meta.footer;
  return { doc, done };
}

/** Writes the footer on every page and ends the document. */
export function finishDoc(doc: Doc): void {
  const footer = (doc as Doc & { ringletFooter?: string }).ringletFooter ?? '';
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const y = doc.page.height - MARGIN + 8;
    const bottom = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    doc.moveTo(MARGIN, y - 4).lineTo(doc.page.width - MARGIN, y - 4).lineWidth(0.5).strokeColor(PALETTE.rule, 1).stroke();
    doc.font(FONT.regular).fontSize(7).fillColor(PALETTE.grey, 1);
    doc.text(footer, MARGIN, y, { width: doc.page.width - 2 * MARGIN - 60, lineBreak: false });
    doc.text(`page ${i + 1} of ${range.count}`, doc.page.width - MARGIN - 60, y, { width: 60, align: 'right', lineBreak: false });
    doc.page.margins.bottom = bottom;
  }
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
}

/** Flowing text, wrapped to the page width, switching font subsets (σ, ζ) as needed. */
export function write(doc: Doc, text: string, o: WriteOptions = {}): void {
  const base = o.bold ? FONT.bold : FONT.regular;
  const runs = fontRuns(printable(text));
  doc.fontSize(o.size ?? 10).fillColor(o.colour ?? '#1a1f26', 1);
  const width = o.width ?? doc.page.width - doc.page.margins.left - doc.page.margins.right;
  runs.forEach((r, i) => {
    doc.font(base + r.subset);
    const opts = { width, align: o.align ?? 'left', continued: i < runs.length - 1, paragraphGap: o.gap ?? 2 };
    if (i === 0 && (o.x !== undefined || o.y !== undefined)) doc.text(r.text, o.x ?? doc.x, o.y ?? doc.y, opts);
    else doc.text(r.text, opts);
  });
  doc.x = o.x ?? doc.page.margins.left;
}

export function heading(doc: Doc, text: string, level: 1 | 2 | 3 = 1): void {
  const size = level === 1 ? 16 : level === 2 ? 13 : 11;
  ensureSpace(doc, size * 4);
  doc.moveDown(level === 1 ? 0.6 : 0.4);
  write(doc, text, { size, bold: true, colour: PALETTE.ink, gap: 4 });
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
  doc.rect(MARGIN, y, width, h).lineWidth(1).strokeColor(colour, 1).stroke();
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
export function table(doc: Doc, columns: Column[], rows: (string | { text: string; colour?: string; bold?: boolean })[][], size = 7.5): void {
  const rowH = size * 1.55;
  const left = doc.page.margins.left;
  const header = () => {
    let x = left;
    const y = doc.y;
    doc.rect(left, y - 1, columns.reduce((s, c) => s + c.width, 0), rowH + 1).fillColor('#e8edf3', 1).fill();
    for (const c of columns) {
      cell(doc, c.title, x, y, c.width, c.align, size, true, PALETTE.ink);
      x += c.width;
    }
    doc.y = y + rowH + 1;
  };
  ensureSpace(doc, rowH * 3);
  header();
  for (const r of rows) {
    if (doc.y + rowH > doc.page.height - doc.page.margins.bottom) {
      doc.addPage();
      header();
    }
    let x = left;
    const y = doc.y;
    r.forEach((v, i) => {
      const c = columns[i]!;
      const spec = typeof v === 'string' ? { text: v } : v;
      cell(doc, spec.text, x, y, c.width, c.align, size, spec.bold ?? false, spec.colour ?? '#1a1f26');
      x += c.width;
    });
    doc.y = y + rowH;
  }
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
  if (!map) glyphCache.set(font, (map = new Map()));
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

function cell(doc: Doc, text: string, x: number, y: number, width: number, align: 'left' | 'right' | undefined, size: number, bold: boolean, colour: string): void {
  const base = bold ? FONT.bold : FONT.regular;
  const runs = fontRuns(printable(text));
  if (runs.length === 0) return;
  const widths = runs.map((r) => quickWidth(doc, base + r.subset, r.text, size));
  const total = widths.reduce((a, b) => a + b, 0);
  let cx = align === 'right' ? x + width - 3 - total : x + 2;
  const d = doc as unknown as { _font: FastFont; page: { height: number; fonts: Record<string, unknown> }; addContent(s: string): void };
  d.addContent(`q 1 0 0 -1 0 ${d.page.height} cm BT ${rgb(colour)} rg`);
  runs.forEach((r, i) => {
    doc.font(base + r.subset);
    const font = d._font;
    if (d.page.fonts[font.id] == null) d.page.fonts[font.id] = font.ref();
    const py = d.page.height - y - (font.ascender / 1000) * size;
    d.addContent(`1 0 0 1 ${cx.toFixed(2)} ${py.toFixed(2)} Tm /${font.id} ${size} Tf [<${quickEncode(font, r.text)}>] TJ`);
    cx += widths[i]!;
  });
  d.addContent('ET Q');
}
