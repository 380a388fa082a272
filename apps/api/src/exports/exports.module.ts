import { BullModule } from '@nestjs/bull';
import { Module } from '@nestjs/common';
import { ConfigModule, type ConfigType } from '@nestjs/config';
import { TypeOrmModule } from '@nestjs/typeorm';
import { redisConfig } from '../config/app.config';
import { GeometryModule } from '../geometry/geometry.module';
import { GeometryThreads } from '../geometry/geometry-threads';
import { JobsModule } from '../jobs/jobs.module';
import { MachineProfilesModule } from '../machine-profiles/machine-profiles.module';
import { SafetyModule } from '../safety/safety.module';
import { StorageModule } from '../storage/storage.module';
import { buildPack } from './build-pack';
import { CutPackInputService } from './cut-pack-input';
import { Export, ExportFile } from './export.entity';
import { EXPORT_QUEUE, exportsConfig } from './exports.config';
import { ExportsController } from './exports.controller';
import { ExportsProcessor, PACK_BUILDER } from './exports.processor';
import { ExportsReconciler } from './exports.reconciler';
import { ExportsService } from './exports.service';

@Module({
  imports: [
    TypeOrmModule.forFeature([Export, ExportFile]),
    ConfigModule.forFeature(exportsConfig),
    BullModule.forRootAsync({
      imports: [ConfigModule.forFeature(exportsConfig)],
      inject: [redisConfig.KEY, exportsConfig.KEY],
      useFactory: (redis: ConfigType<typeof redisConfig>, q: ConfigType<typeof exportsConfig>) => ({
        redis: { host: redis.host, port: redis.port, maxRetriesPerRequest: null, enableReadyCheck: false },
        prefix: q.queuePrefix,
        settings: {
          lockDuration: q.lockMs,
          lockRenewTime: Math.floor(q.lockMs / 2),
          stalledInterval: q.stalledCheckMs,
          maxStalledCount: 3,
        },
      }),
    }),
    BullModule.registerQueue({ name: EXPORT_QUEUE }),
    StorageModule,
    JobsModule,
    MachineProfilesModule,
    SafetyModule,
    GeometryModule,
  ],
  controllers: [ExportsController],
  providers: [
    ExportsService,
    ExportsProcessor,
    ExportsReconciler,
    CutPackInputService,
    { provide: PACK_BUILDER, inject: [GeometryThreads], useFactory: buildPack },
  ],
})
export class ExportsModule {}
