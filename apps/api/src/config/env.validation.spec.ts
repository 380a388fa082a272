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
});
