import { ApiPropertyOptional } from '@nestjs/swagger';
import { IsIn, IsISO8601, IsOptional, IsString, MaxLength } from 'class-validator';
import { PageQueryDto } from '../../common/pagination/page-query.dto';

export const AUDIT_SORT_FIELDS = ['seq', 'at', 'action', 'objectType'] as const;

export class AuditQueryDto extends PageQueryDto {
  @ApiPropertyOptional({ enum: AUDIT_SORT_FIELDS, default: 'seq' })
  @IsOptional()
  @IsIn(AUDIT_SORT_FIELDS)
  sort?: (typeof AUDIT_SORT_FIELDS)[number];

  @ApiPropertyOptional({ description: 'Only entries by this user id' })
  @IsOptional()
  @IsString()
  @MaxLength(64)
  actorId?: string;

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

  @ApiPropertyOptional()
  @IsOptional()
  @IsString()
  @MaxLength(64)
  objectId?: string;

  @ApiPropertyOptional({
    description:
      'Only entries about this participant: the participant itself, its visits and their recordings, runs, flags, reports and reviews',
  })
  @IsOptional()
  @IsString()
  @MaxLength(64)
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
