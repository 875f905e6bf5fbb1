import { AssessorGrantCreate, EvaluationSettings } from './evaluation';
import { InstrumentCheckRun } from './bench';
import { DATE_MAX, DATE_MIN, GRANT_MAX_YEARS, RANGES, textProblem } from './ranges';
import { MeasurandInput, RoundCreate, RoundUpdate, TestItemInput } from './rounds';
import { MeasurementConditions, SubmissionData } from './submission';

const UUID = (n: number) => `00000000-0000-4000-8000-${String(n).padStart(12, '0')}`;
const paths = (r: { success: boolean; error?: { issues: { path: PropertyKey[] }[] } }) =>
  (r.error?.issues ?? []).map((i) => i.path.join('.'));

describe('plausible ranges in the request schemas', () => {
  it.each([
    [
      'a diameter of 1e308 nm',
      { zAverageNm: 1e308, pdi: 0.05, temperatureC: 25, equilibrationMin: 5 },
      'zAverageNm',
    ],
    [
      'a diameter of 1e-300 nm',
      { zAverageNm: 1e-300, pdi: 0.05, temperatureC: 25, equilibrationMin: 5 },
      'zAverageNm',
    ],
    ['a PDI of 1.5', { zAverageNm: 100, pdi: 1.5, temperatureC: 25, equilibrationMin: 5 }, 'pdi'],
    [
      'a temperature of 120 °C',
      { zAverageNm: 100, pdi: 0.05, temperatureC: 120, equilibrationMin: 5 },
      'temperatureC',
    ],
  ])('refuses %s in an instrument check run, naming the field', (_l, run, field) => {
    expect(paths(InstrumentCheckRun.safeParse(run))).toEqual([field]);
  });

  it('accepts the bounds themselves and refuses just outside them', () => {
    const ok = (v: number) => MeasurementConditions.safeParse({ viscosityMPas: v }).success;
    expect([
      ok(RANGES.viscosityMPas.min),
      ok(RANGES.viscosityMPas.max),
      ok(0.1),
      ok(1e308),
    ]).toEqual([true, true, false, false]);
  });

  it('refuses σ_pt of 1e-320 and a reference value of 1e308', () => {
    const m = (over: object) =>
      MeasurandInput.safeParse({
        key: 'z_average',
        name: 'Z',
        unit: 'nm',
        decimals: 1,
        replicatesRequired: 3,
        ...over,
      });
    expect(paths(m({ sigmaPtRule: { kind: 'fixed', value: 1e-320 } }))).toEqual([
      'sigmaPtRule.value',
    ]);
    expect(
      paths(
        m({ assignedValueRule: { kind: 'reference', value: 1e308, u: 1, source: 'certificate' } }),
      ),
    ).toEqual(['assignedValueRule.value']);
    expect(
      paths(
        EvaluationSettings.safeParse({
          sigmaPtOverrides: [
            { measurandKey: 'pdi', rule: { kind: 'fixed', value: 1e-320 }, reason: 'why not' },
          ],
        }),
      ),
    ).toEqual(['sigmaPtOverrides.0.rule.value']);
    expect(
      TestItemInput.safeParse({ code: 'A', material: 'latex', nominalSizeNm: 1e308 }).success,
    ).toBe(false);
  });

  it(`refuses dates outside ${DATE_MIN}…${DATE_MAX} and out of order`, () => {
    const base = { schemeId: UUID(1), code: 'DLS-1', title: 'Round' };
    expect(paths(RoundCreate.safeParse({ ...base, resultsDueAt: '1900-01-01T00:00:00Z' }))).toEqual(
      ['resultsDueAt'],
    );
    expect(paths(RoundCreate.safeParse({ ...base, dispatchOn: '9999-01-01' }))).toEqual([
      'dispatchOn',
    ]);
    expect(
      paths(
        RoundCreate.safeParse({
          ...base,
          dispatchOn: '2026-05-01',
          resultsDueAt: '2026-04-01T00:00:00Z',
        }),
      ),
    ).toEqual(['resultsDueAt']);
    expect(
      paths(
        RoundUpdate.safeParse({ dispatchOn: '2026-05-01', resultsDueAt: '2026-04-01T00:00:00Z' }),
      ),
    ).toEqual(['resultsDueAt']);
    expect(
      RoundCreate.safeParse({
        ...base,
        dispatchOn: '2026-04-01',
        resultsDueAt: '2026-05-01T17:00:00Z',
      }).success,
    ).toBe(true);
  });

  it(`refuses a grant that ends before it starts, or more than ${GRANT_MAX_YEARS} years later`, () => {
    const g = (startsOn: string, endsOn: string | null) =>
      paths(AssessorGrantCreate.safeParse({ email: 'a@b.test', startsOn, endsOn }));
    expect(g('2026-05-01', '2026-04-30')).toEqual(['endsOn']);
    expect(g('2026-05-01', '9999-12-31')).toEqual(['endsOn']);
    expect(g('2026-05-01', '2032-05-01')).toEqual(['endsOn']);
    expect(g('2026-05-01', '2031-04-30')).toEqual([]);
    expect(g('2026-05-01', null)).toEqual([]);
  });

  it('refuses an item or a measurand named twice, naming the duplicate', () => {
    const res = (m: string) => ({ measurandId: m, replicates: [100], uncertainty: null });
    expect(
      paths(
        SubmissionData.safeParse({
          items: [
            { testItemId: UUID(1), results: [] },
            { testItemId: UUID(1), results: [] },
          ],
        }),
      ),
    ).toEqual(['items.1.testItemId']);
    expect(
      paths(
        SubmissionData.safeParse({
          items: [{ testItemId: UUID(1), results: [res(UUID(2)), res(UUID(3)), res(UUID(2))] }],
        }),
      ),
    ).toEqual(['items.0.results.2.measurandId']);
  });

  it('names NUL, other control characters and lone surrogates, and lets tabs, line breaks and emoji through', () => {
    expect(textProblem('a\u0000b')).toContain('U+0000');
    expect(textProblem('\u001b[31m')).toContain('U+001B');
    expect(textProblem('x\ud800')).toContain('lone surrogate');
    expect(textProblem('\udc00x')).toContain('lone surrogate');
    expect(textProblem('line\nbreak\ttab\r\n, Größe 100 nm ±2 % \u{1F52C}')).toBeNull();
  });
});
