import 'reflect-metadata';
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
  @IsOptional() @IsString() KW_WEB_DIST?: string;
  /** One origin (scheme://host[:port]); never a wildcard or a path. */
  @IsOptional()
  @Matches(/^https?:\/\/[A-Za-z0-9.-]+(:\d{1,5})?$/, {
    message: 'KW_CORS_ORIGIN must be one origin such as https://shop.example.org (no wildcard, no path)',
  })
  KW_CORS_ORIGIN?: string;
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
