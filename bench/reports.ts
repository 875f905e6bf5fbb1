/**
 * Report speed (docs/QUALITY.md): the round workbook (≤ 2 s) and the round PDF with charts
 * (≤ 6 s) for a 1,000-participant round × 2 items × 2 measurands × 3 replicates. The input is
 * built directly (reports/testing/synthetic-input.ts, seeded, invented values), as the API's
 * report service would gather it from the stored evaluation; one untimed warm-up run each.
 */
import { buildRoundWorkbook } from '../reports/excel/round-workbook';
import { buildRoundReportPdf } from '../reports/pdf/round-report';
import { syntheticReportInput } from '../reports/testing/synthetic-input';

async function timeAsync(
  fn: () => Promise<unknown>,
  runs: number,
): Promise<{ median_ms: number; p95_ms: number; runs: number }> {
  await fn();
  const t: number[] = [];
  for (let i = 0; i < runs; i++) {
    const s = performance.now();
    await fn();
    t.push(performance.now() - s);
  }
  t.sort((a, b) => a - b);
  const rank = (q: number) => t[Math.min(t.length - 1, Math.ceil(q * t.length) - 1)]!;
  return { median_ms: Math.round(rank(0.5)), p95_ms: Math.round(rank(0.95)), runs };
}

export async function benchReports(): Promise<
  { name: string; median_ms: number; p95_ms: number; runs: number; target?: string }[]
> {
  const input = syntheticReportInput({ participants: 1000, blunders: [3, 17, 400] });
  return [
    {
      name: 'round workbook, 1,000 participants',
      ...(await timeAsync(() => buildRoundWorkbook(input), 5)),
      target: '≤ 2000 ms',
    },
    {
      name: 'round PDF with charts, 1,000 participants',
      ...(await timeAsync(() => buildRoundReportPdf(input), 5)),
      target: '≤ 6000 ms',
    },
  ];
}
