import { Router, type NextFunction, type Request, type Response } from 'express';
import type { ZodType, z } from 'zod';
import type { Role } from '../../../shared/contracts/auth';
import type { FieldIssue } from '../../../shared/contracts/common';
import { textProblem } from '../../../shared/contracts/ranges';
import { forgetSessionUsers } from '../auth/passport';
import { hasAnyRole, type SessionUser } from '../auth/session-user';
import { describe, fieldIssues, forbidden, HttpError, unauthorized } from './errors';

/** Who may call a route: anyone, any signed-in user, or a user holding one of the roles. */
// The role predicate lives with the session user (services use it too); re-exported for the HTTP layer.
export { hasAnyRole };

export type Access = 'public' | 'signed-in' | readonly Role[];
export type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

/** What a route's schema (or its absence) hands the handler. */
export type Infer<T> = T extends ZodType ? z.output<T> : undefined;

export interface RouteContext<B, P, Q> {
  req: Request;
  res: Response;
  body: B;
  params: P;
  query: Q;
  /** The signed-in user (undefined only on public routes). */
  user: SessionUser;
}

export interface RouteDefinition<
  B extends ZodType | undefined = undefined,
  P extends ZodType | undefined = undefined,
  Q extends ZodType | undefined = undefined,
> {
  method: Method;
  /** OpenAPI-style path below /api/v1, e.g. `/rounds/{id}`. */
  path: string;
  summary: string;
  description?: string;
  tag: string;
  access: Access;
  body?: B;
  params?: P;
  query?: Q;
  /** Success status; 204 sends no body. */
  status?: number;
  response?: ZodType;
  /** Non-JSON success content type (files). */
  produces?: string;
  /** Routes that exist only in some modes are still documented; this explains when. */
  availability?: string;
  /** Exempt from CSRF (only for requests that cannot carry a session-bound token). */
  csrfExempt?: boolean;
  /** May be async: its result (or the promise's value) is the answer. */
  handler: (ctx: RouteContext<Infer<B>, Infer<P>, Infer<Q>>) => unknown;
}

// The table of every route: OpenAPI and the authorization walk read it.
export type AnyRoute = RouteDefinition<
  ZodType | undefined,
  ZodType | undefined,
  ZodType | undefined
>;

export interface RouteDeps {
  isCsrfValid: (req: Request) => boolean;
}

function checkAccess(access: Access, req: Request): void {
  if (access === 'public') return;
  const user = req.user as SessionUser | undefined;
  if (!user) throw unauthorized();
  if (access === 'signed-in') return;
  if (!hasAnyRole(user, access)) throw forbidden();
}

/** Depth past which a request is refused rather than walked (no request schema nests this deep). */
const MAX_DEPTH = 32;

/**
 * The one text rule at the edge: no string anywhere in the body, query or path (values and keys)
 * may hold a control character other than tab, line feed and carriage return, or a lone UTF-16
 * surrogate (shared/contracts/ranges.ts textProblem). Answers the first offending field's path.
 * Iterative, so a deeply nested body cannot exhaust the stack.
 */
export function findTextProblem(value: unknown, where: string): FieldIssue | null {
  const stack: { v: unknown; path: string[]; depth: number }[] = [{ v: value, path: [], depth: 0 }];
  const name = (path: string[]) =>
    [where === 'body' ? undefined : where, ...path].filter(Boolean).join('.') || '(body)';
  while (stack.length > 0) {
    const { v, path, depth } = stack.pop()!;
    if (typeof v === 'string') {
      const p = textProblem(v);
      if (p) return { path: name(path), message: p };
      continue;
    }
    if (v === null || typeof v !== 'object') continue;
    if (depth >= MAX_DEPTH)
      return { path: name(path), message: `Nested more than ${MAX_DEPTH} levels deep.` };
    // Pushed in reverse so the first offending field in document order is the one named.
    for (const [k, child] of Object.entries(v as Record<string, unknown>).reverse()) {
      const p = textProblem(k);
      if (p) return { path: name([...path, '(a field name)']), message: p };
      stack.push({ v: child, path: [...path, k], depth: depth + 1 });
    }
  }
  return null;
}

function checkText(value: unknown, where: string): void {
  const issue = findTextProblem(value, where);
  if (issue) throw new HttpError(400, 'validation_failed', describe([issue]), [issue]);
}

function parsePart(schema: ZodType | undefined, value: unknown, where: string): unknown {
  if (!schema) return undefined;
  const r = schema.safeParse(value ?? {});
  if (!r.success) {
    const details = fieldIssues(r.error, where === 'body' ? undefined : where);
    throw new HttpError(400, 'validation_failed', describe(details), details);
  }
  return r.data;
}

/**
 * A router that documents itself: each route declares its access, schemas and responses once,
 * and that single declaration drives validation, the role check, CSRF and the OpenAPI document.
 */
export class ApiRouter {
  readonly router = Router();
  readonly routes: AnyRoute[] = [];

  constructor(private readonly deps: RouteDeps) {}

  add<
    B extends ZodType | undefined = undefined,
    P extends ZodType | undefined = undefined,
    Q extends ZodType | undefined = undefined,
  >(def: RouteDefinition<B, P, Q>): void {
    this.routes.push(def as unknown as AnyRoute);
    const expressPath = def.path.replace(/\{(\w+)\}/g, ':$1');
    const stateChanging = def.method !== 'get';
    const handler = async (req: Request, res: Response, next: NextFunction) => {
      try {
        checkAccess(def.access, req);
        if (stateChanging && !def.csrfExempt && !this.deps.isCsrfValid(req)) {
          throw new HttpError(
            403,
            'csrf_invalid',
            'The form expired. Reload the page and try again.',
          );
        }
        checkText(req.params, 'params');
        checkText(req.query, 'query');
        checkText(req.body, 'body');
        const params = parsePart(def.params, req.params, 'params');
        const query = parsePart(def.query, req.query, 'query');
        const body = parsePart(def.body, req.body, 'body');
        if (stateChanging) forgetSessionUsers();
        const result = await def.handler({
          req,
          res,
          body: body as never,
          params: params as never,
          query: query as never,
          user: req.user as SessionUser,
        });
        if (stateChanging) forgetSessionUsers();
        if (res.headersSent) return;
        const status = def.status ?? 200;
        if (status === 204 || result === undefined) res.status(status === 200 ? 204 : status).end();
        else res.status(status).json(result);
      } catch (err) {
        next(err);
      }
    };
    this.router[def.method](expressPath, handler);
  }
}
