import Redis from 'ioredis';

/** Removes every Redis key under a test run's own Bull prefix (nothing else on the shared Redis). */
export async function dropQueueKeys(prefix: string): Promise<void> {
  const redis = new Redis({
    host: process.env.KW_REDIS_HOST ?? '127.0.0.1',
    port: Number(process.env.KW_REDIS_PORT ?? 63790),
  });
  try {
    let cursor = '0';
    do {
      const [next, keys] = await redis.scan(cursor, 'MATCH', `${prefix}:*`, 'COUNT', 500);
      if (keys.length > 0) await redis.del(...keys);
      cursor = next;
    } while (cursor !== '0');
  } finally {
    redis.disconnect();
  }
}
