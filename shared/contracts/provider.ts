import * as z from 'zod';
import { Timestamp } from './common';

/**
 * The PT provider's profile: who issues the reports (ISO/IEC 17043 §7.4, from memory: the
 * provider's name and contact, the person authorising the report, accreditation, the
 * subcontracting statement). Printed on every report, certificate and e-mail.
 */
const line = (max: number) => z.string().trim().max(max);

export const ProviderProfileInput = z.object({
  name: line(200).min(1, 'The provider’s name is required'),
  /** Postal address, one line per address line. */
  address: z.string().trim().max(600),
  contactEmail: z.union([z.literal(''), z.email().max(254)]),
  contactPhone: line(60),
  website: z.union([z.literal(''), z.url({ protocol: /^https?$/ }).max(300)]),
  accreditationBody: line(200),
  accreditationNumber: line(100),
  authoriserName: line(200),
  authoriserRole: line(200),
  /** Which work was subcontracted (e.g. homogeneity measurements), or that none was. */
  subcontracting: z.string().trim().max(2000),
  /** Tax rate on participation fees in basis points (2000 = 20 %); unchanged when left out. */
  taxRateBp: z.number().int().min(0).max(10_000).optional(),
});
export type ProviderProfileInput = z.infer<typeof ProviderProfileInput>;

export const ProviderProfile = ProviderProfileInput.extend({
  name: z.string(),
  contactEmail: z.string(),
  website: z.string(),
  hasLogo: z.boolean(),
  logoType: z.enum(['image/png', 'image/jpeg']).nullable(),
  taxRateBp: z.number().int().min(0).max(10_000),
  updatedAt: Timestamp,
});
export type ProviderProfile = z.infer<typeof ProviderProfile>;

/** Logo upload: PNG or JPEG, base64, at most LOGO_MAX_BYTES once decoded. */
export const LOGO_MAX_BYTES = 256 * 1024;
export const LogoUpload = z.object({
  dataBase64: z
    .string()
    .max(Math.ceil((LOGO_MAX_BYTES * 4) / 3) + 8, 'The logo may be at most 256 KB')
    .regex(/^[A-Za-z0-9+/]+={0,2}$/, 'The logo must be base64 text'),
});

/** The coordinator's comments on a round, printed in its round report. */
export const RoundComments = z.object({ comments: z.string().trim().max(4000) });
export type RoundComments = z.infer<typeof RoundComments>;
