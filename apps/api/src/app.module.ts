import { Module } from '@nestjs/common';
import { ConfigModule, type ConfigType } from '@nestjs/config';
import { APP_FILTER, APP_GUARD } from '@nestjs/core';
import { TypeOrmModule } from '@nestjs/typeorm';
import { AuditModule } from './audit/audit.module';
import { AuthModule } from './auth/auth.module';
import { DesignsModule } from './designs/designs.module';
import { ExportsModule } from './exports/exports.module';
import { JobsModule } from './jobs/jobs.module';
import { SafetyModule } from './safety/safety.module';
import { MailModule } from './mail/mail.module';
import { AllExceptionsFilter } from './common/filters/all-exceptions.filter';
import { GuardedPgClient } from './common/guarded-pg-client';
import { JwtAuthGuard } from './common/guards/jwt-auth.guard';
import { MachineProfilesModule } from './machine-profiles/machine-profiles.module';
import { MaterialsModule } from './materials/materials.module';
import { RolesGuard } from './common/guards/roles.guard';
import { appConfig, authConfig, redisConfig } from './config/app.config';
import { databaseConfig } from './config/database.config';
import { validateEnv } from './config/env.validation';
import { HealthController } from './health/health.controller';
import { RedisModule } from './redis/redis.module';
import { UsersModule } from './users/users.module';

@Module({
  imports: [
    ConfigModule.forRoot({
      isGlobal: true,
      ignoreEnvFile: true,
      validate: validateEnv,
      load: [appConfig, authConfig, redisConfig, databaseConfig],
    }),
    TypeOrmModule.forRootAsync({
      inject: [databaseConfig.KEY],
      useFactory: (db: ConfigType<typeof databaseConfig>) => ({
        type: 'postgres' as const,
        host: db.host,
        port: db.port,
        database: db.database,
        username: db.username,
        password: db.password,
        autoLoadEntities: true,
        synchronize: false,
        migrationsRun: false,
        retryAttempts: 10,
        retryDelay: 1000,
        extra: { max: 20, connectionTimeoutMillis: 3000, Client: GuardedPgClient },
      }),
    }),
    RedisModule,
    AuditModule,
    UsersModule,
    AuthModule,
    MaterialsModule,
    MachineProfilesModule,
    MailModule,
    DesignsModule,
    JobsModule,
    SafetyModule,
    ExportsModule,
  ],
  controllers: [HealthController],
  providers: [
    { provide: APP_FILTER, useClass: AllExceptionsFilter },
    { provide: APP_GUARD, useClass: JwtAuthGuard },
    { provide: APP_GUARD, useClass: RolesGuard },
  ],
})
export class AppModule {}
