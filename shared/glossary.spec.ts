/**
 * The retired words of docs/GLOSSARY.md must not come back in what people read: the text of web
 * templates and TS strings, shared label text, API descriptions and mail texts, and the report
 * builders. Only string literals and template text are read (comments and identifiers are code).
 * SCANNED lists the folders; the lead runs this after merging everyone's branch.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';

const ROOT = join(__dirname, '..');

/** Folders scanned, with the file endings read. Spec files and test fixtures are skipped. */
export const SCANNED: readonly { dir: string; ext: readonly string[] }[] = [
  { dir: 'web/src/app', ext: ['.ts', '.html'] },
  { dir: 'shared/contracts', ext: ['.ts'] },
  { dir: 'shared/bench', ext: ['.ts'] },
  { dir: 'shared/evaluation', ext: ['.ts'] },
  { dir: 'shared/stats', ext: ['.ts'] },
  { dir: 'shared/dls', ext: ['.ts'] },
  { dir: 'api/src/mail', ext: ['.ts'] },
  { dir: 'api/src/routes', ext: ['.ts'] },
  { dir: 'api/src/services', ext: ['.ts'] },
  { dir: 'reports', ext: ['.ts'] },
];
const SKIP = [/\.spec\.ts$/, /\.e2e\.ts$/, /\/testing\//];

/** Retired word → the glossary's word. Patterns are case-sensitive where the lower-case form is code. */
export const RETIRED: readonly { pattern: RegExp; use: string }[] = [
  {
    pattern:
      /\bRuns? (\d|n\b|\{\{|\$\{)|>Runs?<|'Runs?'|\bAdd a run\b|\bruns? (\d|\{\{|\$\{)|\bthe runs\b/,
    use: 'Replicate',
  },
  { pattern: /\bRep\. ?SD\b/, use: 'Replicate SD' },
  { pattern: /\bCommit(ted)?\b|\bcommitted\b/, use: 'Approve / approved for publication' },
  { pattern: /\bForced?\b|\bforced\b|\bneeds force\b/, use: 'Close early' },
  { pattern: /\bKey\b|\b[Mm]easurand keys?\b/, use: 'File code' },
  { pattern: /\bVerdict\b|\bPasse[sd]\b|\bFails\b/, use: 'Pass / Fail, column "Result"' },
  { pattern: /\b(participant|lab) reports?\b/i, use: 'Individual report' },
  { pattern: /\bparticipating labs?\b/i, use: 'Lab' },
  { pattern: /\bLaborator(y|ies)\b/, use: 'Lab' },
  { pattern: /\bcheck of effectiveness\b/i, use: 'Effectiveness check' },
  { pattern: /\b(homogeneity|stability) checks?\b/i, use: 'Homogeneity study / Stability study' },
  {
    pattern: /\bthe consensus\b(?! (value|[Bb]oard))/i,
    use: 'the assigned value (a consensus value is one way to derive it)',
  },
  {
    pattern: /\bwiden-sigma-pt\b|\bin-transit\b|\barrived-warm\b|\bconfirmed-blunder\b/,
    use: 'a label for the code value',
  },
];

/** String literals and template literals of a TS file (comments skipped). */
export function stringsOf(source: string): string[] {
  const out: string[] = [];
  let i = 0;
  while (i < source.length) {
    const c = source[i]!;
    const next = source[i + 1];
    if (c === '/' && next === '/') {
      i = source.indexOf('\n', i);
      if (i < 0) break;
    } else if (c === '/' && next === '*') {
      i = source.indexOf('*/', i + 2);
      if (i < 0) break;
      i += 2;
    } else if (c === "'" || c === '"' || c === '`') {
      let j = i + 1;
      let text = '';
      while (j < source.length && source[j] !== c) {
        if (source[j] === '\\') {
          text += source[j + 1] ?? '';
          j += 2;
          continue;
        }
        if (c !== '`' && source[j] === '\n') break;
        text += source[j];
        j++;
      }
      out.push(text);
      i = j + 1;
    } else {
      i++;
    }
  }
  return out;
}

/** Code inside a text: quoted code values ('committed'), property paths (t.forced), bindings. */
function withoutCode(text: string): string {
  return text
    .replace(/(['"])[a-z0-9_./-]*\1/g, '')
    .replace(/\.\w+/g, '')
    .replace(/\b[\w.-]+=("[^"]*"|'[^']*')/g, (m) =>
      /^(aria-label|title|label|placeholder)=/.test(m) ? m : '',
    )
    .replace(/\[[\w.-]+\]|\([\w.-]+\)/g, '');
}

/** A literal that is itself a code value (no spaces, no capitals): an enum value, a path, a key. */
const isCodeValue = (s: string) => /^[a-z0-9_./:{}$@#?=&-]*$/.test(s);

export function findRetired(text: string): { word: string; use: string }[] {
  const clean = withoutCode(text);
  const found: { word: string; use: string }[] = [];
  for (const r of RETIRED) {
    const m = r.pattern.exec(clean);
    if (m) found.push({ word: m[0], use: r.use });
  }
  return found;
}

function* files(dir: string, ext: readonly string[]): Generator<string> {
  for (const name of readdirSync(dir)) {
    const full = join(dir, name);
    if (statSync(full).isDirectory()) yield* files(full, ext);
    else if (ext.some((e) => name.endsWith(e)) && !SKIP.some((s) => s.test(full))) yield full;
  }
}

describe('retired words (docs/GLOSSARY.md)', () => {
  it('flags each retired word in a sample and leaves code values alone', () => {
    expect(findRetired('<th scope="col">Run {{ k + 1 }}</th>')[0]?.use).toBe('Replicate');
    expect(findRetired("headerName: 'Rep. SD'")[0]?.use).toBe('Replicate SD');
    expect(findRetired('Evaluation committed: the round is evaluated.')[0]?.use).toMatch(/Approve/);
    expect(findRetired('Force: close before results are due')[0]?.use).toBe('Close early');
    expect(findRetired('the participant report of lab P07')[0]?.use).toBe('Individual report');
    expect(findRetired('Check of effectiveness')[0]?.use).toBe('Effectiveness check');
    expect(findRetired('Decision: widen-sigma-pt')[0]?.use).toMatch(/label/);
    expect(findRetired('The result is about half the consensus: a radius?')[0]?.use).toMatch(
      /assigned value/,
    );
    expect(findRetired('the consensus value of the round')).toEqual([]);
    // code in a template is not text
    expect(
      findRetired(
        `@if (v.state === 'committed') { <button (click)="commit()" data-testid="commit">Approve</button> }`,
      ),
    ).toEqual([]);
    expect(findRetired("{{ t.forced ? ' (closed early)' : '' }}")).toEqual([]);
    expect(isCodeValue('widen-sigma-pt')).toBe(true);
    expect(isCodeValue('Widen σ_pt')).toBe(false);
  });

  it.each(SCANNED.map((s) => [s.dir, s.ext] as const))('%s has none', (dir, ext) => {
    const hits: string[] = [];
    let scanned = 0;
    for (const file of files(join(ROOT, dir), ext)) {
      scanned++;
      const source = readFileSync(file, 'utf8');
      const texts = file.endsWith('.html')
        ? [source]
        : stringsOf(source).filter((s) => !isCodeValue(s));
      for (const t of texts) {
        for (const f of findRetired(t))
          hits.push(`${relative(ROOT, file)}: "${f.word}" → ${f.use}`);
      }
    }
    expect(scanned).toBeGreaterThan(0);
    expect(hits).toEqual([]);
  });
});
