import { ArgumentsHost, Catch, ExceptionFilter, HttpException, HttpStatus, Logger } from '@nestjs/common';
import type { Request, Response } from 'express';
import { OUTAGE_MESSAGES, isDatabaseOutage, isRedisOutage } from './outage.js';
import { JsonTooDeepError } from './request-hygiene.js';
import { requestIdOf } from './request-id.js';

/** The one error shape of the API. */
export interface ErrorBody {
  statusCode: number;
  error: string;
  message: string;
  details?: string[];
  /** With 429: how long to wait (also sent as Retry-After). */
  retryAfterSeconds?: number;
  /** With 5xx: the request's id, as the server log names it (also the X-Request-Id header). */
  requestId?: string;
}

const REASONS: Record<number, string> = {
  400: 'Bad Request',
  401: 'Unauthorized',
  403: 'Forbidden',
  404: 'Not Found',
  409: 'Conflict',
  413: 'Payload Too Large',
  429: 'Too Many Requests',
  500: 'Internal Server Error',
  503: 'Service Unavailable',
};
const reason = (statusCode: number): string => REASONS[statusCode] ?? 'Error';

/** Turns every error into ErrorBody; unexpected errors are logged and shown without internals. */
@Catch()
export class AllExceptionsFilter implements ExceptionFilter {
  private readonly logger = new Logger('Errors');

  catch(exception: unknown, host: ArgumentsHost): void {
    const http = host.switchToHttp();
    const res = http.getResponse<Response>();
    const req = http.getRequest<Request | undefined>();
    const body = toErrorBody(exception);
    if (body.retryAfterSeconds !== undefined) res.setHeader('Retry-After', String(body.retryAfterSeconds));
    if (body.statusCode >= 500) {
      const id = req ? requestIdOf(req) : undefined;
      const where = `${req?.method ?? '?'} ${req?.originalUrl?.split('?')[0] ?? '?'} [request ${id ?? '-'}]`;
      if (body.statusCode === 503) {
        this.logger.warn(`${where}: ${exception instanceof Error ? exception.message : String(exception)}`);
      } else {
        this.logger.error(
          `${where}: ${exception instanceof Error ? (exception.stack ?? exception.message) : String(exception)}`,
        );
      }
      if (id) body.requestId = id;
    }
    res.status(body.statusCode).json(body);
  }
}

export function toErrorBody(exception: unknown): ErrorBody {
  const cause = exception instanceof Error ? exception.cause : undefined;
  if (exception instanceof JsonTooDeepError || cause instanceof JsonTooDeepError) {
    return {
      statusCode: 400,
      error: reason(400),
      message: String((cause instanceof JsonTooDeepError ? cause : (exception as JsonTooDeepError)).message),
    };
  }
  if (exception instanceof HttpException) {
    const statusCode: HttpStatus = exception.getStatus();
    const response = exception.getResponse();
    const error = reason(statusCode);
    if (statusCode === HttpStatus.TOO_MANY_REQUESTS) {
      const own = response as { message?: unknown; retryAfterSeconds?: unknown };
      if (typeof own === 'object' && typeof own.message === 'string') {
        const retry = typeof own.retryAfterSeconds === 'number' ? own.retryAfterSeconds : undefined;
        return { statusCode, error, message: own.message, ...(retry ? { retryAfterSeconds: retry } : {}) };
      }
      return { statusCode, error, message: 'Too many attempts; wait a minute and try again' };
    }
    if (statusCode === HttpStatus.PAYLOAD_TOO_LARGE) {
      return { statusCode, error, message: 'The request body is too large' };
    }
    // The platform maps a body that fails to parse to a 400 whose cause is the SyntaxError.
    if (exception.cause instanceof SyntaxError) {
      return { statusCode, error, message: 'The request body is not valid JSON' };
    }
    if (typeof response === 'string') return { statusCode, error, message: response };
    const raw = (response as { message?: unknown }).message;
    if (Array.isArray(raw)) {
      const details = raw.map(String);
      return { statusCode, error, message: `Invalid input: ${details.join('; ')}`, details };
    }
    return { statusCode, error, message: typeof raw === 'string' ? raw : exception.message };
  }
  // An outage of PostgreSQL or Redis is not a bug: say so plainly, with 503.
  if (isRedisOutage(exception))
    return { statusCode: 503, error: reason(503), message: OUTAGE_MESSAGES.redis };
  if (isDatabaseOutage(exception))
    return { statusCode: 503, error: reason(503), message: OUTAGE_MESSAGES.database };
  return {
    statusCode: 500,
    error: reason(500),
    message: 'Something went wrong on the server; it has been logged',
  };
}
