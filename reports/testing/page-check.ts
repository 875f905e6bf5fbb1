/**
 * Page checks for the PDF builders' tests: renders every page with Debian's poppler-utils
 * (pdftoppm, pdftotext; the `poppler-utils` package) and looks at the result: large solid-black
 * regions (a shape painted where none belongs, as a clip path drawn as a filled box once
 * was), and words of flowing text inside a chart's plot area.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { PlotArea } from '../pdf/document';

export const DPI = 50;

interface Gray {
  width: number;
  height: number;
  data: Buffer;
}

/** Parses a binary PGM (P5, maxval 255) as pdftoppm -gray writes it. */
function parsePgm(buf: Buffer): Gray {
  let pos = 0;
  const token = (): string => {
    while (/\s/.test(String.fromCharCode(buf[pos]!))) pos++;
    if (buf[pos] === 0x23) {
      while (buf[pos] !== 0x0a) pos++;
      return token();
    }
    const start = pos;
    while (!/\s/.test(String.fromCharCode(buf[pos]!))) pos++;
    return buf.subarray(start, pos).toString('ascii');
  };
  if (token() !== 'P5') throw new Error('not a binary PGM');
  const width = Number(token());
  const height = Number(token());
  token(); // maxval
  pos++;
  return { width, height, data: buf.subarray(pos, pos + width * height) };
}

/** Renders every page to grayscale at DPI; one image per page. */
export function renderPages(pdf: Buffer): Gray[] {
  const dir = mkdtempSync(join(tmpdir(), 'ringlet-pages-'));
  try {
    writeFileSync(join(dir, 'in.pdf'), pdf);
    execFileSync('pdftoppm', ['-gray', '-r', String(DPI), join(dir, 'in.pdf'), join(dir, 'p')]);
    return readdirSync(dir)
      .filter((f) => f.endsWith('.pgm'))
      .sort((a, b) => Number(/(\d+)\.pgm$/.exec(a)![1]) - Number(/(\d+)\.pgm$/.exec(b)![1]))
      .map((f) => parsePgm(readFileSync(join(dir, f))));
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

const CELL = 10; // pixels; 10 px at 50 dpi = 14.4 pt

/**
 * The largest connected region of solid-black cells on a page, in points² (a cell is solid
 * black when 90 % of its pixels are darker than 40 of 255; text never fills a cell like that).
 */
export function largestBlackArea(img: Gray): number {
  const cols = Math.floor(img.width / CELL);
  const rows = Math.floor(img.height / CELL);
  const black = new Uint8Array(cols * rows);
  for (let r = 0; r < rows; r++) {
    for (let c = 0; c < cols; c++) {
      let dark = 0;
      for (let y = r * CELL; y < (r + 1) * CELL; y++)
        for (let x = c * CELL; x < (c + 1) * CELL; x++)
          if (img.data[y * img.width + x]! < 40) dark++;
      black[r * cols + c] = dark >= 0.9 * CELL * CELL ? 1 : 0;
    }
  }
  let best = 0;
  const seen = new Uint8Array(cols * rows);
  for (let i = 0; i < black.length; i++) {
    if (!black[i] || seen[i]) continue;
    let size = 0;
    const stack = [i];
    seen[i] = 1;
    while (stack.length) {
      const j = stack.pop()!;
      size++;
      const r = Math.floor(j / cols);
      const c = j % cols;
      for (const [nr, nc] of [
        [r - 1, c],
        [r + 1, c],
        [r, c - 1],
        [r, c + 1],
      ] as const) {
        const k = nr * cols + nc;
        if (nr >= 0 && nr < rows && nc >= 0 && nc < cols && black[k] && !seen[k]) {
          seen[k] = 1;
          stack.push(k);
        }
      }
    }
    best = Math.max(best, size);
  }
  const pt = (CELL * 72) / DPI;
  return best * pt * pt;
}

export interface Word {
  page: number;
  text: string;
  x: number;
  y: number;
  width: number;
  height: number;
}

/** Every word with its box in points from the page's top left (pdftotext -bbox). */
export function words(pdf: Buffer): Word[] {
  const dir = mkdtempSync(join(tmpdir(), 'ringlet-words-'));
  try {
    writeFileSync(join(dir, 'in.pdf'), pdf);
    const html = execFileSync('pdftotext', ['-bbox', join(dir, 'in.pdf'), '-'], {
      maxBuffer: 64 * 1024 * 1024,
    }).toString('utf8');
    const out: Word[] = [];
    let page = -1;
    for (const m of html.matchAll(
      /<page\b|<word xMin="([\d.]+)" yMin="([\d.]+)" xMax="([\d.]+)" yMax="([\d.]+)">([^<]*)<\/word>/g,
    )) {
      if (m[0] === '<page') {
        page++;
        continue;
      }
      const [x0, y0, x1, y1] = [m[1], m[2], m[3], m[4]].map(Number) as [
        number,
        number,
        number,
        number,
      ];
      out.push({
        page,
        text: m[5]!.replace(/&amp;/g, '&').replace(/&lt;/g, '<').replace(/&gt;/g, '>'),
        x: x0,
        y: y0,
        width: x1 - x0,
        height: y1 - y0,
      });
    }
    return out;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/**
 * Words with a letter whose centre lies inside a chart's plot area. A chart writes only
 * numbers inside its plot area (the value of a bar or mark drawn at the axis edge); its titles,
 * legends and limit labels sit outside. So a word with letters there is text printed over the chart.
 */
export function wordsOverPlots(all: Word[], plots: PlotArea[]): Word[] {
  return all.filter((w) => {
    if (!/\p{L}/u.test(w.text)) return false;
    const cx = w.x + w.width / 2;
    const cy = w.y + w.height / 2;
    return plots.some(
      (p) => p.page === w.page && cx > p.x && cx < p.x + p.width && cy > p.y && cy < p.y + p.height,
    );
  });
}
