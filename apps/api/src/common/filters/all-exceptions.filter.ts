import {
  type ArgumentsHost,
  Catch,
  type ExceptionFilter,
  HttpException,
  HttpStatus,
  Logger,
} from '@nestjs/common';
import { type ErrorBody } from '@kerfwright/contracts';
import { type Request, type Response } from 'express';
import { PG_DEADLOCK_DETECTED, PG_SERIALIZATION_FAILURE, pgError } from '../db-helpers';
import { requestIdOf } from '../middleware/request-id.middleware';

const DEFAULT_CODES: Record<number, string> = {
  400: 'REQUEST.INVALID',
  401: 'AUTH.UNAUTHENTICATED',
  403: 'AUTH.FORBIDDEN',
  404: 'ROUTE.NOT_FOUND',
  405: 'REQUEST.METHOD_NOT_ALLOWED',
  409: 'STATE.CONFLICT',
  413: 'REQUEST.TOO_LARGE',
  415: 'REQUEST.UNSUPPORTED_MEDIA_TYPE',
  422: 'REQUEST.UNPROCESSABLE',
  429: 'RATE_LIMIT.EXCEEDED',
  503: 'SERVICE.UNAVAILABLE',
};

/** Renders every error as `{ statusCode, code, message, details?, requestId }`; never a stack trace. */
@Catch()
export class AllExceptionsFilter implements ExceptionFilter {
  private readonly logger = new Logger('Errors');

  catch(exception: unknown, host: ArgumentsHost): void {
    const ctx = host.switchToHttp();
    const req = ctx.getRequest<Request>();
    const res = ctx.getResponse<Response>();
    const body = this.toBody(exception, requestIdOf(req));
    if (body.statusCode >= 500) {
      this.logger.error(
        `${req.method} ${req.originalUrl} → ${body.statusCode} [${body.requestId}]`,
        exception instanceof Error ? exception.stack : String(exception),
      );
    }
    if (!res.headersSent) res.status(body.statusCode).json(body);
  }

  private toBody(exception: unknown, requestId: string): ErrorBody {
    // Express and body-parser errors reach filters wrapped in an HttpException whose cause is the original.
    const parserError = exception instanceof HttpException ? bodyParserError(exception.cause) : null;
    if (parserError) return { ...parserError, requestId };
    if (exception instanceof HttpException) {
      const statusCode = exception.getStatus();
      const response = exception.getResponse();
      const r =
        typeof response === 'object' && response !== null ? (response as Record<string, unknown>) : {};
      const message =
        typeof r.message === 'string'
          ? r.message
          : typeof response === 'string'
            ? response
            : Array.isArray(r.message)
              ? r.message.join('; ')
              : exception.message;
      const body: ErrorBody = {
        statusCode,
        code: typeof r.code === 'string' ? r.code : (DEFAULT_CODES[statusCode] ?? `HTTP.${statusCode}`),
        message,
        requestId,
      };
      if (r.details !== undefined) body.details = r.details;
      return body;
    }
    // Errors raised by Express middleware (body parser: malformed JSON, body too large) carry a status.
    const direct = bodyParserError(exception);
    if (direct) return { ...direct, requestId };
    const e = exception as { status?: unknown; statusCode?: unknown; message?: unknown };
    const status =
      typeof e.status === 'number' ? e.status : typeof e.statusCode === 'number' ? e.statusCode : 500;
    if (status >= 400 && status < 500) {
      const message = typeof e.message === 'string' ? e.message : 'Bad request';
      return { statusCode: status, code: DEFAULT_CODES[status] ?? `HTTP.${status}`, message, requestId };
    }
    const data = databaseInputError(exception) ?? abortedTransaction(exception);
    if (data) return { ...data, requestId };
    if (isDatabaseUnavailable(exception)) {
      return {
        statusCode: HttpStatus.SERVICE_UNAVAILABLE,
        code: 'SERVICE.DATABASE_UNAVAILABLE',
        message: 'The database is not reachable; try again shortly',
        requestId,
      };
    }
    return {
      statusCode: HttpStatus.INTERNAL_SERVER_ERROR,
      code: 'SERVER.INTERNAL',
      message: 'Something went wrong on our side; the request id helps us find it',
      requestId,
    };
  }
}

/** Connection-level failures from the PostgreSQL driver (server down, restarting, refusing connections). */
export function isDatabaseUnavailable(err: unknown): boolean {
  const e = err as { code?: unknown; message?: unknown; driverError?: { code?: unknown } };
  const code =
    typeof e?.code === 'string' ? e.code : typeof e?.driverError?.code === 'string' ? e.driverError.code : '';
  if (
    [
      'ECONNREFUSED',
      'ECONNRESET',
      'ETIMEDOUT',
      '57P01',
      '57P02',
      '57P03',
      '08006',
      '08001',
      '08003',
    ].includes(code)
  ) {
    return true;
  }
  // A transaction whose connection the server dropped: TypeORM has already released its query runner
  // (QueryRunnerAlreadyReleasedError, or QueryRunnerProviderAlreadyReleasedError when the transaction's
  // manager queries through the data source afterwards).
  const name = (err as Error | undefined)?.name ?? '';
  if (/^QueryRunner(Provider)?AlreadyReleasedError$/.test(name)) return true;
  const msg = typeof e?.message === 'string' ? e.message : '';
  // "…is not queryable": node-postgres refusing a client whose connection already failed.
  return /Connection terminated|connect ECONNREFUSED|terminating connection|connection error and is not queryable/i.test(
    msg,
  );
}

/** The body parser's own errors (by their `type`), in our words rather than the parser's. */
function bodyParserError(err: unknown): Omit<ErrorBody, 'requestId'> | null {
  const type = (err as { type?: unknown } | null | undefined)?.type;
  if (type === 'entity.parse.failed') {
    return { statusCode: 400, code: 'REQUEST.MALFORMED_JSON', message: 'The request body is not valid JSON' };
  }
  if (type === 'entity.too.large') {
    return { statusCode: 413, code: 'REQUEST.TOO_LARGE', message: 'The request body is too large' };
  }
  if (type === 'encoding.unsupported' || type === 'charset.unsupported') {
    return {
      statusCode: 415,
      code: 'REQUEST.UNSUPPORTED_MEDIA_TYPE',
      message: 'Send the body as UTF-8 JSON',
    };
  }
  return null;
}

/**
 * A PostgreSQL error caused by the values sent rather than by the server: class 22 (data exception: a
 * value out of range, too long, or holding a character the database cannot store) is the client's 400; a
 * unique or foreign-key violation that a service did not turn into its own error is a 409. Anything else
 * stays a 500. (SQLSTATE classes: PostgreSQL manual, appendix A "Error Codes".)
 */
export function databaseInputError(err: unknown): Omit<ErrorBody, 'requestId'> | null {
  const e = err as { name?: unknown; code?: unknown; driverError?: { code?: unknown } } | null;
  if (!e || e.name !== 'QueryFailedError') return null;
  const code = typeof e.driverError?.code === 'string' ? e.driverError.code : e.code;
  if (typeof code !== 'string') return null;
  if (code.startsWith('22')) {
    return {
      statusCode: HttpStatus.BAD_REQUEST,
      code: 'REQUEST.INVALID_VALUE',
      message: 'A value in the request cannot be stored (out of range, too long or not valid text)',
    };
  }
  if (code === '23505' || code === '23503') {
    return {
      statusCode: HttpStatus.CONFLICT,
      code: 'STATE.CONFLICT',
      message: 'The change conflicts with other records; reload and try again',
    };
  }
  return null;
}

/**
 * A transaction PostgreSQL rolled back to settle a race between concurrent ones, which a service did not settle
 * itself: 40P01 deadlock_detected and 40001 serialization_failure (PostgreSQL manual, appendix A "Error
 * Codes"; the manual's "Serialization Failure Handling" says to retry the transaction). A 409, sent again it
 * may well succeed.
 */
export function abortedTransaction(err: unknown): Omit<ErrorBody, 'requestId'> | null {
  const code = pgError(err)?.code;
  if (code !== PG_DEADLOCK_DETECTED && code !== PG_SERIALIZATION_FAILURE) return null;
  return {
    statusCode: HttpStatus.CONFLICT,
    code: 'STATE.CONFLICT',
    message: 'The change met another one made at the same moment and was not made; reload and try again',
  };
}
