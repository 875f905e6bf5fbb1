import type { Request } from 'express';
import * as z from 'zod';
import {
  ActingLabRequest,
  ChangePasswordRequest,
  CsrfTokenResponse,
  Me,
  PasswordResetRequest,
  PasswordTokenInfo,
  PasswordTokenParams,
  SetPasswordRequest,
  SignInRequest,
  SignInResponse,
} from '../../../shared/contracts/auth';
import { User } from '../../../db/entities';
import type { Authenticator } from '../auth/passport';
import { authenticateLocal } from '../auth/passport';
import { actingFor, toMe } from '../auth/session-user';
import { HttpError, notFound } from '../http/errors';
import type { ApiRouter } from '../http/route';
import { audit } from '../services/audit';
import type { AppContext } from '../services/context';
import {
  changePassword,
  passwordTokenInfo,
  requestPasswordReset,
  setPasswordWithToken,
} from '../services/passwords';
import type { RateLimiter } from '../services/rate-limit';
import { loadSessionUser } from '../services/users';

/** Sign-in limits: per client address, and per e-mail address (the temporary lockout). */
export const SIGN_IN_LIMITS = { perIp: 30, perEmail: 5, windowSeconds: 15 * 60 } as const;

const INVALID = 'E-mail or password is incorrect.';

function login(req: Request, user: Express.User): Promise<void> {
  // passport ≥ 0.6 regenerates the session on login (no session fixation)
  return new Promise((resolve, reject) =>
    req.login(user, (err) => (err ? reject(err) : resolve())),
  );
}
function logout(req: Request): Promise<void> {
  return new Promise((resolve, reject) => req.logout((err) => (err ? reject(err) : resolve())));
}

export function authRoutes(
  api: ApiRouter,
  ctx: AppContext,
  limiter: RateLimiter,
  csrfToken: (req: Request) => string,
  passport: Authenticator,
): void {
  /**
   * A refused sign-in in the audit trail: the account's id when the address has one (the typed
   * address either way, so attempts on unknown addresses show too) and the client address.
   */
  const auditFailure = async (
    action: string,
    email: string,
    ip: string | undefined,
    details: Record<string, unknown>,
  ) => {
    try {
      const known = await ctx.ds
        .getRepository(User)
        .findOne({ where: { email }, select: { id: true } });
      await audit(ctx.ds.manager, null, action, 'user', known?.id ?? null, {
        email,
        ip,
        ...details,
      });
    } catch (err) {
      ctx.log('audit of a refused sign-in failed', err);
    }
  };

  api.add({
    method: 'get',
    path: '/auth/csrf-token',
    tag: 'auth',
    summary: 'The CSRF token of this session',
    description:
      'Send it back in the `x-csrf-token` header on every POST, PUT, PATCH and DELETE. The token changes when the session does (sign-in, sign-out): fetch it again then.',
    access: 'public',
    response: CsrfTokenResponse,
    handler: ({ req }) => ({ token: csrfToken(req), headerName: 'x-csrf-token' as const }),
  });

  api.add({
    method: 'post',
    path: '/auth/sign-in',
    tag: 'auth',
    summary: 'Sign in with e-mail and password',
    description: `Unknown e-mail and wrong password get the same answer. After ${SIGN_IN_LIMITS.perEmail} failures for one e-mail address within 15 minutes that address is locked for the rest of the window (429).`,
    access: 'public',
    body: SignInRequest,
    response: SignInResponse,
    handler: async ({ req, res, body }) => {
      const ipKey = `sign-in:ip:${req.ip}`;
      const emailKey = `sign-in:email:${body.email}`;
      const ipHits = await limiter.hit(ipKey, SIGN_IN_LIMITS.windowSeconds);
      if (ipHits > SIGN_IN_LIMITS.perIp) {
        // audited once, when the address first goes over the limit
        if (ipHits === SIGN_IN_LIMITS.perIp + 1)
          await auditFailure('auth.rate-limited', body.email, req.ip, { reason: 'address' });
        throw new HttpError(
          429,
          'rate_limited',
          'Too many sign-in attempts from this address. Wait 15 minutes and try again.',
        );
      }
      if (
        (await limiter.count(emailKey, SIGN_IN_LIMITS.windowSeconds)) >= SIGN_IN_LIMITS.perEmail
      ) {
        await auditFailure('auth.sign-in-refused', body.email, req.ip, { reason: 'locked' });
        throw new HttpError(
          429,
          'locked',
          'Too many failed attempts for this account. Wait 15 minutes or reset your password.',
        );
      }
      req.body = body; // the normalised e-mail goes to the strategy
      const user = await authenticateLocal(passport, req, res);
      const refuse = async (reason: string) => {
        const failures = await limiter.hit(emailKey, SIGN_IN_LIMITS.windowSeconds);
        await auditFailure('auth.sign-in-failed', body.email, req.ip, { reason, failures });
        if (failures === SIGN_IN_LIMITS.perEmail) {
          await auditFailure('auth.locked-out', body.email, req.ip, {
            failures,
            minutes: SIGN_IN_LIMITS.windowSeconds / 60,
          });
        }
        return new HttpError(401, 'invalid_credentials', INVALID);
      };
      if (!user) throw await refuse('invalid_credentials');
      if (ctx.config.mode === 'production' && user.isDemo) throw await refuse('demo_account');
      await limiter.clear(emailKey);
      const sessionUser = await loadSessionUser(ctx.ds.manager, user.id);
      if (!sessionUser) throw new HttpError(401, 'invalid_credentials', INVALID);
      await login(req, sessionUser);
      await ctx.ds.transaction(async (em) => {
        await em.update(User, { id: user.id }, { lastSignInAt: new Date() });
        await audit(em, user.id, 'auth.sign-in', 'user', user.id, { ip: req.ip });
      });
      return { user: toMe(sessionUser) };
    },
  });

  api.add({
    method: 'post',
    path: '/auth/sign-out',
    tag: 'auth',
    summary: 'Sign out (ends the session)',
    access: 'signed-in',
    status: 204,
    handler: async ({ req, user }) => {
      await logout(req);
      await audit(ctx.ds.manager, user.id, 'auth.sign-out', 'user', user.id);
    },
  });

  api.add({
    method: 'get',
    path: '/auth/me',
    tag: 'auth',
    summary: 'The signed-in user, roles and lab memberships (401 when signed out)',
    access: 'signed-in',
    response: Me,
    handler: ({ user }) => toMe(user),
  });

  api.add({
    method: 'post',
    path: '/auth/password-reset',
    tag: 'auth',
    summary: 'E-mail a password reset link',
    description: 'Always answers 202, whether or not the address has an account.',
    access: 'public',
    body: PasswordResetRequest,
    status: 202,
    response: z.object({ accepted: z.literal(true) }),
    handler: async ({ req, body }) => {
      if ((await limiter.hit(`reset:ip:${req.ip}`, 3600)) > 20) {
        throw new HttpError(
          429,
          'rate_limited',
          'Too many reset requests. Wait an hour and try again.',
        );
      }
      await requestPasswordReset(ctx, body.email);
      return { accepted: true as const };
    },
  });

  api.add({
    method: 'get',
    path: '/auth/password-tokens/{token}',
    tag: 'auth',
    summary: 'What an e-mailed password link is for (404 when used, expired or unknown)',
    access: 'public',
    params: PasswordTokenParams,
    response: PasswordTokenInfo,
    handler: ({ params }) => passwordTokenInfo(ctx, params.token),
  });

  api.add({
    method: 'post',
    path: '/auth/password',
    tag: 'auth',
    summary: 'Set a password with an e-mailed single-use link (first password or reset)',
    access: 'public',
    body: SetPasswordRequest,
    status: 204,
    description: 'Every session of the account ends, except the one this request comes from.',
    handler: async ({ req, body }) => {
      await setPasswordWithToken(ctx, body.token, body.password, req.sessionID);
    },
  });

  api.add({
    method: 'post',
    path: '/auth/password/change',
    tag: 'auth',
    summary: 'Change my password (the current one must match)',
    description:
      'Every other session of the account ends (other browsers are signed out); this one stays. A wrong current password answers 422.',
    access: 'signed-in',
    body: ChangePasswordRequest,
    status: 204,
    handler: async ({ req, body, user }) => {
      if (
        (await limiter.hit(`password-change:${user.id}`, SIGN_IN_LIMITS.windowSeconds)) >
        SIGN_IN_LIMITS.perEmail * 2
      ) {
        throw new HttpError(
          429,
          'rate_limited',
          'Too many attempts. Wait 15 minutes and try again.',
        );
      }
      await changePassword(ctx, user.id, body.currentPassword, body.password, req.sessionID);
    },
  });

  api.add({
    method: 'put',
    path: '/auth/acting-lab',
    tag: 'auth',
    summary: 'Choose the lab I act for (people in several labs)',
    description:
      'Kept in the session: Lab bench, Track record, Consensus board, investigations and reports then act for this lab. A lab that is not one of mine answers 404.',
    access: ['lab'],
    body: ActingLabRequest,
    response: Me,
    handler: async ({ req, body, user }) => {
      if (!user.memberships.some((m) => m.organisationId === body.labId)) throw notFound('The lab');
      req.session.actingLabId = body.labId;
      await new Promise<void>((resolve, reject) =>
        req.session.save((err) => (err ? reject(err) : resolve())),
      );
      return toMe(actingFor(user, body.labId));
    },
  });
}
