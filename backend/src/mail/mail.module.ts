import { Global, Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { MailController } from './mail.controller';
import { MailTransportService } from './mail-transport.service';
import { OutboxMessage } from './outbox-message.entity';
import { OutboxService } from './outbox.service';

/** Global: any module may queue a message (e.g. reports e-mailing coordinators). */
@Global()
@Module({
  imports: [TypeOrmModule.forFeature([OutboxMessage])],
  controllers: [MailController],
  providers: [MailTransportService, OutboxService],
  exports: [OutboxService, MailTransportService],
})
export class MailModule {}
