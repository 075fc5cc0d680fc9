import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { MailService } from './mail.service.js';
import { OutboxAttachment, OutboxMessage } from './outbox.entity.js';
import { OutboxController } from './outbox.controller.js';
import { SmtpFakeService } from './smtp-fake.service.js';

@Module({
  imports: [TypeOrmModule.forFeature([OutboxMessage, OutboxAttachment])],
  controllers: [OutboxController],
  providers: [MailService, SmtpFakeService],
  exports: [MailService],
})
export class MailModule {}
