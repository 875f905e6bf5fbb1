/**
 * The repository stands alone (docs/QUALITY.md, "Tests"): no tracked file may point at a design
 * folder outside the repository, every `docs/<page>.md` a file names must exist, and every
 * relative link in the handbook must resolve.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, normalize } from 'node:path';

const ROOT = join(__dirname, '..', '..');
const SELF = 'api/src/docs-links.spec.ts';

/**
 * Pages written on a parallel branch: a reference to them may exist before the page does.
 * Remove an entry once its page is in docs/.
 */
const PENDING_PAGES = new Set(['GLOSSARY.md']);

const BINARY = /\.(png|jpe?g|gif|ico|xlsx|pdf|zip|ttf|woff2?|otf|gz)$/i;

function trackedTextFiles(): string[] {
  const out = execFileSync('git', ['ls-files', '-z'], {
    cwd: ROOT,
    encoding: 'utf8',
    maxBuffer: 64 * 1024 * 1024,
  });
  return out
    .split('\0')
    .filter((f) => f && f !== SELF && !BINARY.test(f) && !f.startsWith('node_modules/'))
    .filter((f) => existsSync(join(ROOT, f)) && statSync(join(ROOT, f)).size < 2_000_000);
}

function read(file: string): string {
  return readFileSync(join(ROOT, file), 'utf8');
}

/** 1-based line numbers where `re` matches. */
function hits(text: string, re: RegExp): number[] {
  const lines: number[] = [];
  text.split('\n').forEach((line, i) => {
    re.lastIndex = 0;
    if (re.test(line)) lines.push(i + 1);
  });
  return lines;
}

const files = trackedTextFiles();

describe('the handbook lives in docs/', () => {
  it('finds the tracked files (the check below would pass vacuously otherwise)', () => {
    expect(files).toContain('docs/README.md');
    expect(files).toContain('DEVELOPERS.md');
    expect(files.length).toBeGreaterThan(100);
  });

  it('no tracked file refers to a design folder outside the repository', () => {
    // Built from parts so this file does not match itself.
    const outside = [
      ['shared', 'design'].join('/'),
      ['', 'work', 'shared'].join('/'),
      ['design', 'handbook'].join(' '),
    ];
    const outsidePage = new RegExp(
      `(^|[^\\w/-])${'design'}/(ARCHITECTURE|STATISTICS|DLS|QUALITY|VOCABULARY|STYLE|TOOLCHAIN)\\.md`,
    );
    const found: string[] = [];
    for (const f of files) {
      const text = read(f);
      for (const s of outside) {
        for (const line of hits(text, new RegExp(s.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&'), 'i')))
          found.push(`${f}:${line} (${s})`);
      }
      for (const line of hits(text, outsidePage)) found.push(`${f}:${line} (design/… page)`);
    }
    expect(found).toEqual([]);
  });

  it('every docs/<page>.md named in a tracked file exists', () => {
    const missing: string[] = [];
    for (const f of files) {
      const text = read(f);
      const re = /(?:^|[^\w/.-])docs\/([A-Za-z0-9_-]+\.md)/g;
      text.split('\n').forEach((line, i) => {
        for (const m of line.matchAll(re)) {
          const page = m[1]!;
          if (!existsSync(join(ROOT, 'docs', page)) && !PENDING_PAGES.has(page))
            missing.push(`${f}:${i + 1} docs/${page}`);
        }
      });
    }
    expect(missing).toEqual([]);
  });

  it('every relative link in docs/*.md and DEVELOPERS.md resolves', () => {
    const broken: string[] = [];
    const pages = files.filter(
      (f) =>
        (f.startsWith('docs/') && f.endsWith('.md')) || f === 'DEVELOPERS.md' || f === 'README.md',
    );
    for (const f of pages) {
      const text = read(f);
      text.split('\n').forEach((line, i) => {
        for (const m of line.matchAll(/\]\(([^)\s]+)\)/g)) {
          const target = m[1]!.split('#')[0]!;
          if (!target || /^[a-z]+:/i.test(target)) continue; // anchors and absolute URLs
          const path = normalize(join(dirname(f), target));
          const page = path.startsWith('docs/') ? path.slice('docs/'.length) : '';
          if (!existsSync(join(ROOT, path)) && !PENDING_PAGES.has(page))
            broken.push(`${f}:${i + 1} ${m[1]}`);
        }
      });
    }
    expect(broken).toEqual([]);
  });
});
