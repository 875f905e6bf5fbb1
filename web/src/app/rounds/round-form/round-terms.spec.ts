import type { RoundUpdate } from '@ringlet/shared/contracts/rounds';
import { SAFETY_BLOCK } from '@ringlet/shared/contracts/safety';
import { aRound } from './round-fixture';
import {
  changedFields,
  composeInstructions,
  NEW_ROUND_TERMS,
  roundTermsFromForm,
  roundTermsOf,
} from './round-terms';

const next = (fields: object) => fields as Required<RoundUpdate>;

describe('round terms', () => {
  it('turns the form into contract fields: cents, ISO time, no empty dates, upper-case currency', () => {
    const terms = roundTermsFromForm({
      ...NEW_ROUND_TERMS,
      title: 'Spring',
      resultsDueAt: '2026-06-30T12:00',
      fee: 350.5,
      currency: ' eur ',
    });
    expect(terms).toEqual({
      title: 'Spring',
      enrolmentClosesOn: null,
      dispatchOn: null,
      resultsDueAt: new Date(2026, 5, 30, 12, 0).toISOString(),
      protocolTemperatureC: 25,
      feeMinor: 35050,
      currency: 'EUR',
    });
  });

  it('leaves a cleared fee or temperature empty for the schema to name', () => {
    const terms = roundTermsFromForm({ ...NEW_ROUND_TERMS, fee: null, protocolTemperatureC: null });
    expect(terms.feeMinor).toBeNull();
    expect(terms.protocolTemperatureC).toBeNull();
  });

  it('reads a stored round back into the form unchanged', () => {
    const round = aRound();
    const form = roundTermsOf(round);
    expect(form.fee).toBe(350);
    const back = roundTermsFromForm(form);
    expect(back.resultsDueAt).toBe(round.resultsDueAt);
    expect(back.enrolmentClosesOn).toBe('2026-04-30');
  });

  it('keeps the safety block first and sends only what changed', () => {
    expect(composeInstructions('  ')).toBe(SAFETY_BLOCK);
    expect(composeInstructions('Shake gently.')).toBe(`${SAFETY_BLOCK}\n\nShake gently.`);
    const round = aRound();
    const same = { ...roundTermsFromForm(roundTermsOf(round)), instructions: round.instructions };
    expect(changedFields(round, next({ ...same, feeMinor: 45000 }))).toEqual({
      feeMinor: 45000,
    });
    expect(changedFields(round, next(same))).toEqual({});
  });
});
