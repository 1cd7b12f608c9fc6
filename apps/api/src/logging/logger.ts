import { randomUUID } from 'node:crypto';
import type { IncomingMessage, ServerResponse } from 'node:http';
import type { LoggerService } from '@nestjs/common';
import { pino, type DestinationStream, type Level, type Logger } from 'pino';

declare module 'http' {
  // A module augmentation names the interface it extends.
  // oxlint-disable-next-line eslint/no-shadow
  interface IncomingMessage {
    /** The request id: the X-Request-Id header, every log line of the request, error replies, audit rows. */
    id?: string;
    /** A logger whose lines name the request (`req`: id, method, path); made on first use. */
    log?: Logger;
  }
}

/**
 * Structured logs (pino, one JSON object per line) with a request id in every line. Patient data
 * never reaches a log: no bodies, no query strings (a patient search is a name), no cookies, and
 * no SQL parameters (see `errorForLog`).
 */
export function createLogger(level: string, destination?: DestinationStream): Logger {
  const options = {
    level,
    base: { service: 'torquetrail-api' },
    redact: {
      paths: ['req.headers.cookie', 'req.headers.authorization', 'res.headers["set-cookie"]'],
      censor: '[redacted]',
    },
  };
  return destination ? pino(options, destination) : pino(options);
}

/** A client's X-Request-Id is kept when it is a plain token, so a proxy's id threads through. */
const REQUEST_ID = /^[A-Za-z0-9._-]{8,64}$/;

function requestId(req: IncomingMessage, res: ServerResponse): string {
  const given = req.headers['x-request-id'];
  const id = typeof given === 'string' && REQUEST_ID.test(given) ? given : randomUUID();
  res.setHeader('X-Request-Id', id);
  return id;
}

/** The level of a request's line: failures are errors, refusals info, the rest debug. */
const levelOf = (res: ServerResponse, error: unknown): Level =>
  error || res.statusCode >= 500 ? 'error' : res.statusCode >= 400 ? 'info' : 'debug';

/**
 * One line per request: id, method, path (no query string), status, time — the lines pino-http
 * wrote (same fields, levels and messages; logging.e2e-spec.ts and logger.spec.ts), without
 * its work on every request: pino-http made each request a child logger (its bindings serialized
 * and redacted) and serialized the whole request and reply first, though at the production level
 * (info) a request that succeeds writes no line. Here the child logger is made only when a line is
 * written or a handler asks for `req.log`.
 */
export function httpLogger(logger: Logger) {
  return (req: IncomingMessage & { originalUrl?: string }, res: ServerResponse, next: () => void): void => {
    const started = Date.now();
    const id = (req.id ||= requestId(req, res));
    const fields = { id, method: req.method, path: (req.originalUrl ?? req.url ?? '').split('?')[0] };
    let child: Logger | undefined;
    const log = () => (child ??= logger.child({ req: fields }));
    Object.defineProperty(req, 'log', { get: log, configurable: true, enumerable: true });
    const done = (error?: Error) => {
      res.removeListener('close', done);
      res.removeListener('finish', done);
      res.removeListener('error', done);
      const level = levelOf(res, error);
      if (!logger.isLevelEnabled(level)) return;
      const responseTime = Date.now() - started;
      // As pino-std-serializers had it: no status before the headers went (a request aborted early).
      const reply = { statusCode: res.headersSent ? res.statusCode : null };
      if (error || res.statusCode >= 500) {
        const err = error ?? new Error(`failed with status code ${res.statusCode}`);
        log()[level]({ res: reply, err, responseTime }, 'request errored');
        return;
      }
      const ended = !req.readableAborted && res.writableEnded;
      log()[level]({ res: reply, responseTime }, ended ? 'request completed' : 'request aborted');
    };
    res.on('close', done);
    res.on('finish', done);
    res.on('error', done);
    next();
  };
}

/**
 * What of an unexpected error is logged: its kind, PostgreSQL's error code and the stack frames —
 * never the message of a failed query, which carries the SQL parameters (clinical notes, ids).
 */
export function errorForLog(error: unknown): Record<string, unknown> {
  if (!(error instanceof Error)) return { type: typeof error };
  const cause = error.cause as { code?: unknown; constraint?: unknown } | undefined;
  const isQuery = 'query' in error || 'params' in error;
  return {
    type: error.constructor.name === 'Error' ? error.name : error.constructor.name,
    ...(typeof cause?.code === 'string' ? { pgCode: cause.code } : {}),
    ...(typeof cause?.constraint === 'string' ? { constraint: cause.constraint } : {}),
    message: isQuery ? 'database query failed (query and parameters withheld)' : error.message,
    stack: error.stack
      ?.split('\n')
      .filter((line) => line.trimStart().startsWith('at '))
      .join('\n'),
  };
}

/** Nest's own log calls (start-up, warnings) through the same pino logger. */
export class PinoNestLogger implements LoggerService {
  constructor(private readonly logger: Logger) {}

  log(message: unknown, context?: string) {
    this.logger.info({ context }, String(message));
  }
  error(message: unknown, stackOrContext?: string, context?: string) {
    this.logger.error({ context: context ?? stackOrContext }, String(message));
  }
  warn(message: unknown, context?: string) {
    this.logger.warn({ context }, String(message));
  }
  debug(message: unknown, context?: string) {
    this.logger.debug({ context }, String(message));
  }
  verbose(message: unknown, context?: string) {
    this.logger.trace({ context }, String(message));
  }
}
