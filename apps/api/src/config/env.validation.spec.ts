import { DEV_JWT_SECRET, validateEnv } from './env.validation';

describe('configuration validated at boot', () => {
  it('accepts an empty environment in development', () => {
    expect(() => validateEnv({})).not.toThrow();
  });

  it('refuses production mode with the development secret, a short secret, or none', () => {
    expect(() => validateEnv({ KW_MODE: 'production' })).toThrow(/KW_JWT_SECRET/);
    expect(() => validateEnv({ KW_MODE: 'production', KW_JWT_SECRET: DEV_JWT_SECRET })).toThrow(
      /KW_JWT_SECRET/,
    );
    expect(() => validateEnv({ KW_MODE: 'production', KW_JWT_SECRET: 'short-but-sixteen+' })).toThrow(/32/);
    expect(() => validateEnv({ KW_MODE: 'production', KW_JWT_SECRET: 'x'.repeat(48) })).not.toThrow();
  });

  it('names the variable that is wrong', () => {
    expect(() => validateEnv({ KW_PORT: 'eighty' })).toThrow(/KW_PORT/);
    expect(() => validateEnv({ KW_MODE: 'staging' })).toThrow(/KW_MODE/);
  });

  it('takes one CORS origin, never a wildcard or a path', () => {
    expect(() => validateEnv({ KW_CORS_ORIGIN: 'https://shop.example.org' })).not.toThrow();
    expect(() => validateEnv({ KW_CORS_ORIGIN: 'http://127.0.0.1:5173' })).not.toThrow();
    expect(() => validateEnv({ KW_CORS_ORIGIN: '*' })).toThrow(/KW_CORS_ORIGIN/);
    expect(() => validateEnv({ KW_CORS_ORIGIN: 'https://shop.example.org/app' })).toThrow(/KW_CORS_ORIGIN/);
    expect(() => validateEnv({ KW_LOGIN_ADDRESS_LIMIT: '0' })).toThrow(/KW_LOGIN_ADDRESS_LIMIT/);
  });
});
