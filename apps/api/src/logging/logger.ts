import { randomUUID } from 'node:crypto';
import type { IncomingMessage, ServerResponse } from 'node:http';
import type { LoggerService } from '@nestjs/common';
import { pino, type DestinationStream, type Logger } from 'pino';
import { pinoHttp } from 'pino-http';

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

/** One line per request: id, method, path (no query string), status, time. */
export function httpLogger(logger: Logger) {
  return pinoHttp({
    logger,
    genReqId: requestId,
    customLogLevel: (_req, res, error) =>
      error || res.statusCode >= 500 ? 'error' : res.statusCode >= 400 ? 'info' : 'debug',
    serializers: {
      req: (req: { id: string; method: string; url: string }) => ({
        id: req.id,
        method: req.method,
        path: req.url.split('?')[0],
      }),
      res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
    },
  });
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
