import { type ArgumentsHost, Catch, type ExceptionFilter, HttpException, HttpStatus, Logger } from '@nestjs/common';
import type { Response } from 'express';
import { STATUS_CODES } from 'node:http';
import type { HttpErrorBody } from './http-error.js';

interface StatusError {
  status?: number;
  statusCode?: number;
  type?: string;
  expose?: boolean;
  message?: string;
}

/** Errors raised by Express middleware (body parser): they carry an HTTP status and are safe to show. */
function isExposedHttpError(e: unknown): e is StatusError {
  if (typeof e !== 'object' || e === null) return false;
  const s = (e as StatusError).status ?? (e as StatusError).statusCode;
  return typeof s === 'number' && s >= 400 && s < 500 && (e as StatusError).expose === true;
}

/** Turn any thrown value into { statusCode, error, message, details }. */
export function toErrorBody(exception: unknown): HttpErrorBody {
  if (exception instanceof HttpException) {
    const statusCode = exception.getStatus();
    const response = exception.getResponse();
    let message = exception.message;
    let details: unknown = null;
    if (typeof response === 'string') {
      message = response;
    } else if (typeof response === 'object' && response !== null) {
      const r = response as { message?: unknown; details?: unknown };
      if (typeof r.message === 'string') message = r.message;
      else if (Array.isArray(r.message)) {
        message = r.message.map(String).join('; ');
        details = r.message;
      }
      if (r.details !== undefined) details = r.details;
    }
    return { statusCode, error: STATUS_CODES[statusCode] ?? 'Error', message, details };
  }
  if (isExposedHttpError(exception)) {
    const statusCode = exception.status ?? exception.statusCode ?? 400;
    return {
      statusCode,
      error: STATUS_CODES[statusCode] ?? 'Error',
      message: exception.message ?? 'Bad request',
      details: exception.type ? { type: exception.type } : null,
    };
  }
  const statusCode = HttpStatus.INTERNAL_SERVER_ERROR;
  return {
    statusCode,
    error: STATUS_CODES[statusCode] ?? 'Internal Server Error',
    message: 'Internal server error; the server log has the details',
    details: null,
  };
}

interface DriverError {
  sqlMessage?: string;
  errno?: number;
  sqlState?: string;
}

/**
 * What the log says about an unexpected failure. Database errors name the database's own message,
 * errno and SQL state, but never the statement or its parameters (they may hold password hashes).
 */
export function describeFailure(exception: unknown): string {
  if (!(exception instanceof Error)) return String(exception);
  const parent = (exception as { parent?: DriverError }).parent;
  const stack = (exception.stack ?? '').split('\n').slice(1).join('\n');
  if (parent && typeof parent.sqlMessage === 'string') {
    return `${exception.name}: ${parent.sqlMessage} (errno ${parent.errno ?? '?'}, SQLSTATE ${parent.sqlState ?? '?'})\n${stack}`;
  }
  return exception.stack ?? `${exception.name}: ${exception.message}`;
}

/** The one global exception filter: every error, including 404 on unknown /api routes, gets one shape. */
@Catch()
export class AllExceptionsFilter implements ExceptionFilter {
  private readonly logger = new Logger('HttpError');

  catch(exception: unknown, host: ArgumentsHost): void {
    const res = host.switchToHttp().getResponse<Response>();
    const body = toErrorBody(exception);
    if (body.statusCode >= 500) {
      this.logger.error(describeFailure(exception));
    }
    if (res.headersSent) return;
    res.status(body.statusCode).json(body);
  }
}
