import { type ConfigType } from '@nestjs/config';
import { JwtService } from '@nestjs/jwt';
import jwt from 'jsonwebtoken';
import { type DataSource, type Repository } from 'typeorm';
import { type AuditService } from '../audit/audit.service';
import { type appConfig, type authConfig } from '../config/app.config';
import { type User } from '../users/user.entity';
import { AuthService } from './auth.service';

const A = '0a0a0a0a-0000-4000-8000-00000000000a';
const B = '0b0b0b0b-0000-4000-8000-00000000000b';
const C = '0c0c0c0c-0000-4000-8000-00000000000c';

const SECRET = 'unit-test-secret-of-reasonable-length';

/** An AuthService over a users table held in memory, recording the queries sent to it. */
function serviceWith(users: Record<string, { active: boolean }>, revoked: ReadonlySet<string> = new Set()) {
  const sent: unknown[][] = [];
  const manager = {
    query: async (_config: unknown, params: unknown[]) => {
      sent.push(params);
      await new Promise((r) => setTimeout(r, 2));
      const ids = params[0] as string[];
      const jtis = params[1] as (string | null)[];
      return ids
        .map((id, i) => ({ id, jti: jtis[i] ?? null }))
        .filter(({ id }) => users[id])
        .map(({ id, jti }) => ({
          id,
          jti,
          email: `${id}@x`,
          role: 'fabricator',
          displayName: id,
          active: users[id]!.active,
          isDemo: false,
          revoked: jti !== null && revoked.has(jti),
        }));
    },
  };
  const service = new AuthService(
    { manager } as unknown as Repository<User>,
    {} as DataSource,
    new JwtService({ secret: SECRET, signOptions: { algorithm: 'HS256', expiresIn: '1h' } }),
    {} as AuditService,
    { mode: 'test' } as ConfigType<typeof appConfig>,
    { jwtSecret: SECRET } as ConfigType<typeof authConfig>,
  );
  return { service, sent };
}

const token = (sub: string) => ({ sub, role: 'fabricator', exp: 2e9 });

describe('AuthService.userForToken', () => {
  it('reads the users of the requests arriving together in one query', async () => {
    const { service, sent } = serviceWith({ [A]: { active: true }, [B]: { active: true } });
    const found = await Promise.all([A, B, A, C].map((id) => service.userForToken(token(id))));
    expect(sent).toHaveLength(1);
    expect(found.map((u) => u?.id ?? null)).toEqual([A, B, A, null]);
  });

  it('sees a deactivation on the next request: nothing is kept between turns', async () => {
    const users = { [A]: { active: true } };
    const { service, sent } = serviceWith(users);
    expect(await service.userForToken(token(A))).not.toBeNull();
    users[A]!.active = false;
    expect(await service.userForToken(token(A))).toBeNull();
    expect(sent).toHaveLength(2);
  });

  it('refuses a signed-out token, and only that one, in the same query as the others', async () => {
    const signedOut = '5e5e5e5e-0000-4000-8000-00000000005e';
    const other = '6f6f6f6f-0000-4000-8000-00000000006f';
    const { service, sent } = serviceWith({ [A]: { active: true } }, new Set([signedOut]));
    const found = await Promise.all([
      service.userForToken({ ...token(A), jti: signedOut }),
      service.userForToken({ ...token(A), jti: other.toUpperCase() }),
      service.userForToken(token(A)),
    ]);
    expect(found.map((u) => u?.id ?? null)).toEqual([null, A, A]);
    expect(sent).toEqual([
      [
        [A, A, A],
        [signedOut, other, null],
      ],
    ]);
    // A token id that is not a UUID is not this server's: refused without a query.
    expect(await service.userForToken({ ...token(A), jti: "x' OR 1=1" })).toBeNull();
    expect(sent).toHaveLength(1);
  });

  it('matches an upper-case subject to its user and refuses one that is not a UUID without a query', async () => {
    const { service, sent } = serviceWith({ [A]: { active: true } });
    expect((await service.userForToken(token(A.toUpperCase())))?.id).toBe(A);
    expect(await service.userForToken(token("' OR 1=1 --"))).toBeNull();
    expect(sent).toHaveLength(1);
  });
});

describe('AuthService.userForAuthorization', () => {
  const now = () => Math.floor(Date.now() / 1000);
  const signed = (payload: object, secret = SECRET, options: jwt.SignOptions = {}) =>
    jwt.sign(payload, secret, { algorithm: 'HS256', ...options });

  it('accepts a bearer token this server signed, whatever the case of the scheme', async () => {
    const { service } = serviceWith({ [A]: { active: true } });
    const t = signed({ sub: A, role: 'fabricator', exp: now() + 60 });
    expect(await service.userForAuthorization(`Bearer ${t}`)).toEqual({
      id: A,
      email: `${A}@x`,
      role: 'fabricator',
      displayName: A,
    });
    expect((await service.userForAuthorization(`bearer ${t}`))?.id).toBe(A);
  });

  // RFC 7519 section 4.1.4 (exp), RFC 7515 (a changed signature or header must not verify), and the
  // "alg: none" downgrade of the JWT security best practices (RFC 8725 section 2.1).
  it('refuses expired, forged, unsigned, expiry-less and malformed tokens without reading a user', async () => {
    const { service, sent } = serviceWith({ [A]: { active: true } });
    const claims = { sub: A, role: 'fabricator' };
    const good = signed({ ...claims, exp: now() + 60 });
    const [h, p] = good.split('.');
    const bad = [
      undefined,
      '',
      good, // no scheme
      `Basic ${good}`,
      `Bearer ${good} extra`,
      `Bearer ${signed({ ...claims, exp: now() - 10 })}`,
      `Bearer ${signed({ ...claims, exp: now() + 60 }, 'another-secret-of-reasonable-length')}`,
      `Bearer ${jwt.sign({ ...claims, exp: now() + 60 }, '', { algorithm: 'none' })}`,
      `Bearer ${signed(claims)}`, // no expiry
      `Bearer ${h}.${Buffer.from(JSON.stringify({ ...claims, role: 'supervisor', exp: now() + 60 })).toString('base64url')}.${good.split('.')[2]}`,
      `Bearer ${h}.${p}.`,
      'Bearer not-a-token',
      42,
    ];
    for (const header of bad) expect(await service.userForAuthorization(header)).toBeNull();
    expect(sent).toHaveLength(0);
  });

  it('refuses the token of a deactivated user', async () => {
    const { service } = serviceWith({ [A]: { active: false } });
    const t = signed({ sub: A, role: 'fabricator', exp: now() + 60 });
    expect(await service.userForAuthorization(`Bearer ${t}`)).toBeNull();
  });
});
