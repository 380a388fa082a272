import { createSecretKey } from 'node:crypto';
import { Inject, Injectable } from '@nestjs/common';
import { type ConfigType } from '@nestjs/config';
import { PassportStrategy } from '@nestjs/passport';
import { ExtractJwt, Strategy } from 'passport-jwt';
import { type AuthUser } from '../common/decorators/auth.decorators';
import { authConfig } from '../config/app.config';
import { AuthService, type JwtPayload } from './auth.service';

/**
 * Verifies the bearer token, then reloads the user so a deactivated account or a changed role
 * takes effect on the next request, not when the token expires.
 */
@Injectable()
export class JwtStrategy extends PassportStrategy(Strategy) {
  constructor(
    @Inject(authConfig.KEY) config: ConfigType<typeof authConfig>,
    private readonly auth: AuthService,
  ) {
    super({
      jwtFromRequest: ExtractJwt.fromAuthHeaderAsBearerToken(),
      ignoreExpiration: false,
      // A ready-made secret KeyObject: given a string, jsonwebtoken first tries (and fails) to read it as a
      // public key on every request, which was the largest single cost of an authenticated read.
      secretOrKey: createSecretKey(Buffer.from(config.jwtSecret, 'utf8')) as unknown as string,
      algorithms: ['HS256'],
    });
  }

  async validate(payload: JwtPayload): Promise<AuthUser | false> {
    // Every token this server signs carries an expiry; one without it would be valid for ever.
    if (typeof payload?.sub !== 'string' || typeof payload.exp !== 'number') return false;
    const user = await this.auth.userForToken(payload);
    if (!user) return false;
    return { id: user.id, email: user.email, role: user.role, displayName: user.displayName };
  }
}
