import { ApiProperty } from '@nestjs/swagger';
import { OUTBOX_STATES, type OutboxMessageView, type OutboxState, type Page } from '@gyre/shared';

export class OutboxMessageResponseDto implements OutboxMessageView {
  @ApiProperty() id: string;
  @ApiProperty({ example: 'invitation' }) kind: string;
  @ApiProperty() to: string;
  @ApiProperty() subject: string;
  @ApiProperty({ enum: OUTBOX_STATES }) state: OutboxState;
  @ApiProperty() attempts: number;
  @ApiProperty({ type: String, nullable: true }) nextAttemptAt: string | null;
  @ApiProperty({ type: String, nullable: true }) lastError: string | null;
  @ApiProperty() createdAt: string;
  @ApiProperty({ type: String, nullable: true }) sentAt: string | null;
}

export class OutboxPageDto implements Page<OutboxMessageView> {
  @ApiProperty({ type: [OutboxMessageResponseDto] }) items: OutboxMessageView[];
  @ApiProperty() total: number;
  @ApiProperty() page: number;
  @ApiProperty() pageSize: number;
}
