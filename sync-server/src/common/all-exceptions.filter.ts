import { type ArgumentsHost, Catch, type ExceptionFilter, HttpException, HttpStatus, Logger } from '@nestjs/common';
import type { Response } from 'express';
import { STATUS_CODES } from 'node:http';
import { AccessDeniedError, ConnectionError } from 'sequelize';
import type { HttpErrorBody } from './http-error.js';

interface StatusError {
  status?: number;
  statusCode?: number;
  type?: string;
  expose?: boolean;
  message?: string;
  /** Body parser, body too large: the limit and the declared (`length`) or read (`received`) size in bytes. */
  limit?: number;
  length?: number;
  received?: number;
}

/** Driver error codes and MariaDB errnos that mean the connection to the database is gone or cannot be had. */
const LOST_CODES = new Set([
  'ER_CONNECTION_KILLED',
  'ER_SOCKET_UNEXPECTED_CLOSE',
  'ER_CONNECTION_ALREADY_CLOSED',
  'ER_CMD_CONNECTION_CLOSED',
  'ER_GET_CONNECTION_TIMEOUT',
  'ER_CONNECTION_TIMEOUT',
  'ER_CLOSING_POOL',
  'ER_SERVER_SHUTDOWN',
  'ECONNREFUSED',
  'ECONNRESET',
  'EPIPE',
  'ETIMEDOUT',
]);
const LOST_ERRNOS = new Set([1053, 1927, 2006, 2013]);

/**
 * The database cannot be reached or dropped the connection mid-request (killed, restarted,
 * network): Sequelize's connection errors (except a refused login, which retrying will not fix),
 * or a query error whose driver error says the connection is gone.
 */
export function isDatabaseUnavailable(exception: unknown): boolean {
  let e: unknown = exception;
  for (let depth = 0; depth < 4 && typeof e === 'object' && e !== null; depth++) {
    if (e instanceof AccessDeniedError) return false;
    if (e instanceof ConnectionError) return true;
    const { code, errno } = e as { code?: unknown; errno?: unknown };
    if ((typeof code === 'string' && LOST_CODES.has(code)) || (typeof errno === 'number' && LOST_ERRNOS.has(errno))) return true;
    const next = e as { parent?: unknown; original?: unknown; cause?: unknown };
    e = next.parent ?? next.original ?? next.cause;
  }
  return false;
}

function bytesAndMiB(n: number): string {
  if (n >= 1024 * 1024) return `${n} bytes (${(n / (1024 * 1024)).toFixed(1)} MiB)`;
  return n >= 1024 ? `${n} bytes (${(n / 1024).toFixed(1)} KiB)` : `${n} bytes`;
}

/** Errors raised by Express middleware (body parser): they carry an HTTP status and are safe to show. */
function isExposedHttpError(e: unknown): e is StatusError {
  if (typeof e !== 'object' || e === null) return false;
  const s = (e as StatusError).status ?? (e as StatusError).statusCode;
  return typeof s === 'number' && s >= 400 && s < 500 && (e as StatusError).expose === true;
}

/** Turn any thrown value into { statusCode, error, message, details }. */
export function toErrorBody(exception: unknown): HttpErrorBody {
  // Body parser errors arrive as they are or (Nest's Express adapter) as an HttpException with the original as cause.
  const parserError = exception instanceof HttpException ? exception.cause : exception;
  if (isExposedHttpError(parserError) && parserError.type === 'entity.too.large' && typeof parserError.limit === 'number') {
    const tooLarge = { ...parserError, limit: parserError.limit };
    const size = tooLarge.length ?? tooLarge.received;
    return {
      statusCode: 413,
      error: STATUS_CODES[413] ?? 'Payload Too Large',
      message:
        `The request body${size === undefined ? '' : ` is ${bytesAndMiB(size)}, but it`} is over the server's limit of ${bytesAndMiB(tooLarge.limit)} per request, ` +
        'set by PW_BODY_LIMIT: send less per request (map sync: push the points in several batches) or raise PW_BODY_LIMIT on the server',
      details: { type: tooLarge.type, limit: tooLarge.limit, ...(size === undefined ? {} : { bytes: size }), setting: 'PW_BODY_LIMIT' },
    };
  }
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
  if (isDatabaseUnavailable(exception)) {
    return {
      statusCode: HttpStatus.SERVICE_UNAVAILABLE,
      error: STATUS_CODES[503] ?? 'Service Unavailable',
      message: 'Database unavailable (the connection was lost or could not be made); this request was not completed, retry in a moment',
      details: { reason: 'database-unavailable' },
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
    if (body.statusCode === 503) res.setHeader('Retry-After', '5');
    res.status(body.statusCode).json(body);
  }
}
