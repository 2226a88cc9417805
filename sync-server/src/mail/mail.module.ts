import { Module } from '@nestjs/common';
import { SequelizeModule } from '@nestjs/sequelize';
import { FakeSmtpServer } from './fake-smtp.server.js';
import { MailController } from './mail.controller.js';
import { MailService } from './mail.service.js';
import { MailMessage } from './models/mail-message.model.js';

@Module({
  imports: [SequelizeModule.forFeature([MailMessage])],
  controllers: [MailController],
  providers: [FakeSmtpServer, MailService],
  exports: [MailService],
})
export class MailModule {}
