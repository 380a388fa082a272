import { Global, Inject, Module, type OnApplicationShutdown } from '@nestjs/common';
import { type ConfigType } from '@nestjs/config';
import Redis from 'ioredis';
import { redisConfig } from '../config/app.config';

export const REDIS = Symbol('REDIS');

/** One shared ioredis client for health checks and small counters (Bull opens its own). */
@Global()
@Module({
  providers: [
    {
      provide: REDIS,
      inject: [redisConfig.KEY],
      useFactory: (c: ConfigType<typeof redisConfig>) =>
        new Redis({
          host: c.host,
          port: c.port,
          lazyConnect: false,
          enableOfflineQueue: false,
          maxRetriesPerRequest: 1,
          retryStrategy: (times) => Math.min(times * 200, 2000),
        }),
    },
  ],
  exports: [REDIS],
})
export class RedisModule implements OnApplicationShutdown {
  constructor(@Inject(REDIS) private readonly redis: Redis) {}

  async onApplicationShutdown(): Promise<void> {
    this.redis.disconnect();
  }
}
