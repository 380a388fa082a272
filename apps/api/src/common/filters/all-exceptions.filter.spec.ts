import { type ArgumentsHost, BadRequestException, NotFoundException } from '@nestjs/common';
import { AppError } from '../errors';
import { AllExceptionsFilter, isDatabaseUnavailable } from './all-exceptions.filter';

function run(exception: unknown) {
  let status = 0;
  let body: Record<string, unknown> = {};
  const res = {
    headersSent: false,
    status(s: number) {
      status = s;
      return this;
    },
    json(b: Record<string, unknown>) {
      body = b;
    },
  };
  const req = { method: 'GET', originalUrl: '/api/x', requestId: 'req-1' };
  const host = {
    switchToHttp: () => ({ getRequest: () => req, getResponse: () => res }),
  } as unknown as ArgumentsHost;
  new AllExceptionsFilter().catch(exception, host);
  return { status, body };
}

describe('the one error body', () => {
  it('keeps the code, message and details of an application error', () => {
    const { status, body } = run(new AppError(409, 'JOB.ILLEGAL_TRANSITION', 'no', { from: 'draft' }));
    expect(status).toBe(409);
    expect(body).toEqual({
      statusCode: 409,
      code: 'JOB.ILLEGAL_TRANSITION',
      message: 'no',
      details: { from: 'draft' },
      requestId: 'req-1',
    });
  });

  it('gives framework errors a default AREA.REASON code', () => {
    expect(run(new NotFoundException('Cannot GET /api/x')).body).toMatchObject({ code: 'ROUTE.NOT_FOUND' });
    expect(run(new BadRequestException()).body).toMatchObject({ statusCode: 400, code: 'REQUEST.INVALID' });
  });

  it('maps body-parser failures to 4xx without internals', () => {
    const tooLarge = Object.assign(new Error('request entity too large'), {
      status: 413,
      type: 'entity.too.large',
    });
    expect(run(tooLarge)).toMatchObject({ status: 413, body: { code: 'REQUEST.TOO_LARGE' } });
  });

  it('hides unexpected errors behind a 500 with no stack trace', () => {
    const { status, body } = run(new Error('secret internals at db.ts:12'));
    expect(status).toBe(500);
    expect(body.code).toBe('SERVER.INTERNAL');
    expect(JSON.stringify(body)).not.toContain('secret internals');
  });

  it('answers 503 when PostgreSQL is unreachable', () => {
    const down = Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:5432'), { code: 'ECONNREFUSED' });
    expect(isDatabaseUnavailable(down)).toBe(true);
    expect(run(down)).toMatchObject({ status: 503, body: { code: 'SERVICE.DATABASE_UNAVAILABLE' } });
    const dropped = Object.assign(new Error('Query runner already released.'), {
      name: 'QueryRunnerAlreadyReleasedError',
    });
    expect(run(dropped)).toMatchObject({ status: 503, body: { code: 'SERVICE.DATABASE_UNAVAILABLE' } });
    // Seen in outages.e2e-spec.ts: a job created in a transaction whose connection died, read back through it.
    const provider = Object.assign(
      new Error('Database connection provided by a query runner was already released'),
      { name: 'QueryRunnerProviderAlreadyReleasedError' },
    );
    expect(run(provider)).toMatchObject({ status: 503, body: { code: 'SERVICE.DATABASE_UNAVAILABLE' } });
    expect(isDatabaseUnavailable(Object.assign(new Error('x'), { name: 'QueryRunnerBrokenError' }))).toBe(
      false,
    );
    // Also seen there: node-postgres refusing a pooled client whose connection had failed (TypeORM wraps it).
    const unqueryable = Object.assign(
      new Error('Client has encountered a connection error and is not queryable'),
      { name: 'QueryFailedError' },
    );
    expect(run(unqueryable)).toMatchObject({ status: 503, body: { code: 'SERVICE.DATABASE_UNAVAILABLE' } });
  });

  it('maps body-parser failures that Express hands over wrapped in an HttpException', () => {
    const syntax = Object.assign(new SyntaxError("Expected property name or '}' in JSON at position 23"), {
      status: 400,
      type: 'entity.parse.failed',
    });
    const wrapped = new BadRequestException(syntax.message, { cause: syntax });
    const { status, body } = run(wrapped);
    expect(status).toBe(400);
    expect(body).toMatchObject({
      code: 'REQUEST.MALFORMED_JSON',
      message: 'The request body is not valid JSON',
    });
  });

  it('answers a value PostgreSQL cannot store with 400 and a lost uniqueness race with 409', () => {
    const pg = (code: string) =>
      Object.assign(new Error('invalid byte sequence for encoding "UTF8": 0x00'), {
        name: 'QueryFailedError',
        driverError: { code },
      });
    // SQLSTATE 22021 character_not_in_repertoire, 23505 unique_violation (PostgreSQL manual, appendix A).
    expect(run(pg('22021'))).toMatchObject({ status: 400, body: { code: 'REQUEST.INVALID_VALUE' } });
    expect(JSON.stringify(run(pg('22021')).body)).not.toContain('UTF8');
    expect(run(pg('23505'))).toMatchObject({ status: 409, body: { code: 'STATE.CONFLICT' } });
    expect(run(pg('42P01'))).toMatchObject({ status: 500, body: { code: 'SERVER.INTERNAL' } });
  });

  it('answers a transaction PostgreSQL gave up on (deadlock, serialization failure) with 409 and “try again”', () => {
    // SQLSTATE 40P01 deadlock_detected, 40001 serialization_failure (PostgreSQL manual, appendix A): the
    // transaction was rolled back and may succeed when sent again.
    for (const code of ['40P01', '40001']) {
      const err = Object.assign(new Error('deadlock detected'), {
        name: 'QueryFailedError',
        driverError: { code },
      });
      const { status, body } = run(err);
      expect(status).toBe(409);
      expect(body).toMatchObject({ code: 'STATE.CONFLICT', message: expect.stringMatching(/try again/) });
      expect(JSON.stringify(body)).not.toContain('deadlock');
    }
    // node-postgres' own error, not wrapped by TypeORM, carries the code itself.
    expect(run(Object.assign(new Error('could not serialize access'), { code: '40001' }))).toMatchObject({
      status: 409,
      body: { code: 'STATE.CONFLICT' },
    });
    // Other class 40 codes (40002 integrity_constraint_violation, 40003 statement_completion_unknown) stay 500.
    expect(
      run(Object.assign(new Error('x'), { name: 'QueryFailedError', driverError: { code: '40003' } })),
    ).toMatchObject({ status: 500 });
  });
});
