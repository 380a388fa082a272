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
      secretOrKey: config.jwtSecret,
      algorithms: ['HS256'],
    });
  }

  async validate(payload: JwtPayload): Promise<AuthUser | false> {
    if (typeof payload?.sub !== 'string') return false;
    const user = await this.auth.userForToken(payload);
    if (!user) return false;
    return { id: user.id, email: user.email, role: user.role, displayName: user.displayName };
  }
}
