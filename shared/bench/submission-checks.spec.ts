import { checkResults, instrumentCheckNotice, type RoundRules } from './submission-checks';

const I1 = '00000000-0000-4000-8000-000000000001';
const I2 = '00000000-0000-4000-8000-000000000002';
const MZ = '00000000-0000-4000-8000-0000000000a1';
const MP = '00000000-0000-4000-8000-0000000000a2';
const round: RoundRules = {
  protocolTemperatureC: 25,
  items: [
    { id: I1, code: 'A', nominalSizeNm: 100 },
    { id: I2, code: 'B', nominalSizeNm: 60 },
  ],
  measurands: [
    { id: MZ, key: 'z_average', name: 'Z-average', unit: 'nm', replicatesRequired: 3 },
    { id: MP, key: 'pdi', name: 'PDI', unit: '1', replicatesRequired: 3 },
  ],
};
const item = (
  id: string,
  z: (number | null)[],
  p: (number | null)[],
  conditions: Record<string, unknown> = {},
) => ({
  testItemId: id,
  results: [
    { measurandId: MZ, replicates: z },
    { measurandId: MP, replicates: p },
  ],
  conditions: { temperatureC: 25, viscosityMPas: 0.89, dispersant: 'water', ...conditions },
});

describe('checkResults', () => {
  it('accepts clean complete results with no warnings', () => {
    const r = checkResults(
      {
        items: [
          item(I1, [101, 102, 101.5], [0.05, 0.06, 0.055]),
          item(I2, [61, 60.5, 61.2], [0.1, 0.11, 0.1]),
        ],
      },
      round,
      true,
    );
    expect(r.errors).toEqual([]);
    expect(r.warnings).toEqual([]);
  });

  it('refuses a PDI outside 0–1 and a diameter ≤ 0, naming the run', () => {
    const r = checkResults({ items: [item(I1, [101, 0, 101], [0.05, 1.2, -0.01])] }, round, false);
    expect(r.errors.map((e) => [e.path, e.code])).toEqual([
      ['items.0.results.0.replicates.1', 'diameter-not-positive'],
      ['items.0.results.1.replicates.1', 'pdi-out-of-range'],
      ['items.0.results.1.replicates.2', 'pdi-out-of-range'],
    ]);
  });

  it('needs every replicate and item only when complete', () => {
    const data = { items: [item(I1, [101, null, 101], [0.05, 0.05, 0.05])] };
    expect(checkResults(data, round, false).errors).toEqual([]);
    const r = checkResults(data, round, true);
    expect(r.errors.map((e) => e.message)).toEqual([
      'A Z-average: replicate 2 of 3 is missing.',
      'B: no results given.',
    ]);
  });

  it('flags a temperature more than 1 K from the protocol (common practice)', () => {
    const r = checkResults(
      {
        items: [
          item(I1, [101, 101, 101], [0.05, 0.05, 0.05], {
            temperatureC: 20,
            viscosityMPas: 1.0016,
          }),
        ],
      },
      round,
      false,
    );
    expect(r.warnings.map((w) => w.code)).toEqual([`temperature-far:${I1}`]);
  });

  it('flags a replicate spread above 5 % of the mean (common practice)', () => {
    // (106 − 100)/102 = 5.9 % > 5 %; (104 − 100)/102 = 3.9 % is fine
    expect(
      checkResults(
        { items: [item(I1, [100, 100, 106], [0.05, 0.05, 0.05])] },
        round,
        false,
      ).warnings.map((w) => w.kind),
    ).toEqual(['wide-spread']);
    expect(
      checkResults({ items: [item(I1, [100, 102, 104], [0.05, 0.05, 0.05])] }, round, false)
        .warnings,
    ).toEqual([]);
  });

  it('flags a viscosity that is not water at the stated temperature (IAPWS R12-08: 0.8900 mPa s at 25 °C, 1.0016 at 20 °C)', () => {
    // the 20 °C viscosity entered for a 25 °C measurement: 12.5 % off
    const r = checkResults(
      { items: [item(I1, [101, 101, 101], [0.05, 0.05, 0.05], { viscosityMPas: 1.0016 })] },
      round,
      false,
    );
    expect(r.warnings.map((w) => w.kind)).toEqual(['viscosity-mismatch']);
    expect(r.warnings[0]!.message).toContain('0.8900');
    // 0.8903 is within 2 % of 0.8900
    expect(
      checkResults(
        { items: [item(I1, [101, 101, 101], [0.05, 0.05, 0.05], { viscosityMPas: 0.8903 })] },
        round,
        false,
      ).warnings,
    ).toEqual([]);
    // not water: not compared
    expect(
      checkResults(
        {
          items: [
            item(I1, [101, 101, 101], [0.05, 0.05, 0.05], {
              viscosityMPas: 0.5,
              dispersant: 'ethanol',
            }),
          ],
        },
        round,
        false,
      ).warnings,
    ).toEqual([]);
  });

  it('hints at a radius reported instead of a diameter and tracks acknowledgements', () => {
    const data = {
      items: [item(I1, [50.5, 50.2, 50.8], [0.05, 0.05, 0.05])],
      acknowledgedWarnings: [] as string[],
    };
    const r = checkResults(data, round, false);
    expect(r.warnings.map((w) => w.code)).toEqual([`blunder-radius-diameter:${I1}:${MZ}`]);
    expect(r.warnings[0]!.message).toContain('radius');
    expect(r.unacknowledged).toHaveLength(1);
    const acked = checkResults(
      { ...data, acknowledgedWarnings: [`blunder-radius-diameter:${I1}:${MZ}`] },
      round,
      false,
    );
    expect(acked.unacknowledged).toEqual([]);
  });

  it('describes a missing or failed instrument check', () => {
    expect(instrumentCheckNotice(null)).toContain('No instrument check');
    expect(
      instrumentCheckNotice({
        passed: false,
        instrument: 'Sizer 1',
        checkedAt: '2026-01-01T00:00:00Z',
      }),
    ).toContain('failed');
    expect(
      instrumentCheckNotice({
        passed: true,
        instrument: 'Sizer 1',
        checkedAt: '2026-01-01T00:00:00Z',
      }),
    ).toBeNull();
  });
});
