import 'reflect-metadata';
import { isIP } from 'node:net';
import { plainToInstance } from 'class-transformer';
import {
  IsIn,
  IsInt,
  IsOptional,
  IsString,
  Matches,
  Max,
  Min,
  MinLength,
  ValidateBy,
  validateSync,
} from 'class-validator';

export const DEV_JWT_SECRET = 'kerfwright-development-secret-not-for-production';
export const MODES = ['development', 'test', 'production'] as const;
export type Mode = (typeof MODES)[number];

/** Every environment variable the API reads, checked once at boot. */
export class EnvVars {
  @IsOptional() @IsIn(MODES) KW_MODE?: Mode;
  @IsOptional() @IsInt() @Min(1) @Max(65535) KW_PORT?: number;
  @IsOptional() @IsString() KW_HOST?: string;
  @IsOptional() @IsString() @MinLength(16) KW_JWT_SECRET?: string;
  @IsOptional() @IsString() KW_JWT_TTL?: string;
  @IsOptional() @IsString() KW_DB_HOST?: string;
  @IsOptional() @IsInt() @Min(1) @Max(65535) KW_DB_PORT?: number;
  @IsOptional() @IsString() KW_DB_NAME?: string;
  @IsOptional() @IsString() KW_DB_USER?: string;
  @IsOptional() @IsString() KW_DB_PASSWORD?: string;
  @IsOptional() @IsString() KW_REDIS_HOST?: string;
  @IsOptional() @IsInt() @Min(1) @Max(65535) KW_REDIS_PORT?: number;
  @IsOptional() @IsInt() @Min(1) KW_LOGIN_LIMIT?: number;
  @IsOptional() @IsInt() @Min(1) KW_LOGIN_ADDRESS_LIMIT?: number;
  @IsOptional() @IsInt() @Min(1) KW_LOGIN_WINDOW_S?: number;
  @IsOptional() @IsInt() @Min(1) @Max(64) KW_GEOMETRY_THREADS?: number;
  @IsOptional() @IsInt() @Min(100) @Max(3_600_000) KW_GEOMETRY_TASK_MS?: number;
  @IsOptional() @IsInt() @Min(100) @Max(3_600_000) KW_GEOMETRY_PACK_MS?: number;
  @IsOptional() @IsString() KW_WEB_DIST?: string;
  /** Jobs one requester may have open with the workshop at a time (fabricators and supervisors have no cap). */
  @IsOptional() @IsInt() @Min(1) @Max(10_000) KW_OPEN_REQUEST_LIMIT?: number;
  /** One origin (scheme://host[:port]); never a wildcard or a path. */
  @IsOptional()
  @Matches(/^https?:\/\/[A-Za-z0-9.-]+(:\d{1,5})?$/, {
    message: 'KW_CORS_ORIGIN must be one origin such as https://shop.example.org (no wildcard, no path)',
  })
  KW_CORS_ORIGIN?: string;
  /** The reverse proxies in front of the API, for Express's "trust proxy": see trustProxySetting. */
  @IsOptional()
  @ValidateBy({
    name: 'trustProxy',
    validator: {
      validate: (v: unknown) => typeof v === 'string' && trustProxySetting(v) !== null,
      defaultMessage: () =>
        'KW_TRUST_PROXY must be a hop count, or addresses and subnets (CIDR) of the proxies, or loopback, linklocal, uniquelocal, separated by commas',
    },
  })
  KW_TRUST_PROXY?: string;
}

/** Names Express (proxy-addr) takes for address ranges in "trust proxy". */
const PROXY_RANGE_NAMES = new Set(['loopback', 'linklocal', 'uniquelocal']);

/** An IPv4 or IPv6 address, optionally with a prefix length within its size. */
function isAddressOrSubnet(entry: string): boolean {
  const [address = '', prefix, ...rest] = entry.split('/');
  const family = isIP(address);
  if (family === 0 || rest.length > 0) return false;
  if (prefix === undefined) return true;
  return /^\d{1,3}$/.test(prefix) && Number(prefix) <= (family === 4 ? 32 : 128);
}

/**
 * Express's "trust proxy" setting from KW_TRUST_PROXY: unset, empty or 0 trusts no proxy (the client address is
 * the connection's, so a client cannot choose it with X-Forwarded-For); a hop count trusts that many proxies;
 * otherwise the proxies' addresses, subnets (CIDR) or range names, separated by commas. Null when the value is
 * none of these (`true`, trusting every address a client claims, is refused).
 */
export function trustProxySetting(raw: string | undefined): false | number | string[] | null {
  const value = (raw ?? '').trim();
  if (value === '') return false;
  if (/^\d+$/.test(value)) return Number(value) === 0 ? false : Number(value);
  const entries = value.split(',').map((e) => e.trim());
  return entries.every((e) => PROXY_RANGE_NAMES.has(e) || isAddressOrSubnet(e)) ? entries : null;
}

/**
 * Validates the environment for ConfigModule. Production mode refuses to start with the development
 * JWT secret or none at all.
 */
export function validateEnv(raw: Record<string, unknown>): Record<string, unknown> {
  const env = plainToInstance(EnvVars, raw, { enableImplicitConversion: true });
  const errors = validateSync(env, { skipMissingProperties: false, whitelist: false });
  if (errors.length > 0) {
    const lines = errors.map((e) => `${e.property}: ${Object.values(e.constraints ?? {}).join(', ')}`);
    throw new Error(`Invalid configuration:\n  ${lines.join('\n  ')}`);
  }
  if (env.KW_MODE === 'production') {
    if (!env.KW_JWT_SECRET || env.KW_JWT_SECRET === DEV_JWT_SECRET || env.KW_JWT_SECRET.length < 32) {
      throw new Error(
        'Invalid configuration: production mode needs KW_JWT_SECRET set to a secret of 32 characters or more (not the development default)',
      );
    }
  }
  return { ...raw, ...env };
}
