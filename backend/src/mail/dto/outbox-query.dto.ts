import { ApiPropertyOptional } from '@nestjs/swagger';
import { IsEmail, IsOptional } from 'class-validator';
import { OUTBOX_STATES, type OutboxState } from '@gyre/shared';
import { IdUuid, OneOf } from '../../common/dto/query-filters';
import { PageQueryDto } from '../../common/pagination/page-query.dto';

export const OUTBOX_SORT_FIELDS = ['createdAt', 'sentAt', 'state', 'toAddress'] as const;

export class OutboxQueryDto extends PageQueryDto {
  @OneOf(OUTBOX_SORT_FIELDS, { default: 'createdAt' })
  sort?: (typeof OUTBOX_SORT_FIELDS)[number];

  @OneOf(OUTBOX_STATES) state?: OutboxState;

  @ApiPropertyOptional({ description: 'Recipient address' })
  @IsOptional()
  @IsEmail()
  to?: string;

  @IdUuid() id?: string;
}
