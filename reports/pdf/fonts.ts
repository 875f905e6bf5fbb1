/**
 * Noto Sans for the PDFs, embedded from the @fontsource/noto-sans package shipped with the app
 * (nothing downloaded). The package has WOFF and WOFF2 files split by script (latin,
 * latin-ext, greek, …); pdfkit reads WOFF through fontkit, so we register the latin, latin-ext
 * and greek subsets and draw each run of text with the subset that holds its characters
 * (σ, ζ come from the greek file).
 */
import { join } from 'node:path';
import type PDFDocument from 'pdfkit';

type Doc = InstanceType<typeof PDFDocument>;

const DIR = join(require.resolve('@fontsource/noto-sans/package.json'), '..', 'files');
const file = (subset: string, weight: number) =>
  join(DIR, `noto-sans-${subset}-${weight}-normal.woff`);

export const FONT = { regular: 'Noto', bold: 'NotoBold' } as const;
export type FontName = (typeof FONT)[keyof typeof FONT];

/** Registers the fonts on a document (the file bytes are read once per process by pdfkit). */
export function registerFonts(doc: Doc): void {
  for (const [name, weight] of [
    [FONT.regular, 400],
    [FONT.bold, 700],
  ] as const) {
    doc.registerFont(name, file('latin', weight));
    doc.registerFont(`${name}-ext`, file('latin-ext', weight));
    doc.registerFont(`${name}-greek`, file('greek', weight));
  }
}

/** Which registered subset draws a character. */
function subsetOf(ch: number): '' | '-ext' | '-greek' {
  if (ch >= 0x0370 && ch <= 0x03ff) return '-greek';
  if (ch >= 0x0100 && ch <= 0x024f) return '-ext';
  return '';
}

/** Splits text into runs drawn by one subset each (most text is one latin run). */
export function fontRuns(text: string): { text: string; subset: '' | '-ext' | '-greek' }[] {
  const runs: { text: string; subset: '' | '-ext' | '-greek' }[] = [];
  for (const ch of text) {
    const s = subsetOf(ch.codePointAt(0)!);
    const last = runs[runs.length - 1];
    if (last && last.subset === s) last.text += ch;
    else runs.push({ text: ch, subset: s });
  }
  return runs;
}

/** Characters our subsets lack, replaced by look-alikes the latin file has. */
const REPLACE: Record<string, string> = {
  '≤': '<=',
  '≥': '>=',
  '√': 'sqrt',
  '₁': '1',
  '₂': '2',
  ȳ: 'y',
};

export function printable(text: string): string {
  // "√p" would print as "sqrtp": a root over a bare symbol gets parentheses, sqrt(p).
  return text
    .replace(/√([\p{L}\p{N}_*]+)/gu, 'sqrt($1)')
    .replace(/[≤≥√₁₂ȳ]/g, (c) => REPLACE[c] ?? c);
}
