import type { ErrorRequestHandler } from 'express';
import { ZodError } from 'zod';
import type { FieldIssue } from '../../../shared/contracts/common';
import { fieldIssues, ServiceError } from '../services/errors';

// The error type and its constructors live in the service layer (services must not import
// api/src/http/); the HTTP layer and the routes keep using them under these names.
export {
  badRequest,
  conflict,
  fieldIssues,
  forbidden,
  notFound,
  ruleBroken,
  ServiceError as HttpError,
  unauthorized,
} from '../services/errors';

/** Seconds a client is told to wait (Retry-After) while the database is unreachable. */
export const DATABASE_RETRY_AFTER_SECONDS = 5;

// Node socket errors when PostgreSQL (or the network to it) is gone.
const NETWORK_CODES = new Set([
  'ECONNREFUSED',
  'ECONNRESET',
  'ETIMEDOUT',
  'EPIPE',
  'EHOSTUNREACH',
  'ENETUNREACH',
  'ENOTFOUND',
  'EAI_AGAIN',
  'ECONNABORTED',
]);
// SQLSTATEs of a server that is shutting down, starting up or full (PostgreSQL docs, Appendix A):
// 57P01 admin_shutdown, 57P02 crash_shutdown, 57P03 cannot_connect_now, 53300 too_many_connections;
// class 08 is "connection exception".
const UNAVAILABLE_SQLSTATES = new Set(['57P01', '57P02', '57P03', '53300']);
// node-postgres / pg-pool messages when a connection breaks or cannot be made in time.
const UNAVAILABLE_MESSAGES =
  /Connection terminated|timeout exceeded when trying to connect|Client has encountered a connection error|Connection is not open|terminating connection due to administrator command|the database system is (starting up|shutting down|in recovery mode)/i;

/**
 * True when an error means the database could not be reached (refused, dropped, restarting), as
 * opposed to a query that failed. TypeORM wraps driver errors (`driverError`); Node wraps causes.
 */
export function isDatabaseUnavailable(err: unknown, depth = 0): boolean {
  if (!err || typeof err !== 'object' || depth > 4) return false;
  const e = err as {
    code?: unknown;
    message?: unknown;
    driverError?: unknown;
    cause?: unknown;
    errors?: unknown;
  };
  if (typeof e.code === 'string') {
    if (
      NETWORK_CODES.has(e.code) ||
      UNAVAILABLE_SQLSTATES.has(e.code) ||
      /^08[0-9A-Z]{3}$/.test(e.code)
    )
      return true;
  }
  if (typeof e.message === 'string' && UNAVAILABLE_MESSAGES.test(e.message)) return true;
  if (Array.isArray(e.errors) && e.errors.some((x) => isDatabaseUnavailable(x, depth + 1)))
    return true; // AggregateError (IPv4 + IPv6)
  return (
    isDatabaseUnavailable(e.driverError, depth + 1) || isDatabaseUnavailable(e.cause, depth + 1)
  );
}

/** The one error middleware, last in the chain: every error becomes the problem-style body. */
export function errorHandler(log: (msg: string, err: unknown) => void): ErrorRequestHandler {
  return (err, _req, res, next) => {
    if (res.headersSent) {
      // The answer was already on its way (a streamed file, a request that timed out): it can
      // no longer become a problem body. Express's own handler ends the connection.
      log('error after the answer was sent', err);
      next(err);
      return;
    }
    if (err instanceof ServiceError) {
      res.status(err.status).json({
        error: {
          code: err.code,
          message: err.message,
          ...(err.details !== undefined ? { details: err.details } : {}),
        },
      });
      return;
    }
    if (err instanceof ZodError) {
      const details = fieldIssues(err);
      res
        .status(400)
        .json({ error: { code: 'validation_failed', message: describe(details), details } });
      return;
    }
    // body-parser errors carry a status (malformed JSON 400, too large 413)
    const carried: unknown = (err as { status?: unknown } | null | undefined)?.status;
    const status = typeof carried === 'number' ? carried : 500;
    if (status >= 400 && status < 500) {
      res.status(status).json({
        error: {
          code: status === 413 ? 'payload_too_large' : 'bad_request',
          message:
            status === 413 ? 'The request is too large.' : 'The request body is not valid JSON.',
        },
      });
      return;
    }
    if (isDatabaseUnavailable(err)) {
      // The database is down or restarting: a temporary condition, not a fault in the request.
      res.setHeader('Retry-After', String(DATABASE_RETRY_AFTER_SECONDS));
      res.status(503).json({
        error: {
          code: 'database_unavailable',
          message: 'The service is briefly unavailable. Try again in a few seconds.',
          details: { retryAfterSeconds: DATABASE_RETRY_AFTER_SECONDS },
        },
      });
      return;
    }
    log('unhandled error', err);
    res.status(500).json({
      error: { code: 'internal', message: 'Something went wrong on our side. Try again.' },
    });
  };
}

/** A readable one-line summary of field issues, naming the fields. */
export function describe(details: FieldIssue[]): string {
  if (details.length === 0) return 'The request is not valid.';
  const first = details[0]!;
  const more = details.length > 1 ? ` (and ${details.length - 1} more)` : '';
  return `${first.path}: ${first.message}${more}`;
}
