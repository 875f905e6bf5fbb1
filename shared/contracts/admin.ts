import * as z from 'zod';
import { changeSomething, changesSomething, Email, Id, Timestamp } from './common';
import { GlobalRole } from './auth';
import { singleLine } from './ranges';

/** A person's name as an admin or a lab manager enters it. */
const PersonName = singleLine(200, { min: 1, required: "Enter the person's name." });

export const OrganisationKind = z.enum(['lab', 'provider']);
export type OrganisationKind = z.infer<typeof OrganisationKind>;

export const Organisation = z.object({
  id: Id,
  name: z.string(),
  kind: OrganisationKind,
  country: z.string().nullable(),
  contactEmail: z.string().nullable(),
  createdAt: Timestamp,
});
export type Organisation = z.infer<typeof Organisation>;

export const OrganisationCreate = z.object({
  name: singleLine(200, { min: 2, required: 'Enter the organisation name.' }),
  kind: OrganisationKind.default('lab'),
  country: singleLine(100).nullable().optional(),
  contactEmail: Email.nullable().optional(),
});
export type OrganisationCreate = z.input<typeof OrganisationCreate>;
export const OrganisationUpdate = z
  .object({
    name: OrganisationCreate.shape.name,
    kind: OrganisationKind,
    country: OrganisationCreate.shape.country,
    contactEmail: OrganisationCreate.shape.contactEmail,
  })
  .partial()
  .refine(changesSomething, changeSomething);

export const Membership = z.object({
  id: Id,
  userId: Id,
  userEmail: z.string(),
  userName: z.string(),
  organisationId: Id,
  organisationName: z.string(),
  isManager: z.boolean(),
});
export type Membership = z.infer<typeof Membership>;

export const User = z.object({
  id: Id,
  email: z.string(),
  name: z.string(),
  roles: z.array(GlobalRole),
  isActive: z.boolean(),
  hasPassword: z.boolean(),
  lastSignInAt: Timestamp.nullable(),
  memberships: z.array(Membership),
  createdAt: Timestamp,
});
export type User = z.infer<typeof User>;

/** Inviting a user creates the account and e-mails a first-password link. */
export const UserInvite = z.object({
  email: Email,
  name: PersonName,
  roles: z.array(GlobalRole).default([]),
  organisationId: Id.optional(),
  isManager: z.boolean().default(false),
});
export type UserInvite = z.input<typeof UserInvite>;

export const UserUpdate = z
  .object({
    name: PersonName.optional(),
    roles: z.array(GlobalRole).max(3).optional(),
    isActive: z.boolean().optional(),
  })
  .refine(changesSomething, changeSomething);
export type UserUpdate = z.infer<typeof UserUpdate>;

export const MembershipCreate = z.object({
  userId: Id,
  organisationId: Id,
  isManager: z.boolean().default(false),
});
export type MembershipCreate = z.input<typeof MembershipCreate>;
export const MembershipUpdate = z.object({ isManager: z.boolean() });

/** A lab manager invites a colleague into the lab. */
export const LabMemberInvite = z.object({
  email: Email,
  name: PersonName,
  isManager: z.boolean().default(false),
});
export type LabMemberInvite = z.input<typeof LabMemberInvite>;
export const LabMemberParams = z.object({ id: Id, membershipId: Id });

/**
 * A lab's invitation to an existing account: no membership until the person accepts.
 * Staff accounts (admin, coordinator, assessor) cannot be invited by a lab.
 */
export const LabInvitation = z.object({
  id: Id,
  organisationId: Id,
  organisationName: z.string(),
  email: z.string(),
  name: z.string(),
  invitedByName: z.string().nullable(),
  isManager: z.boolean(),
  createdAt: Timestamp,
  expiresAt: Timestamp,
});
export type LabInvitation = z.infer<typeof LabInvitation>;
export const LabInvitationParams = z.object({ id: Id, invitationId: Id });

/**
 * What adding a colleague did: a new address gets an account and the membership at once (the
 * person accepts by choosing a password); an existing account gets an invitation to accept.
 */
export const LabMemberInviteResult = z.object({
  outcome: z.enum(['member-added', 'invitation-sent']),
  membership: Membership.nullable(),
  invitation: LabInvitation.nullable(),
});
export type LabMemberInviteResult = z.infer<typeof LabMemberInviteResult>;

export const OutboxMessage = z.object({
  id: Id,
  to: z.array(z.string()),
  from: z.string(),
  subject: z.string(),
  text: z.string(),
  html: z.string().nullable(),
  receivedAt: Timestamp,
});
export type OutboxMessage = z.infer<typeof OutboxMessage>;
