import { ApiPropertyOptional } from '@nestjs/swagger';
import { IsISO8601, IsOptional, IsString, MaxLength } from 'class-validator';
import { IdText, OneOf } from '../../common/dto/query-filters';
import { PageQueryDto } from '../../common/pagination/page-query.dto';

export const AUDIT_SORT_FIELDS = ['seq', 'at', 'action', 'objectType'] as const;

export class AuditQueryDto extends PageQueryDto {
  @OneOf(AUDIT_SORT_FIELDS, { default: 'seq' }) sort?: (typeof AUDIT_SORT_FIELDS)[number];
  @IdText({ description: 'Only entries by this user id' }) actorId?: string;

  @ApiPropertyOptional({ example: 'update' })
  @IsOptional()
  @IsString()
  @MaxLength(60)
  action?: string;

  @ApiPropertyOptional({ example: 'Participant' })
  @IsOptional()
  @IsString()
  @MaxLength(40)
  objectType?: string;

  @IdText() objectId?: string;

  @IdText({
    description:
      'Only entries about this participant: the participant itself, its visits and their recordings, runs, flags, reports and reviews',
  })
  participantId?: string;

  @ApiPropertyOptional({
    description: 'ISO 8601 instant, inclusive',
    example: '2026-01-01T00:00:00Z',
  })
  @IsOptional()
  @IsISO8601({ strict: true })
  from?: string;

  @ApiPropertyOptional({ description: 'ISO 8601 instant, inclusive' })
  @IsOptional()
  @IsISO8601({ strict: true })
  to?: string;
}
