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
const MATH = join(
  require.resolve('@fontsource/noto-sans-math/package.json'),
  '..',
  'files',
  'noto-sans-math-latin-400-normal.woff',
);

export type Subset = '' | '-ext' | '-greek' | '-math';

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
    doc.registerFont(`${name}-math`, MATH);
  }
}

/** Which registered subset draws a character. */
function subsetOf(ch: number): Subset {
  if (ch >= 0x0370 && ch <= 0x03ff) return '-greek';
  // Mathematical Operators (U+2200–U+22FF): ≤ ≥ √ ∑ ≈ …; ± × · are in the latin file.
  if (ch >= 0x2200 && ch <= 0x22ff && ch !== 0x2212) return '-math';
  if (ch >= 0x0100 && ch <= 0x024f) return '-ext';
  return '';
}

/** Splits text into runs drawn by one subset each (most text is one latin run). */
export function fontRuns(text: string): { text: string; subset: Subset }[] {
  const runs: { text: string; subset: Subset }[] = [];
  for (const ch of text) {
    const s = subsetOf(ch.codePointAt(0)!);
    const last = runs[runs.length - 1];
    if (last && last.subset === s) last.text += ch;
    else runs.push({ text: ch, subset: s });
  }
  return runs;
}

/** Characters none of our font files has, replaced by look-alikes (subscript digits). */
const REPLACE: Record<string, string> = {
  '₁': '1',
  '₂': '2',
};

export function printable(text: string): string {
  return text.replace(/[₁₂]/g, (c) => REPLACE[c] ?? c);
}
