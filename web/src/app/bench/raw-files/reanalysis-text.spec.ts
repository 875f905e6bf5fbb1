import { fileRefusal, parametersText } from './reanalysis-text';

describe('raw-data file rules', () => {
  it('refuses a file over 20 MB and optics out of range, before any upload', () => {
    expect(fileRefusal({ name: 'a.csv', size: 21 * 1024 * 1024 }, null, null)).toBe(
      'a.csv is larger than 20 MB.',
    );
    expect(fileRefusal({ name: 'a.csv', size: 10 }, 150, null)).toMatch(/^Laser wavelength/);
    expect(fileRefusal({ name: 'a.csv', size: 10 }, null, 180)).toMatch(/^Scattering angle/);
    expect(fileRefusal({ name: 'a.csv', size: 10 }, 633, 173)).toBeNull();
  });
  it('names the values Ringlet assumed', () => {
    const text = parametersText({
      parameters: {
        wavelengthNm: 633,
        angleDeg: 173,
        temperatureC: 25,
        viscosityMPas: 0.89,
        refractiveIndex: 1.33,
      },
      assumed: ['angleDeg'],
    });
    expect(text).toBe(
      'Used: 633 nm, 173° (assumed), 25 °C, viscosity 0.8900 mPa·s, refractive index 1.3300.' +
        ' Assumed because not given: angle.',
    );
  });
});
