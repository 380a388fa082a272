import { Controller, Get, HttpStatus, Inject } from '@nestjs/common';
import { ApiOkResponse, ApiServiceUnavailableResponse, ApiTags } from '@nestjs/swagger';
import { InjectDataSource } from '@nestjs/typeorm';
import type Redis from 'ioredis';
import { DataSource } from 'typeorm';
import { type HealthView } from '@kerfwright/contracts';
import { Public } from '../common/decorators/auth.decorators';
import { AppError } from '../common/errors';
import { withDeadline } from '../common/with-deadline';
import { REDIS } from '../redis/redis.module';
import { HealthResponse } from './dto/health.response';

const CHECK_TIMEOUT_MS = 1500;

@ApiTags('health')
@Controller('health')
export class HealthController {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    @Inject(REDIS) private readonly redis: Redis,
  ) {}

  /** 200 when PostgreSQL and Redis both answer; otherwise 503 with the same view in `details`. */
  @Public()
  @Get()
  @ApiOkResponse({ type: HealthResponse, description: 'PostgreSQL and Redis both answer' })
  @ApiServiceUnavailableResponse({
    description: 'SERVICE.DEGRADED: a backing service is down; the health view is in `details`',
  })
  async check(): Promise<HealthView> {
    const [database, redis] = await Promise.all([
      withDeadline(this.dataSource.query('SELECT 1'), CHECK_TIMEOUT_MS, 'PostgreSQL').then(
        () => 'up' as const,
        () => 'down' as const,
      ),
      withDeadline(this.redis.ping(), CHECK_TIMEOUT_MS, 'Redis').then(
        (r) => (r === 'PONG' ? ('up' as const) : ('down' as const)),
        () => 'down' as const,
      ),
    ]);
    const view: HealthView = {
      status: database === 'up' && redis === 'up' ? 'ok' : 'degraded',
      database,
      redis,
      version: process.env.npm_package_version ?? '0.1.0',
    };
    if (view.status !== 'ok') {
      throw new AppError(
        HttpStatus.SERVICE_UNAVAILABLE,
        'SERVICE.DEGRADED',
        'A backing service is down',
        view,
      );
    }
    return view;
  }
}
