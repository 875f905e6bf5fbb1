import bcrypt from 'bcryptjs';
import { createHash, randomBytes } from 'node:crypto';
import { IsNull, Raw, type EntityManager } from 'typeorm';
import type { PasswordTokenInfo } from '../../../shared/contracts/auth';
import { PasswordToken, User } from '../../../db/entities';
import type { AppContext } from './context';
import { audit } from './audit';
import { ServiceError } from './errors';
import { forgetSessionUser } from '../auth/session-cache';

/** bcrypt work factor: 2^12 rounds (docs/QUALITY.md asks for ≥ 12). */
export const BCRYPT_COST = 12;

/** How long an e-mailed link stays valid. */
export const TOKEN_LIFETIME_MS = {
  'first-password': 7 * 24 * 3600 * 1000,
  reset: 60 * 60 * 1000,
} as const;

export function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, BCRYPT_COST);
}

/**
 * Compared against when the e-mail is unknown, so both failures take the same time: a bcrypt
 * hash at BCRYPT_COST of a password nobody uses, written out once instead of computed at every
 * start (hashing at cost 12 blocked the server's start-up for ~0.3 s).
 */
export const DUMMY_HASH = '$2b$12$.s38wjoH3/i1TGACP6otdeqxb.IMOlXEABAy7zjxjIaUcFduauayC';

/** The user when the e-mail and password match an active account with a password; otherwise null. */
export async function verifyPassword(
  em: EntityManager,
  email: string,
  password: string,
): Promise<User | null> {
  const user = await em.findOne(User, { where: { email: email.toLowerCase() } });
  const ok = await bcrypt.compare(password, user?.passwordHash ?? DUMMY_HASH);
  if (!user || !user.passwordHash || !user.isActive || !ok) return null;
  return user;
}

/** The stored hash of a single-use link token (password links and enrolment invitations). */
export const tokenHash = (token: string) => createHash('sha256').update(token).digest('hex');

/** Where a link of this token that has not expired (database clock) is found. */
export const unexpiredLink = (token: string) => ({
  tokenHash: tokenHash(token),
  expiresAt: Raw((at) => `${at} > now()`),
});

/** A new single-use link token; only its hash is stored. Earlier unused tokens of the user are voided. */
export async function issuePasswordToken(
  em: EntityManager,
  userId: string,
  purpose: 'first-password' | 'reset',
): Promise<string> {
  const token = randomBytes(32).toString('base64url');
  await em
    .createQueryBuilder()
    .update(PasswordToken)
    .set({ usedAt: () => 'now()' })
    .where('user_id = :userId AND used_at IS NULL', { userId })
    .execute();
  await em.insert(PasswordToken, {
    userId,
    purpose,
    tokenHash: tokenHash(token),
    expiresAt: new Date(Date.now() + TOKEN_LIFETIME_MS[purpose]),
  });
  return token;
}

const invalidLink = () =>
  new ServiceError(
    404,
    'link_invalid',
    'This link has expired or was already used. Ask for a new one.',
  );

export async function passwordTokenInfo(
  ctx: AppContext,
  token: string,
): Promise<PasswordTokenInfo> {
  const row = await ctx.ds
    .getRepository(PasswordToken)
    .findOne({ where: { tokenHash: tokenHash(token) } });
  if (!row || row.usedAt || row.expiresAt.getTime() <= Date.now()) throw invalidLink();
  const user = await ctx.ds.getRepository(User).findOneOrFail({ where: { id: row.userId } });
  return { email: user.email, purpose: row.purpose, expiresAt: row.expiresAt.toISOString() };
}

/**
 * Ends every session of the user except `keepSid` (the request's own, when there is one) and
 * forgets the cached user. Other instances need no message: a request whose session row is gone
 * is signed out before any cached user is read.
 */
export async function endOtherSessions(
  em: EntityManager,
  userId: string,
  keepSid: string | undefined,
): Promise<number> {
  // `session` is the session store's table (connect-pg-simple), not an entity.
  const res = await em
    .createQueryBuilder()
    .delete()
    .from('session')
    .where(`sess -> 'passport' ->> 'user' = :userId AND sid <> :keepSid`, {
      userId,
      keepSid: keepSid ?? '',
    })
    .execute();
  forgetSessionUser(userId);
  return res.affected ?? 0;
}

/**
 * A signed-in user changes their own password (the current one must match). Every other session
 * of the user ends; this one stays.
 */
export async function changePassword(
  ctx: AppContext,
  userId: string,
  currentPassword: string,
  password: string,
  keepSid: string,
): Promise<void> {
  const user = await ctx.ds.getRepository(User).findOneOrFail({ where: { id: userId } });
  const ok = await bcrypt.compare(currentPassword, user.passwordHash ?? DUMMY_HASH);
  if (!ok || !user.passwordHash) {
    throw new ServiceError(
      422,
      'wrong_password',
      'currentPassword: that is not your current password.',
      [{ path: 'currentPassword', message: 'That is not your current password.' }],
    );
  }
  const hash = await hashPassword(password);
  await ctx.ds.transaction(async (em) => {
    await em.update(User, { id: userId }, { passwordHash: hash });
    const ended = await endOtherSessions(em, userId, keepSid);
    await audit(em, userId, 'password.changed', 'user', userId, { otherSessionsEnded: ended });
  });
  forgetSessionUser(userId);
}

/**
 * Sets the password with a link token: atomically marks the token used, so it works once. Every
 * session of the user ends, except the request's own (`keepSid`).
 */
export async function setPasswordWithToken(
  ctx: AppContext,
  token: string,
  password: string,
  keepSid?: string,
): Promise<void> {
  const hash = await hashPassword(password);
  let userId: string | null = null;
  await ctx.ds.transaction(async (em) => {
    // Locked, then marked used: a concurrent use of the same link waits and then finds it used.
    const hit = await em.findOne(PasswordToken, {
      where: { ...unexpiredLink(token), usedAt: IsNull() },
      lock: { mode: 'pessimistic_write' },
    });
    if (!hit) throw invalidLink();
    await em.update(PasswordToken, { id: hit.id }, { usedAt: () => 'now()' });
    await em.update(User, { id: hit.userId }, { passwordHash: hash });
    const ended = await endOtherSessions(em, hit.userId, keepSid);
    await audit(em, hit.userId, 'password.set', 'user', hit.userId, {
      purpose: hit.purpose,
      otherSessionsEnded: ended,
    });
    userId = hit.userId;
  });
  if (userId) forgetSessionUser(userId);
}

/** Sends a reset link when the address belongs to an active account; says nothing either way. */
export async function requestPasswordReset(ctx: AppContext, email: string): Promise<void> {
  const user = await ctx.ds.getRepository(User).findOne({ where: { email } });
  if (!user || !user.isActive) return;
  const token = await ctx.ds.transaction(async (em) => {
    const t = await issuePasswordToken(em, user.id, 'reset');
    await audit(em, user.id, 'password.reset-requested', 'user', user.id);
    return t;
  });
  await sendLinkMail(ctx, user.email, user.name, token, 'reset');
}

export async function sendLinkMail(
  ctx: AppContext,
  email: string,
  name: string,
  token: string,
  purpose: 'first-password' | 'reset',
): Promise<void> {
  const link = `${ctx.config.publicUrl}/set-password/${token}`;
  const [subject, intro, lifetime] =
    purpose === 'reset'
      ? [
          'Reset your Ringlet password',
          'Someone (we hope you) asked to reset your Ringlet password.',
          '1 hour',
        ]
      : [
          'Your Ringlet account',
          'An account on Ringlet, the proficiency-testing service, was opened for you.',
          '7 days',
        ];
  const text = `Hello ${name},\n\n${intro}\nChoose your password here (the link works once and for ${lifetime}):\n\n${link}\n\nIf you did not expect this e-mail, ignore it.\n\nRinglet`;
  try {
    await ctx.mailer.send({ to: email, subject, text });
  } catch (err) {
    ctx.log(`mail to ${email} failed; the link can be sent again`, err);
  }
}
