import { PROFILE } from './profile-fixture';
import { FIELDS, formValueOf, profileInputOf } from './profile-form';

const profile = PROFILE;

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
