import type { ProviderProfile } from '@ringlet/shared/contracts/provider';
import { FIELDS, formValueOf, profileInputOf } from './profile-form';

const profile = {
  name: 'Ringlet PT',
  address: 'Street 1\nTown',
  contactEmail: 'pt@example.org',
  contactPhone: '',
  website: '',
  accreditationBody: '',
  accreditationNumber: '',
  authoriserName: 'A. Person',
  authoriserRole: 'Technical manager',
  subcontracting: 'None.',
  taxRateBp: 2000,
  hasLogo: false,
  logoType: null,
  updatedAt: '2026-03-02T10:00:00Z',
} satisfies ProviderProfile;

describe('the provider profile form', () => {
  it('shows every text field of the profile, and the tax rate in percent', () => {
    const value = formValueOf(profile);
    expect(value.taxRatePercent).toBe(20);
    for (const f of FIELDS) expect(value[f.key]).toBe(profile[f.key]);
    expect(Object.keys(value)).toHaveLength(FIELDS.length + 1);
  });
  it('sends the tax rate back in whole basis points', () => {
    expect(profileInputOf({ ...formValueOf(profile), taxRatePercent: 7.7 })).toMatchObject({
      name: 'Ringlet PT',
      taxRateBp: 770,
    });
    expect(profileInputOf({ ...formValueOf(profile), taxRatePercent: 19.999 }).taxRateBp).toBe(
      2000,
    );
    expect(profileInputOf(formValueOf(profile))).not.toHaveProperty('taxRatePercent');
  });
});
