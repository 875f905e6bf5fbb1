import type { Reanalysis } from '@ringlet/shared/contracts/bench';

const PARAMETER_LABELS: Record<Reanalysis['assumed'][number], string> = {
  temperatureC: 'temperature',
  viscosityMPas: 'viscosity',
  refractiveIndex: 'refractive index',
  wavelengthNm: 'wavelength',
  angleDeg: 'angle',
};

/** The physics a re-analysis used, naming the values Ringlet assumed. */
export function parametersText(ra: Pick<Reanalysis, 'parameters' | 'assumed'>): string {
  const p = ra.parameters;
  const mark = (k: Reanalysis['assumed'][number]) => (ra.assumed.includes(k) ? ' (assumed)' : '');
  const parts = [
    `${p.wavelengthNm} nm${mark('wavelengthNm')}`,
    `${p.angleDeg}°${mark('angleDeg')}`,
    `${p.temperatureC} °C${mark('temperatureC')}`,
    `viscosity ${p.viscosityMPas.toFixed(4)} mPa·s${mark('viscosityMPas')}`,
    `refractive index ${p.refractiveIndex.toFixed(4)}${mark('refractiveIndex')}`,
  ];
  const assumed = ra.assumed.map((k) => PARAMETER_LABELS[k]);
  return (
    `Used: ${parts.join(', ')}.` +
    (assumed.length ? ` Assumed because not given: ${assumed.join(', ')}.` : '')
  );
}

/** Why a raw-data file is refused before upload (size, wavelength, angle), or null. */
export function fileRefusal(
  file: Pick<File, 'name' | 'size'>,
  wavelength: number | null,
  angle: number | null,
): string | null {
  if (file.size > 20 * 1024 * 1024) return `${file.name} is larger than 20 MB.`;
  if (wavelength !== null && !(wavelength >= 200 && wavelength <= 2000))
    return 'Laser wavelength: give a value from 200 to 2000 nm, or leave it empty.';
  if (angle !== null && !(angle > 0 && angle < 180))
    return 'Scattering angle: give a value above 0° and below 180°, or leave it empty.';
  return null;
}
