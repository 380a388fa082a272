import { DEV_JWT_SECRET, trustProxySetting, validateEnv } from './env.validation';

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

  it('takes a whole number of at least 1 for the open requests a requester may have', () => {
    expect(() => validateEnv({ KW_OPEN_REQUEST_LIMIT: '12' })).not.toThrow();
    for (const bad of ['0', '-3', '2.5', 'five', '']) {
      expect(() => validateEnv({ KW_OPEN_REQUEST_LIMIT: bad })).toThrow(/KW_OPEN_REQUEST_LIMIT/);
    }
  });

  it('trusts no proxy unless KW_TRUST_PROXY names them as Express takes them (hop count, addresses, subnets)', () => {
    expect(trustProxySetting(undefined)).toBe(false);
    expect(trustProxySetting('')).toBe(false);
    expect(trustProxySetting('0')).toBe(false);
    expect(trustProxySetting('1')).toBe(1);
    expect(trustProxySetting('loopback')).toEqual(['loopback']);
    expect(trustProxySetting(' 10.0.0.0/8, loopback ,::1 ')).toEqual(['10.0.0.0/8', 'loopback', '::1']);
    for (const good of [
      '2',
      'loopback',
      'linklocal, uniquelocal',
      '192.0.2.10',
      '192.0.2.0/24',
      'fd00::/8',
    ]) {
      expect(() => validateEnv({ KW_TRUST_PROXY: good })).not.toThrow();
    }
    // "true" would believe any X-Forwarded-For a client sends; the rest are not addresses.
    for (const bad of ['true', '-1', 'proxy.example.org', '192.0.2.0/33', '300.1.1.1', 'loopback,']) {
      expect(() => validateEnv({ KW_TRUST_PROXY: bad })).toThrow(/KW_TRUST_PROXY/);
    }
  });
});
