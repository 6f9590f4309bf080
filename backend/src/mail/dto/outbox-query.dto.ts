import { ApiPropertyOptional } from '@nestjs/swagger';
import { IsEmail, IsIn, IsOptional, IsUUID } from 'class-validator';
import { OUTBOX_STATES, type OutboxState } from '@gyre/shared';
import { PageQueryDto } from '../../common/pagination/page-query.dto';

export const OUTBOX_SORT_FIELDS = ['createdAt', 'sentAt', 'state', 'toAddress'] as const;

export class OutboxQueryDto extends PageQueryDto {
  @ApiPropertyOptional({ enum: OUTBOX_SORT_FIELDS, default: 'createdAt' })
  @IsOptional()
  @IsIn(OUTBOX_SORT_FIELDS)
  sort?: (typeof OUTBOX_SORT_FIELDS)[number];

  @ApiPropertyOptional({ enum: OUTBOX_STATES })
  @IsOptional()
  @IsIn(OUTBOX_STATES)
  state?: OutboxState;

  @ApiPropertyOptional({ description: 'Recipient address' })
  @IsOptional()
  @IsEmail()
  to?: string;

  @ApiPropertyOptional()
  @IsOptional()
  @IsUUID()
  id?: string;
}
