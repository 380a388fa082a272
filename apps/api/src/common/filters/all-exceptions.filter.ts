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
    const e = exception as { status?: unknown; statusCode?: unknown; type?: unknown; message?: unknown };
    const status =
      typeof e.status === 'number' ? e.status : typeof e.statusCode === 'number' ? e.statusCode : 500;
    if (status >= 400 && status < 500) {
      const code =
        e.type === 'entity.parse.failed'
          ? 'REQUEST.MALFORMED_JSON'
          : e.type === 'entity.too.large'
            ? 'REQUEST.TOO_LARGE'
            : (DEFAULT_CODES[status] ?? `HTTP.${status}`);
      const message =
        e.type === 'entity.parse.failed'
          ? 'The request body is not valid JSON'
          : e.type === 'entity.too.large'
            ? 'The request body is too large'
            : typeof e.message === 'string'
              ? e.message
              : 'Bad request';
      return { statusCode: status, code, message, requestId };
    }
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
  const msg = typeof e?.message === 'string' ? e.message : '';
  return /Connection terminated|connect ECONNREFUSED|terminating connection/i.test(msg);
}
