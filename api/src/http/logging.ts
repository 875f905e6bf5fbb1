/**
 * Structured logs: one JSON object per line (pino), one line per HTTP request (pino-http) with
 * the request id, which is also sent back in the X-Request-Id header. A caller's own
 * X-Request-Id (a proxy's) is kept when it is a short token; anything else gets a fresh UUID.
 * Request lines carry method, path, status, time and client address; never cookies, CSRF
 * tokens, bodies or other headers.
 */
import { randomUUID } from 'node:crypto';
import type { IncomingMessage, ServerResponse } from 'node:http';
import type { RequestHandler } from 'express';
import { pino, type DestinationStream, type Logger } from 'pino';
import { pinoHttp } from 'pino-http';

export type { Logger } from 'pino';
export const REQUEST_ID_HEADER = 'X-Request-Id';
const SAFE_ID = /^[A-Za-z0-9._:-]{8,64}$/;

export interface LoggerOptions {
  /** pino level name (LOG_LEVEL); default info. */
  level?: string;
  /** Where lines go (default stdout). */
  destination?: DestinationStream;
}

export function createLogger(o: LoggerOptions = {}): Logger {
  const options = {
    level: o.level ?? 'info',
    base: { service: 'ringlet' },
    timestamp: pino.stdTimeFunctions.isoTime,
  };
  return o.destination ? pino(options, o.destination) : pino(options);
}

/** A logger that writes nothing (tests that do not look at the log). */
export function silentLogger(): Logger {
  return pino({ enabled: false });
}

/** The app's `log(msg, err?)` function on top of a pino logger. */
export function logFunction(logger: Logger): (msg: string, err?: unknown) => void {
  return (msg, err) => {
    if (err === undefined || err === '') logger.info(msg);
    else logger.error({ err }, msg);
  };
}

/** The request id of a request that passed requestLogging (undefined before it). */
export function requestId(req: IncomingMessage): string | undefined {
  return (req as IncomingMessage & { id?: string }).id;
}

/** The first middleware: assigns the request id, sets the header, logs the finished request. */
export function requestLogging(logger: Logger): RequestHandler {
  const http = pinoHttp({
    logger,
    genReqId(req: IncomingMessage, res: ServerResponse) {
      const given = req.headers['x-request-id'];
      const id = typeof given === 'string' && SAFE_ID.test(given) ? given : randomUUID();
      res.setHeader(REQUEST_ID_HEADER, id);
      return id;
    },
    customLogLevel(_req, res, err) {
      if (err || res.statusCode >= 500) return 'error';
      if (res.statusCode >= 400) return 'warn';
      return 'info';
    },
    customSuccessMessage: (req, res) =>
      `${req.method} ${(req as IncomingMessage & { originalUrl?: string }).originalUrl ?? req.url} ${res.statusCode}`,
    customErrorMessage: (req, res) =>
      `${req.method} ${(req as IncomingMessage & { originalUrl?: string }).originalUrl ?? req.url} ${res.statusCode}`,
    serializers: {
      req: (req: { id: string; method: string; url: string; remoteAddress?: string }) => ({
        id: req.id,
        method: req.method,
        url: req.url.split('?')[0],
        remoteAddress: req.remoteAddress,
      }),
      res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
    },
    wrapSerializers: true,
    quietReqLogger: true,
  });
  return http as unknown as RequestHandler;
}
