import { Module } from '@nestjs/common';
import { type ConfigType } from '@nestjs/config';
import { JwtModule } from '@nestjs/jwt';
import { ThrottlerModule } from '@nestjs/throttler';
import { TypeOrmModule } from '@nestjs/typeorm';
import { authConfig } from '../config/app.config';
import { User } from '../users/user.entity';
import { AuthController } from './auth.controller';
import { AuthService } from './auth.service';

@Module({
  imports: [
    TypeOrmModule.forFeature([User]),
    JwtModule.registerAsync({
      inject: [authConfig.KEY],
      useFactory: (c: ConfigType<typeof authConfig>) => ({
        secret: c.jwtSecret,
        signOptions: { expiresIn: c.jwtTtl as `${number}h`, algorithm: 'HS256' },
      }),
    }),
    ThrottlerModule.forRootAsync({
      inject: [authConfig.KEY],
      useFactory: (c: ConfigType<typeof authConfig>) => ({
        throttlers: [
          { name: 'login', ttl: c.loginWindowMs, limit: c.loginLimit },
          {
            name: 'login-address',
            ttl: c.loginWindowMs,
            limit: c.loginAddressLimit,
            getTracker: (req: Record<string, unknown>) => (typeof req.ip === 'string' ? req.ip : 'unknown'),
          },
        ],
        errorMessage: 'Too many sign-in attempts; wait a minute and try again',
        // No `Retry-After-login` and `X-RateLimit-*-login` headers (nothing reads them); LoginThrottlerGuard
        // sends the standard Retry-After with a 429.
        setHeaders: false,
      }),
    }),
  ],
  controllers: [AuthController],
  providers: [AuthService],
  // The global JwtAuthGuard (AppModule) reads the signed-in user through AuthService.
  exports: [AuthService],
})
export class AuthModule {}
