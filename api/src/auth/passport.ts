import type { Request, Response } from 'express';
import { Passport } from 'passport';

export type Authenticator = InstanceType<typeof Passport>;
import { Strategy as LocalStrategy } from 'passport-local';
import type { DataSource } from 'typeorm';
import type { User } from '../../../db/entities';
import { verifyPassword } from '../services/passwords';
import { loadSessionUser } from '../services/users';

/**
 * One passport instance per app (not the global singleton, so several apps can live in one
 * process). The session holds only the user id; the user is loaded on every request.
 */
export function createPassport(ds: DataSource): Authenticator {
  const p = new Passport();
  p.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password', session: false }, (email, password, done) => {
      verifyPassword(ds.manager, email, password)
        .then((user) => done(null, (user ?? false) as Express.User | false))
        .catch(done);
    }),
  );
  p.serializeUser((user, done) => done(null, (user as Express.User).id));
  p.deserializeUser((id: string, done) => {
    const hit = sessionUsers.get(id);
    if (hit && hit.until > Date.now()) {
      done(null, hit.user);
      return;
    }
    loadSessionUser(ds.manager, id)
      .then((u) => {
        if (u) sessionUsers.set(id, { user: u, until: Date.now() + SESSION_USER_TTL_MS });
        done(null, u ?? false);
      })
      .catch(done);
  });
  return p;
}

/**
 * The signed-in user is read on every request; reads within a second reuse it. Any
 * state-changing request on this instance forgets them all (ApiRouter calls forgetSessionUsers),
 * so a change of roles or memberships shows at once here and within a second on other instances.
 * Signing a user out everywhere deletes their sessions, which no cache outlives.
 */
export const SESSION_USER_TTL_MS = 1000;
const sessionUsers = new Map<string, { user: Express.User; until: number }>();

export function forgetSessionUsers(): void {
  sessionUsers.clear();
}

/** Runs the local strategy on the (already validated) body: the matching user, or null. */
export function authenticateLocal(p: Authenticator, req: Request, res: Response): Promise<User | null> {
  return new Promise((resolve, reject) => {
    p.authenticate('local', { session: false }, (err: unknown, user: User | false) => {
      if (err) reject(err);
      else resolve(user || null);
    })(req, res, (err?: unknown) => (err ? reject(err) : resolve(null)));
  });
}
