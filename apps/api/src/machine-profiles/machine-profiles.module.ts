import { Module } from '@nestjs/common';
import { ConfigModule } from '@nestjs/config';
import { TypeOrmModule } from '@nestjs/typeorm';
import { MailModule } from '../mail/mail.module';
import { mailConfig } from '../mail/mail.config';
import { MaterialsModule } from '../materials/materials.module';
import { KerfRecordsController } from './kerf-records.controller';
import { KerfRecordsService } from './kerf-records.service';
import { KerfRecord, MachineProfile, MachineProfileVersion } from './machine-profile.entity';
import { MachineProfilesController } from './machine-profiles.controller';
import { MachineProfilesService } from './machine-profiles.service';

/** Exports MachineProfilesService: jobs call getApprovedVersion / currentApprovedVersion. */
@Module({
  imports: [
    TypeOrmModule.forFeature([MachineProfile, MachineProfileVersion, KerfRecord]),
    ConfigModule.forFeature(mailConfig),
    MailModule,
    MaterialsModule,
  ],
  controllers: [MachineProfilesController, KerfRecordsController],
  providers: [MachineProfilesService, KerfRecordsService],
  exports: [MachineProfilesService],
})
export class MachineProfilesModule {}
