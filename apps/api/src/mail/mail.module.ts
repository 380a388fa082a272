import { Global, Module } from '@nestjs/common';
import { ConfigModule } from '@nestjs/config';
import { MailDispatcherService } from './mail-dispatcher.service';
import { MailOutboxService } from './mail-outbox.service';
import { mailConfig } from './mail.config';

@Global()
@Module({
  imports: [ConfigModule.forFeature(mailConfig)],
  providers: [MailOutboxService, MailDispatcherService],
  exports: [MailOutboxService, MailDispatcherService],
})
export class MailModule {}
