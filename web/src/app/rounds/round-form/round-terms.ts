import type { NonNullableFormBuilder } from '@angular/forms';
import type { RoundDetail, RoundUpdate } from '@ringlet/shared/contracts/rounds';
import { SAFETY_BLOCK } from '@ringlet/shared/contracts/safety';
import { isoToLocal, localToIso, numberOrNull } from '../../shared/form-values';
import { pathMap } from '../../shared/form-submit';

/** A round's terms as the new-round and edit-round forms hold them (dates as the inputs show them). */
export interface RoundTermsForm {
  title: string;
  enrolmentClosesOn: string;
  dispatchOn: string;
  resultsDueAt: string;
  protocolTemperatureC: number | null;
  /** In major units (the contract's feeMinor is in cents). */
  fee: number | null;
  currency: string;
}

/** A new round's terms: 25 °C protocol temperature (common practice for DLS), no fee, in EUR. */
export const NEW_ROUND_TERMS: RoundTermsForm = {
  title: '',
  enrolmentClosesOn: '',
  dispatchOn: '',
  resultsDueAt: '',
  protocolTemperatureC: 25,
  fee: 0,
  currency: 'EUR',
};

/** The terms of a stored round, for the edit form. */
export function roundTermsOf(round: RoundDetail): RoundTermsForm {
  return {
    title: round.title,
    enrolmentClosesOn: round.enrolmentClosesOn ?? '',
    dispatchOn: round.dispatchOn ?? '',
    resultsDueAt: isoToLocal(round.resultsDueAt),
    protocolTemperatureC: round.protocolTemperatureC,
    fee: round.feeMinor / 100,
    currency: round.currency,
  };
}

/** The form controls of the terms; the fee and currency are off once the fee is fixed. */
export function roundTermsControls(fb: NonNullableFormBuilder, v: RoundTermsForm, feeOpen = true) {
  return {
    title: fb.control(v.title),
    enrolmentClosesOn: fb.control(v.enrolmentClosesOn),
    dispatchOn: fb.control(v.dispatchOn),
    resultsDueAt: fb.control(v.resultsDueAt),
    protocolTemperatureC: fb.control<number | null>(v.protocolTemperatureC),
    fee: fb.control<number | null>({ value: v.fee, disabled: !feeOpen }),
    currency: fb.control({ value: v.currency, disabled: !feeOpen }),
  };
}

/** The fee is typed in major units; the contract's feeMinor errors belong under it. */
export const ROUND_TERMS_PATHS = pathMap('', { feeMinor: 'fee' });

/** The contract's fields from the form (the shared schema checks them). */
export function roundTermsFromForm(raw: RoundTermsForm) {
  const fee = numberOrNull(raw.fee);
  return {
    title: raw.title,
    enrolmentClosesOn: raw.enrolmentClosesOn || null,
    dispatchOn: raw.dispatchOn || null,
    resultsDueAt: localToIso(raw.resultsDueAt),
    protocolTemperatureC: numberOrNull(raw.protocolTemperatureC),
    feeMinor: fee === null ? null : Math.round(fee * 100),
    currency: raw.currency.trim().toUpperCase(),
  };
}

/**
 * The instructions as stored: the standard safety block first (it cannot be removed; the server
 * adds it too), then the coordinator's text, which may add further cautions.
 */
export function composeInstructions(body: string): string {
  const text = body.trim();
  return text ? `${SAFETY_BLOCK}\n\n${text}` : SAFETY_BLOCK;
}

/** Only the fields that differ from the round (so the audit trail records what changed). */
export function changedFields(
  round: RoundDetail,
  next: Required<RoundUpdate>,
): Partial<RoundUpdate> {
  const out: Partial<Record<keyof RoundUpdate, unknown>> = {};
  for (const key of Object.keys(next) as (keyof RoundUpdate)[]) {
    const before =
      key === 'resultsDueAt' && round.resultsDueAt
        ? new Date(round.resultsDueAt).toISOString()
        : round[key];
    if (next[key] !== before) out[key] = next[key];
  }
  return out as Partial<RoundUpdate>;
}
