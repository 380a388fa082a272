import * as path from 'node:path';
import { registerAs } from '@nestjs/config';
import { DEV_JWT_SECRET, type Mode, trustProxySetting } from './env.validation';

export const appConfig = registerAs('app', () => ({
  mode: (process.env.KW_MODE ?? 'development') as Mode,
  port: Number(process.env.KW_PORT ?? 3000),
  host: process.env.KW_HOST ?? '127.0.0.1',
  webDist: process.env.KW_WEB_DIST ?? path.resolve(__dirname, '..', '..', '..', 'web', 'dist'),
  corsOrigin: process.env.KW_CORS_ORIGIN ?? null,
  /** Express's "trust proxy": no proxy unless KW_TRUST_PROXY names them (validated at boot). */
  trustProxy: trustProxySetting(process.env.KW_TRUST_PROXY) ?? false,
}));

export const authConfig = registerAs('auth', () => ({
  jwtSecret: process.env.KW_JWT_SECRET ?? DEV_JWT_SECRET,
  jwtTtl: process.env.KW_JWT_TTL ?? '8h',
  loginLimit: Number(process.env.KW_LOGIN_LIMIT ?? 10),
  /** Sign-in attempts per client address over all e-mails (credential stuffing); 10 × the per-account limit. */
  loginAddressLimit: Number(
    process.env.KW_LOGIN_ADDRESS_LIMIT ?? 10 * Number(process.env.KW_LOGIN_LIMIT ?? 10),
  ),
  loginWindowMs: Number(process.env.KW_LOGIN_WINDOW_S ?? 60) * 1000,
}));

export const redisConfig = registerAs('redis', () => ({
  host: process.env.KW_REDIS_HOST ?? '127.0.0.1',
  port: Number(process.env.KW_REDIS_PORT ?? 63790),
}));

export type AppConfig = ReturnType<typeof appConfig>;
export type AuthConfig = ReturnType<typeof authConfig>;
export type RedisConfig = ReturnType<typeof redisConfig>;
