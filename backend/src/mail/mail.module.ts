import { Global, Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { MailController } from './mail.controller';
import { MailTransport } from './mail-transport.service';
import { OutboxMessage } from './outbox-message.entity';
import { OutboxService } from './outbox.service';

/** Global: any module may queue a message (e.g. reports e-mailing coordinators). */
@Global()
@Module({
  imports: [TypeOrmModule.forFeature([OutboxMessage])],
  controllers: [MailController],
  providers: [MailTransport, OutboxService],
  exports: [OutboxService, MailTransport],
})
export class MailModule {}
