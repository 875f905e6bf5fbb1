import { blunderHints, VISCOSITY_20_25_RATIO } from './blunder-hints';

const codes = (h: ReturnType<typeof blunderHints>) => h.map((x) => x.code);

describe('blunderHints (signatures from docs/DLS.md; tolerances common practice)', () => {
  it('no hint for an ordinary result', () => {
    expect(blunderHints({ result: 101, assignedValue: 100, sigmaPt: 3 })).toEqual([]);
    expect(blunderHints({ result: 103, assignedValue: 100 })).toEqual([]);
  });

  it('radius for diameter: ×0.5 and ×2 (Stokes–Einstein radius vs diameter form)', () => {
    const half = blunderHints({ result: 51, assignedValue: 100, sigmaPt: 3 });
    expect(codes(half)).toEqual(['radius-diameter']);
    expect(half[0].factor).toBe(0.5);
    expect(half[0].message).toMatch(/radius/);
    expect(blunderHints({ result: 196, assignedValue: 100, sigmaPt: 3 })[0]).toMatchObject({
      code: 'radius-diameter',
      factor: 2,
    });
  });

  it('unit slip ×1000 and ×0.001', () => {
    expect(blunderHints({ result: 101000, assignedValue: 100 })[0]).toMatchObject({
      code: 'unit-slip',
      factor: 1000,
    });
    expect(blunderHints({ result: 0.1002, assignedValue: 100 })[0]).toMatchObject({
      code: 'unit-slip',
      factor: 0.001,
    });
  });

  it('20 °C sample analysed with 25 °C viscosity: ×1.1254 (IAPWS 2008 via docs/DLS.md)', () => {
    expect(VISCOSITY_20_25_RATIO).toBeCloseTo(1.1254, 4);
    const h = blunderHints({ result: 112.5, assignedValue: 100, sigmaPt: 3 });
    expect(h[0]).toMatchObject({ code: 'viscosity-temperature' });
    expect(h[0].factor).toBeCloseTo(1.1254, 4);
    expect(blunderHints({ result: 88.9, assignedValue: 100, sigmaPt: 3 })[0].code).toBe(
      'viscosity-temperature',
    );
  });

  it('a few % off reads as a temperature offset at 2.6 %/K compounded: ×1.08 ≈ 3.0 K (docs/DLS.md sensitivity)', () => {
    const h = blunderHints({ result: 108, assignedValue: 100, sigmaPt: 3 });
    expect(codes(h)).toEqual(['viscosity-temperature']);
    expect(h[0].message).toMatch(/about 3\.0 K/);
  });

  it('dust or aggregates: high PDI with high size', () => {
    const h = blunderHints({
      result: 140,
      assignedValue: 100,
      sigmaPt: 3,
      pdi: 0.42,
      assignedPdi: 0.05,
    });
    expect(codes(h)).toContain('dust-aggregates');
    // high PDI alone with a normal size: nothing
    expect(blunderHints({ result: 101, assignedValue: 100, sigmaPt: 3, pdi: 0.42 })).toEqual([]);
    // high size with an ordinary PDI: no dust hint
    expect(
      codes(
        blunderHints({ result: 140, assignedValue: 100, sigmaPt: 3, pdi: 0.08, assignedPdi: 0.05 }),
      ),
    ).not.toContain('dust-aggregates');
  });

  it('never changes the input and ignores unusable numbers', () => {
    const input = Object.freeze({ result: 50, assignedValue: 100, sigmaPt: 3 });
    blunderHints(input);
    expect(input.result).toBe(50);
    expect(blunderHints({ result: -5, assignedValue: 100 })).toEqual([]);
    expect(blunderHints({ result: NaN, assignedValue: 100 })).toEqual([]);
  });
});
