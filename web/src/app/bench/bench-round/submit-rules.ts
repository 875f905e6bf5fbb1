import { instrumentCheckNotice, type CheckOutcome } from '@ringlet/shared/bench/submission-checks';
import type { InstrumentCheck } from '@ringlet/shared/contracts/bench';
import type { SubmissionData } from '@ringlet/shared/contracts/submission';

/**
 * The instrument check that speaks for these results: the newest check of an instrument named in
 * the results' conditions, or the lab's newest check when no instrument is named yet. The list is
 * newest first.
 */
export function latestCheckFor(
  data: Pick<SubmissionData, 'items'> | null,
  checks: readonly InstrumentCheck[],
): InstrumentCheck | null {
  const names = new Set(
    (data?.items ?? []).map((i) => i.conditions.instrument.trim().toLowerCase()).filter(Boolean),
  );
  if (!names.size) return checks[0] ?? null;
  return checks.find((c) => names.has(c.instrument.trim().toLowerCase())) ?? null;
}

/** The notice shown beside the results when their instrument check is missing or failed. */
export function checkNoticeFor(
  data: Pick<SubmissionData, 'items'> | null,
  checks: readonly InstrumentCheck[],
): string | null {
  const latest = latestCheckFor(data, checks);
  return instrumentCheckNotice(
    latest
      ? {
          passed: latest.verdict.passed,
          instrument: latest.instrument,
          checkedAt: latest.checkedAt,
        }
      : null,
  );
}

/**
 * Why the results cannot be submitted yet, or null when they can: the first blocking error of the
 * complete check, then unacknowledged warnings, then a check notice with no explanation.
 */
export function submitBlocker(
  full: Pick<CheckOutcome, 'errors' | 'unacknowledged'>,
  checkNotice: string | null,
  explanation: string,
): string | null {
  if (full.errors.length) return full.errors[0]!.message;
  if (full.unacknowledged.length)
    return `Acknowledge ${full.unacknowledged.length} warning(s) first.`;
  if (checkNotice && !explanation.trim()) return checkNotice;
  return null;
}

/** The submitted versions with a new one in front (once, even when the answer came twice). */
export function withVersion<V extends { version: number }>(versions: readonly V[], added: V): V[] {
  return versions.some((x) => x.version === added.version) ? [...versions] : [added, ...versions];
}
