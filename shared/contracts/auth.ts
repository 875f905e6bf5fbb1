import * as z from 'zod';
import { Email, Id, NewPassword } from './common';

/** Roles a user holds directly. Lab membership is a separate relation (see Membership). */
export const GlobalRole = z.enum(['admin', 'coordinator', 'assessor']);
export type GlobalRole = z.infer<typeof GlobalRole>;

/** What the web app shows by: every role a signed-in user can act in. */
export const Role = z.enum(['admin', 'coordinator', 'lab', 'assessor']);
export type Role = z.infer<typeof Role>;

export const MembershipSummary = z.object({
  id: Id,
  organisationId: Id,
  organisationName: z.string(),
  isManager: z.boolean(),
});
export type MembershipSummary = z.infer<typeof MembershipSummary>;

export const Me = z.object({
  id: Id,
  email: z.string(),
  name: z.string(),
  roles: z.array(Role),
  memberships: z.array(MembershipSummary),
  /**
   * The lab this session acts for: the one chosen (PUT /auth/acting-lab), or the only lab of a
   * user in one lab; null for a user in several labs who has not chosen yet (and for non-members).
   */
  actingLabId: Id.nullable().optional(),
});
export type Me = z.infer<typeof Me>;

/** Choosing the lab a person in several labs acts for (kept in the session). */
export const ActingLabRequest = z.object({ labId: Id });
export type ActingLabRequest = z.infer<typeof ActingLabRequest>;

/** Changing one's own password while signed in; ends every other session of the user. */
export const ChangePasswordRequest = z.object({
  currentPassword: z.string().min(1, { message: 'Enter your current password.' }).max(200),
  password: NewPassword,
});
export type ChangePasswordRequest = z.infer<typeof ChangePasswordRequest>;

export const SignInRequest = z.object({
  email: Email,
  password: z.string().min(1, { message: 'Enter your password.' }).max(200),
});
export type SignInRequest = z.infer<typeof SignInRequest>;

export const SignInResponse = z.object({ user: Me });

export const CsrfTokenResponse = z.object({
  token: z.string(),
  headerName: z.literal('x-csrf-token'),
});

export const PasswordResetRequest = z.object({ email: Email });

/** Setting a password with an e-mailed single-use token (first password or reset). */
export const SetPasswordRequest = z.object({
  token: z.string().min(20).max(200),
  password: NewPassword,
});
export type SetPasswordRequest = z.infer<typeof SetPasswordRequest>;

export const PasswordTokenParams = z.object({ token: z.string().min(20).max(200) });
export const PasswordTokenInfo = z.object({
  email: z.string(),
  purpose: z.enum(['first-password', 'reset']),
  expiresAt: z.string(),
});
export type PasswordTokenInfo = z.infer<typeof PasswordTokenInfo>;

/** Home page per role, first match wins (admin, coordinator, lab, assessor). */
export function homePath(roles: readonly Role[]): string {
  if (roles.includes('coordinator')) return '/desk';
  if (roles.includes('lab')) return '/bench';
  if (roles.includes('assessor')) return '/assessor';
  if (roles.includes('admin')) return '/admin/users';
  return '/no-role';
}
