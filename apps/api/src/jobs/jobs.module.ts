import { Module } from '@nestjs/common';
import { ConfigModule } from '@nestjs/config';
import { TypeOrmModule } from '@nestjs/typeorm';
import { GeometryModule } from '../geometry/geometry.module';
import { MachineProfilesModule } from '../machine-profiles/machine-profiles.module';
import { MaterialsModule } from '../materials/materials.module';
import { mailConfig } from '../mail/mail.config';
import { SafetyModule } from '../safety/safety.module';
import { Job, JobTransition } from './job.entity';
import { jobsConfig } from './jobs.config';
import { JobMailer } from './job-mailer';
import { JobPreparationService } from './job-preparation.service';
import { JobsController } from './jobs.controller';
import { JobsService } from './jobs.service';

@Module({
  imports: [
    TypeOrmModule.forFeature([Job, JobTransition]),
    ConfigModule.forFeature(mailConfig),
    ConfigModule.forFeature(jobsConfig),
    MachineProfilesModule,
    MaterialsModule,
    SafetyModule,
    GeometryModule,
  ],
  controllers: [JobsController],
  providers: [JobsService, JobPreparationService, JobMailer],
  exports: [JobsService, JobPreparationService],
})
export class JobsModule {}
