import type { ProviderProfile } from '@ringlet/shared/contracts/provider';

/** An invented provider profile for the specs of this folder (demo data, no outside source). */
export const PROFILE: ProviderProfile = {
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
};
