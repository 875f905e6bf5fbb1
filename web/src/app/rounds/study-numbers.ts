import type { Study } from '@ringlet/shared/contracts/rounds';

/** "100.2 100.4\n99.8, 100.1" → [[100.2, 100.4], [99.8, 100.1]] (spaces, commas, semicolons or tabs). NaN stays for the schema to reject. */
export function parseReplicateText(text: string): number[][] {
  return text
    .split(/\r?\n/)
    .map((l) => l.trim())
    .filter(Boolean)
    .map((l) =>
      l
        .split(/[\s,;]+/)
        .filter(Boolean)
        .map((c) => Number(c)),
    );
}

const count = (x: unknown) => (typeof x === 'number' ? String(x) : '—');
const f = (x: unknown, digits = 4) => (typeof x === 'number' ? x.toPrecision(digits) : '—');

/** The check's numbers in one line, as the coordinator reads them (ISO 13528 Annex B symbols). */
export function studyNumbers(s: Study): string {
  const r = s.result as Record<string, unknown>;
  if (s.kind === 'homogeneity') {
    return (
      `g = ${count(r['g'])}, m = ${count(r['m'])}, mean ${f(r['generalMean'], 6)}; s_x ${f(r['sx'])}, s_w ${f(r['sw'])}, s_s ${f(r['ss'])} ` +
      `vs 0.3σ_pt ${f(r['limit'])} (${r['passes'] ? 'met' : 'not met'}); extended ${r['passesExtended'] ? 'met' : 'not met'}; widened σ_pt ${f(r['widenedSigmaPt'])}`
    );
  }
  return (
    `ȳ₁ ${f(r['meanFirst'], 6)}, ȳ₂ ${f(r['meanSecond'], 6)}, |ȳ₁ − ȳ₂| ${f(r['difference'])} vs 0.3σ_pt ${f(r['limit'])} ` +
    `(${r['passes'] ? 'met' : 'not met'}); extended limit ${f(r['extendedLimit'])} (${r['passesExtended'] ? 'met' : 'not met'})`
  );
}
