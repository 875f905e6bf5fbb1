import type { ZodError } from 'zod';
import type { FieldIssue } from '../../../shared/contracts/common';

/**
 * The error a service throws when a request cannot be done: the answer's status, a stable
 * machine-readable code, a message naming the field or rule, and optional details. It lives in the
 * service layer so services do not import the HTTP layer; `api/src/http/errors.ts` re-exports it as
 * `ServiceError` and its one error middleware writes it as the problem body
 * (`{ error: { code, message, details? } }`).
 */
export class ServiceError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
  }
}

export const badRequest = (message: string, details?: FieldIssue[]) =>
  new ServiceError(400, 'validation_failed', message, details);
export const unauthorized = () => new ServiceError(401, 'unauthenticated', 'Sign in to continue.');
export const forbidden = (message = 'Your role does not allow this.') =>
  new ServiceError(403, 'forbidden', message);
export const notFound = (what = 'The resource') =>
  new ServiceError(404, 'not_found', `${what} was not found.`);
export const conflict = (code: string, message: string) => new ServiceError(409, code, message);
export const ruleBroken = (code: string, message: string, details?: unknown) =>
  new ServiceError(422, code, message, details);

/** zod issues → `[{ path: "a.b", message }]`, the shape every 400 lists. */
export function fieldIssues(error: ZodError, prefix?: string): FieldIssue[] {
  return error.issues.map((i) => ({
    path: [prefix, ...i.path.map(String)].filter(Boolean).join('.') || '(body)',
    message: i.message,
  }));
}
