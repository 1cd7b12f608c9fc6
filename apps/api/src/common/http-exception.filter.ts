import { type ArgumentsHost, Catch, type ExceptionFilter, HttpException, HttpStatus } from '@nestjs/common';
import type { Request, Response } from 'express';
import { errorForLog } from '../logging/logger.js';
import type { ErrorReply } from '@torquetrail/contracts';
import { asAmendmentConflict } from './amendment-conflict.js';
import { transportMessage } from './transport-errors.js';
import { UNAVAILABLE_MESSAGES, unavailableDependency } from './unavailable.js';

const STATUS_TEXT: Record<number, string> = {
  400: 'Bad Request',
  401: 'Unauthorized',
  403: 'Forbidden',
  404: 'Not Found',
  409: 'Conflict',
  429: 'Too Many Requests',
  500: 'Internal Server Error',
  503: 'Service Unavailable',
};

/**
 * Maps every error to the one ErrorReply shape, with the request id; unexpected errors are logged
 * (without query parameters or bodies: see errorForLog), never leaked. A second amendment refused
 * by the database's unique index is a 409 (see amendment-conflict.ts); a request that failed
 * because PostgreSQL or S3 is out of reach is a 503 with a plain message (see unavailable.ts).
 */
@Catch()
export class HttpExceptionFilter implements ExceptionFilter {
  catch(thrown: unknown, host: ArgumentsHost): void {
    const req = host.switchToHttp().getRequest<Request>();
    const res = host.switchToHttp().getResponse<Response>();
    const exception = asAmendmentConflict(thrown);
    let reply: ErrorReply;
    const unavailable = exception instanceof HttpException ? null : unavailableDependency(exception);
    if (unavailable) {
      req.log?.warn({ err: errorForLog(exception), dependency: unavailable }, 'dependency unavailable');
      reply = {
        statusCode: HttpStatus.SERVICE_UNAVAILABLE,
        error: STATUS_TEXT[503],
        message: UNAVAILABLE_MESSAGES[unavailable],
      };
    } else if (exception instanceof HttpException) {
      const status = exception.getStatus();
      const body = exception.getResponse();
      const obj = typeof body === 'object' && body !== null ? (body as Record<string, unknown>) : {};
      const raw = typeof body === 'string' ? body : obj.message;
      const own = Array.isArray(raw) ? raw.join('; ') : typeof raw === 'string' ? raw : exception.message;
      const message = transportMessage(exception) ?? own;
      reply = {
        statusCode: status,
        error: STATUS_TEXT[status] ?? 'Error',
        message,
        ...(obj.fields ? { fields: obj.fields as Record<string, string> } : {}),
      };
    } else {
      req.log?.error({ err: errorForLog(exception) }, 'unexpected error');
      reply = {
        statusCode: HttpStatus.INTERNAL_SERVER_ERROR,
        error: STATUS_TEXT[500],
        message: 'Something went wrong on the server',
      };
    }
    res.status(reply.statusCode).json({ ...reply, requestId: typeof req.id === 'string' ? req.id : undefined });
  }
}
