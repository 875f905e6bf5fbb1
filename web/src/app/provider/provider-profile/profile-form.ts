import type { ProviderProfile, ProviderProfileInput } from '@ringlet/shared/contracts/provider';

/** The text fields of the profile (the tax rate has a field of its own). */
export type FieldKey = Exclude<keyof ProviderProfileInput, 'taxRateBp'>;

/** The fields of the profile with their labels and hints, in the order the form shows them. */
export const FIELDS: { key: FieldKey; label: string; hint?: string; multiline?: boolean }[] = [
  {
    key: 'name',
    label: 'Provider name',
    hint: 'Printed on every report and certificate, and the sender name of every e-mail.',
  },
  { key: 'address', label: 'Postal address', hint: 'One line per address line.', multiline: true },
  { key: 'contactEmail', label: 'Contact e-mail' },
  { key: 'contactPhone', label: 'Contact telephone' },
  { key: 'website', label: 'Website', hint: 'Starting with https://' },
  {
    key: 'accreditationBody',
    label: 'Accreditation body',
    hint: 'Leave empty when the provider is not accredited.',
  },
  { key: 'accreditationNumber', label: 'Accreditation number (ISO/IEC 17043)' },
  { key: 'authoriserName', label: 'Person who authorises reports' },
  {
    key: 'authoriserRole',
    label: 'Their role',
    hint: 'For example: Technical manager, proficiency testing.',
  },
  {
    key: 'subcontracting',
    label: 'Subcontracting statement',
    hint: 'Which work was subcontracted (for example homogeneity measurements), or that none was.',
    multiline: true,
  },
];
/** What the profile form holds: the text fields, and the tax rate in percent as people type it. */
export type ProfileFormValue = Record<FieldKey, string> & { taxRatePercent: number };

/** The form's value for a stored profile (the tax rate is stored in basis points). */
export function formValueOf(p: ProviderProfile): ProfileFormValue {
  const value = { taxRatePercent: p.taxRateBp / 100 } as ProfileFormValue;
  for (const f of FIELDS) value[f.key] = p[f.key];
  return value;
}

/** What the form sends: the text fields as typed, the tax rate back in whole basis points. */
export function profileInputOf(value: ProfileFormValue): Record<string, unknown> {
  const { taxRatePercent, ...text } = value;
  return { ...text, taxRateBp: Math.round(Number(taxRatePercent) * 100) };
}
