import { type ConfigType } from '@nestjs/config';
import { type JwtService } from '@nestjs/jwt';
import { type DataSource, type Repository } from 'typeorm';
import { type AuditService } from '../audit/audit.service';
import { type appConfig } from '../config/app.config';
import { type User } from '../users/user.entity';
import { AuthService } from './auth.service';

const A = '0a0a0a0a-0000-4000-8000-00000000000a';
const B = '0b0b0b0b-0000-4000-8000-00000000000b';
const C = '0c0c0c0c-0000-4000-8000-00000000000c';

/** An AuthService over a users table held in memory, recording the queries sent to it. */
function serviceWith(users: Record<string, { active: boolean }>) {
  const sent: unknown[][] = [];
  const manager = {
    query: async (_config: unknown, params: unknown[]) => {
      sent.push(params);
      await new Promise((r) => setTimeout(r, 2));
      const ids = params[0] as string[];
      return ids
        .filter((id) => users[id])
        .map((id) => ({
          id,
          email: `${id}@x`,
          role: 'fabricator',
          displayName: id,
          active: users[id]!.active,
          isDemo: false,
        }));
    },
  };
  const service = new AuthService(
    { manager } as unknown as Repository<User>,
    {} as DataSource,
    {} as JwtService,
    {} as AuditService,
    { mode: 'test' } as ConfigType<typeof appConfig>,
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

  it('matches an upper-case subject to its user and refuses one that is not a UUID without a query', async () => {
    const { service, sent } = serviceWith({ [A]: { active: true } });
    expect((await service.userForToken(token(A.toUpperCase())))?.id).toBe(A);
    expect(await service.userForToken(token("' OR 1=1 --"))).toBeNull();
    expect(sent).toHaveLength(1);
  });
});
