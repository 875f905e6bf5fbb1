import type { ErrorRequestHandler } from 'express';
import { ZodError } from 'zod';
import type { FieldIssue } from '../../../shared/contracts/common';

/** An error that carries its HTTP status and a stable machine-readable code. */
export class HttpError extends Error {
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
  new HttpError(400, 'validation_failed', message, details);
export const unauthorized = () => new HttpError(401, 'unauthenticated', 'Sign in to continue.');
export const forbidden = (message = 'Your role does not allow this.') =>
  new HttpError(403, 'forbidden', message);
export const notFound = (what = 'The resource') => new HttpError(404, 'not_found', `${what} was not found.`);
export const conflict = (code: string, message: string) => new HttpError(409, code, message);
export const ruleBroken = (code: string, message: string, details?: unknown) =>
  new HttpError(422, code, message, details);

/** zod issues → `[{ path: "a.b", message }]`, the shape every 400 lists. */
export function fieldIssues(error: ZodError, prefix?: string): FieldIssue[] {
  return error.issues.map((i) => ({
    path: [prefix, ...i.path.map(String)].filter(Boolean).join('.') || '(body)',
    message: i.message,
  }));
}

/** The one error middleware, last in the chain: every error becomes the problem-style body. */
export function errorHandler(log: (msg: string, err: unknown) => void): ErrorRequestHandler {
  return (err, _req, res, _next) => {
    if (err instanceof HttpError) {
      res.status(err.status).json({
        error: { code: err.code, message: err.message, ...(err.details !== undefined ? { details: err.details } : {}) },
      });
      return;
    }
    if (err instanceof ZodError) {
      const details = fieldIssues(err);
      res.status(400).json({ error: { code: 'validation_failed', message: describe(details), details } });
      return;
    }
    // body-parser errors carry a status (malformed JSON 400, too large 413)
    const status = typeof err?.status === 'number' ? err.status : 500;
    if (status >= 400 && status < 500) {
      res.status(status).json({
        error: {
          code: status === 413 ? 'payload_too_large' : 'bad_request',
          message: status === 413 ? 'The request is too large.' : 'The request body is not valid JSON.',
        },
      });
      return;
    }
    log('unhandled error', err);
    res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on our side. Try again.' } });
  };
}

/** A readable one-line summary of field issues, naming the fields. */
export function describe(details: FieldIssue[]): string {
  if (details.length === 0) return 'The request is not valid.';
  const first = details[0]!;
  const more = details.length > 1 ? ` (and ${details.length - 1} more)` : '';
  return `${first.path}: ${first.message}${more}`;
}
