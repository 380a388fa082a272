import { createHash, createSecretKey, type KeyObject, randomUUID } from 'node:crypto';
import { HttpStatus, Inject, Injectable } from '@nestjs/common';
import { type ConfigType } from '@nestjs/config';
import { JwtService } from '@nestjs/jwt';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import bcrypt from 'bcryptjs';
import DataLoader from 'dataloader';
import { DataSource, Repository } from 'typeorm';
import { type AuthResponse, type UserView } from '@kerfwright/contracts';
import { AuditService } from '../audit/audit.service';
import { type AuthUser } from '../common/decorators/auth.decorators';
import { PG_UNIQUE_VIOLATION, pgError, sendPrepared } from '../common/db-helpers';
import { AppError } from '../common/errors';
import { appConfig, authConfig } from '../config/app.config';
import { toUserView, User } from '../users/user.entity';
import { type LoginDto } from './dto/login.dto';
import { type RegisterDto } from './dto/register.dto';

/** bcrypt cost 12: about a quarter of a second per hash on these machines (OWASP: at least 10). */
export const PASSWORD_HASH_COST = 12;

/** bcrypt reads at most 72 bytes of its input (Provos & Mazières 1999); longer passwords are pre-hashed. */
export const BCRYPT_MAX_BYTES = 72;

/**
 * What bcrypt is given for a password: the password itself up to 72 bytes, else its SHA-256 in base64
 * (44 characters), so that no part of a long password is silently ignored (OWASP ASVS 2.1.3; the
 * pre-hashing of the OWASP Password Storage Cheat Sheet, base64 so no NUL byte reaches bcrypt).
 */
export function bcryptInput(password: string): string {
  if (Buffer.byteLength(password, 'utf8') <= BCRYPT_MAX_BYTES) return password;
  return `sha256:${createHash('sha256').update(password, 'utf8').digest('base64')}`;
}

/** The refusal of an e-mail someone registered already (in any letter case). */
const emailTaken = (): AppError =>
  new AppError(HttpStatus.CONFLICT, 'AUTH.EMAIL_TAKEN', 'An account with this e-mail already exists', [
    { field: 'email', messages: ['already registered'] },
  ]);

/** Compared against when the e-mail is unknown, so both paths take the same time. */
const DUMMY_HASH = bcrypt.hashSync('kerfwright-timing-equaliser', PASSWORD_HASH_COST);

export interface JwtPayload {
  sub: string;
  role: string;
  /** The token's own id (a UUID), by which signing out ends it. */
  jti?: string;
  /** Added by the signer (seconds since the epoch). */
  iat?: number;
  exp?: number;
}

/** `Authorization: Bearer <token>` (RFC 6750 section 2.1; the scheme is case-insensitive, RFC 9110 11.1). */
const BEARER = /^\s*bearer\s+(\S+)\s*$/i;

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

type TokenUser = Pick<User, 'id' | 'email' | 'role' | 'displayName' | 'active' | 'isDemo'> & {
  /** The token asked about was signed out. */
  revoked: boolean;
};

@Injectable()
export class AuthService {
  constructor(
    @InjectRepository(User) private readonly users: Repository<User>,
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly jwt: JwtService,
    private readonly audit: AuditService,
    @Inject(appConfig.KEY) private readonly app: ConfigType<typeof appConfig>,
    @Inject(authConfig.KEY) auth: ConfigType<typeof authConfig>,
  ) {
    // A ready-made secret KeyObject: given a string, jsonwebtoken first tries (and fails) to read it as a public
    // key on every verification, which was once the largest single cost of an authenticated read.
    this.verifyKey = createSecretKey(Buffer.from(auth.jwtSecret, 'utf8'));
  }

  private readonly verifyKey: KeyObject;

  /**
   * The users behind the bearer tokens of the requests that arrive in one turn of the event loop, read in one
   * query once that turn's I/O is handled (DataLoader, with no cache: every request gets a row read after it
   * arrived, so a deactivation is seen by the next request).
   */
  private readonly tokenUsers = new DataLoader<{ sub: string; jti: string | null }, TokenUser | null, string>(
    async (keys) => {
      const rows = await sendPrepared<TokenUser & { jti: string | null }>(
        this.users.manager,
        `SELECT u.id, k.jti, u.email, u.role, u.display_name AS "displayName", u.active, u.is_demo AS "isDemo",
                (r.jti IS NOT NULL) AS revoked
           FROM unnest($1::uuid[], $2::uuid[]) AS k(id, jti)
           JOIN users u ON u.id = k.id
           LEFT JOIN revoked_tokens r ON r.jti = k.jti`,
        [keys.map((k) => k.sub), keys.map((k) => k.jti)],
      );
      const byKey = new Map(rows.map((r) => [`${r.id}|${r.jti ?? ''}`, r]));
      return keys.map((k) => byKey.get(`${k.sub}|${k.jti ?? ''}`) ?? null);
    },
    {
      cache: false,
      batchScheduleFn: (run) => setImmediate(run),
      cacheKeyFn: (k) => `${k.sub}|${k.jti ?? ''}`,
    },
  );

  async register(dto: RegisterDto, requestId: string): Promise<AuthResponse> {
    const email = dto.email.trim();
    const hash = await bcrypt.hash(bcryptInput(dto.password), PASSWORD_HASH_COST);
    const user = await this.dataSource
      .transaction(async (manager) => {
        const taken = await manager
          .createQueryBuilder(User, 'u')
          .where('lower(u.email) = lower(:email)', { email })
          .getExists();
        if (taken) throw emailTaken();
        const created = await manager.save(
          manager.create(User, { email, displayName: dto.displayName, passwordHash: hash, role: 'hobbyist' }),
        );
        await this.audit.record(manager, {
          actorId: created.id,
          action: 'user.register',
          entityType: 'user',
          entityId: created.id,
          after: toUserView(created),
          requestId,
        });
        return created;
      })
      .catch((err: unknown) => {
        // Registered at the same moment by another request (the check above saw neither): the unique index on
        // lower(email) refuses the second, which gets the answer a later duplicate gets.
        const pg = pgError(err);
        if (pg?.code === PG_UNIQUE_VIOLATION && pg.constraint === 'users_email_lower_key') throw emailTaken();
        throw err;
      });
    return this.issue(user);
  }

  async login(dto: LoginDto): Promise<AuthResponse> {
    const user = await this.users
      .createQueryBuilder('u')
      .addSelect('u.passwordHash')
      .where('lower(u.email) = lower(:email)', { email: dto.email.trim() })
      .getOne();
    const ok = await bcrypt.compare(bcryptInput(dto.password), user?.passwordHash ?? DUMMY_HASH);
    if (!user || !ok) {
      throw new AppError(HttpStatus.UNAUTHORIZED, 'AUTH.INVALID_CREDENTIALS', 'E-mail or password is wrong');
    }
    if (!user.active || (user.isDemo && this.app.mode === 'production')) {
      throw new AppError(HttpStatus.UNAUTHORIZED, 'AUTH.ACCOUNT_INACTIVE', 'This account is deactivated');
    }
    return this.issue(user);
  }

  /**
   * The signed-in user of a request's Authorization header: the bearer token must verify (HS256, this server's
   * secret, not expired) and carry a subject and an expiry (one without an expiry would be valid for ever).
   * Null for anything else; a failure to read the user propagates.
   */
  async userForAuthorization(header: unknown): Promise<AuthUser | null> {
    const token = typeof header === 'string' ? BEARER.exec(header)?.[1] : undefined;
    if (!token) return null;
    let payload: JwtPayload;
    try {
      payload = this.jwt.verify<JwtPayload>(token, {
        secret: this.verifyKey as unknown as string,
        algorithms: ['HS256'],
      });
    } catch {
      return null;
    }
    if (typeof payload?.sub !== 'string' || typeof payload.exp !== 'number') return null;
    const user = await this.userForToken(payload);
    if (!user) return null;
    return {
      id: user.id,
      email: user.email,
      role: user.role,
      displayName: user.displayName,
      ...(payload.jti ? { token: { jti: payload.jti.toLowerCase(), exp: payload.exp } } : {}),
    };
  }

  /**
   * Ends the session of the caller's token: it is refused from now on (other sessions of the account stay).
   * Rows of tokens past their expiry go at the same time. A token without an id (issued before tokens had one)
   * ends only at its expiry.
   */
  async signOut(user: AuthUser, requestId: string): Promise<void> {
    const token = user.token;
    if (!token) return;
    await this.dataSource.transaction(async (m) => {
      await m.query(`DELETE FROM revoked_tokens WHERE expires_at < now()`);
      await m.query(
        `INSERT INTO revoked_tokens (jti, user_id, expires_at) VALUES ($1, $2, to_timestamp($3))
         ON CONFLICT (jti) DO NOTHING`,
        [token.jti, user.id, token.exp],
      );
      await this.audit.record(m, {
        actorId: user.id,
        action: 'user.sign-out',
        entityType: 'user',
        entityId: user.id,
        requestId,
      });
    });
  }

  /**
   * The signed-in user behind a verified token, read fresh on every request (so deactivation and role changes
   * apply at once); inactive users, and demo users in production, get no access. One indexed, prepared query:
   * it runs on every authenticated request.
   */
  async userForToken(
    payload: JwtPayload,
  ): Promise<Pick<User, 'id' | 'email' | 'role' | 'displayName'> | null> {
    if (!UUID.test(payload.sub)) return null;
    if (payload.jti !== undefined && (typeof payload.jti !== 'string' || !UUID.test(payload.jti)))
      return null;
    const user = await this.tokenUsers.load({
      sub: payload.sub.toLowerCase(),
      jti: payload.jti?.toLowerCase() ?? null,
    });
    if (!user || user.revoked || !user.active || (user.isDemo && this.app.mode === 'production')) return null;
    return user;
  }

  async me(id: string): Promise<UserView> {
    const user = await this.users.findOneOrFail({ where: { id } });
    return toUserView(user);
  }

  private async issue(user: User): Promise<AuthResponse> {
    const payload: JwtPayload = { sub: user.id, role: user.role, jti: randomUUID() };
    return { accessToken: await this.jwt.signAsync(payload), user: toUserView(user) };
  }
}
