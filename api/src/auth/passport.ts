import type { Request, Response } from 'express';
import { Passport } from 'passport';

export type Authenticator = InstanceType<typeof Passport>;
import { Strategy as LocalStrategy } from 'passport-local';
import type { DataSource } from 'typeorm';
import type { User } from '../../../db/entities';
import { verifyPassword } from '../services/passwords';
import { loadSessionUser } from '../services/users';
import { actingFor } from './session-user';
import { SESSION_USER_TTL_MS, sessionUsers } from './session-cache';

export { forgetSessionUser, forgetSessionUsers, SESSION_USER_TTL_MS } from './session-cache';

/**
 * One passport instance per app (not the global singleton, so several apps can live in one
 * process). The session holds only the user id; the user is loaded on every request.
 */
export function createPassport(ds: DataSource): Authenticator {
  const p = new Passport();
  p.use(
    new LocalStrategy(
      { usernameField: 'email', passwordField: 'password', session: false },
      (email, password, done) => {
        verifyPassword(ds.manager, email, password)
          .then((user) => done(null, (user ?? false) as Express.User | false))
          .catch(done);
      },
    ),
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

declare module 'express-session' {
  interface SessionData {
    /** The lab a person in several labs chose to act for. */
    actingLabId?: string;
  }
}

/** After passport.session(): the request's user acts for the lab chosen in the session. */
export function actingLab(req: Request, _res: Response, next: () => void): void {
  if (req.user) req.user = actingFor(req.user, req.session.actingLabId);
  next();
}

/** Runs the local strategy on the (already validated) body: the matching user, or null. */
export function authenticateLocal(
  p: Authenticator,
  req: Request,
  res: Response,
): Promise<User | null> {
  return new Promise((resolve, reject) => {
    // @types/passport types the returned middleware as `any`.
    const middleware = p.authenticate(
      'local',
      { session: false },
      (err: Error | null, user: User | false) => {
        if (err) reject(err);
        else resolve(user || null);
      },
    ) as (req: Request, res: Response, next: (err?: Error) => void) => void;
    middleware(req, res, (err?: Error) => (err ? reject(err) : resolve(null)));
  });
}
