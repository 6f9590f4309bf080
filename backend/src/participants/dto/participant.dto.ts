import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { IsOptional, IsString, IsUUID, Matches, ValidateIf } from 'class-validator';
import { CALENDAR_DATE_PATTERN, PARTICIPANT_CODE_PATTERN } from '@gyre/shared';
import { IdUuid, OneOf, SearchText } from '../../common/dto/query-filters';
import { AuditReasonText, CalendarDateText, Trimmed } from '../../common/dto/text-fields';
import { PageQueryDto } from '../../common/pagination/page-query.dto';

const CODE_MESSAGE =
  'code must be a pseudonymous code: 3–24 upper-case letters and digits in hyphen-separated groups with at least one digit (e.g. AC-0042), never a name';

const DATE_MESSAGE = 'enrolmentDate must be a calendar date written YYYY-MM-DD';
/** `null` clears the field; a missing field leaves it as it is. */
const givenAndNotNull = (_: object, value: unknown): boolean =>
  value !== null && value !== undefined;

export class CreateParticipantDto {
  @ApiPropertyOptional({ description: 'Defaults to your own site (technicians)' })
  @IsOptional()
  @IsUUID()
  siteId?: string;

  @ApiProperty({ example: 'AC-0042', pattern: PARTICIPANT_CODE_PATTERN.source })
  @Trimmed()
  @IsString()
  @Matches(PARTICIPANT_CODE_PATTERN, { message: CODE_MESSAGE })
  code: string;

  @CalendarDateText({
    example: '2026-03-02',
    description: 'Day 0 of the visit schedule (YYYY-MM-DD)',
    optional: true,
  })
  enrolmentDate?: string;

  @ApiPropertyOptional({ description: 'A group (arm) of the same study' })
  @IsOptional()
  @IsUUID()
  groupId?: string;
}

export class UpdateParticipantDto {
  @ApiPropertyOptional({ example: 'AC-0043', pattern: PARTICIPANT_CODE_PATTERN.source })
  @IsOptional()
  @Trimmed()
  @IsString()
  @Matches(PARTICIPANT_CODE_PATTERN, { message: CODE_MESSAGE })
  code?: string;

  @ApiPropertyOptional({
    example: '2026-03-02',
    nullable: true,
    description: 'YYYY-MM-DD; null clears it',
  })
  @ValidateIf(givenAndNotNull)
  @Matches(CALENDAR_DATE_PATTERN, { message: DATE_MESSAGE })
  enrolmentDate?: string | null;

  @ApiPropertyOptional({ nullable: true, description: 'A group of the same study; null clears it' })
  @ValidateIf(givenAndNotNull)
  @IsUUID()
  groupId?: string | null;

  @AuditReasonText({ description: 'Why the code changes; kept in the audit trail' })
  reason?: string;
}

export const PARTICIPANT_SORT_FIELDS = ['code', 'createdAt'] as const;

export class ParticipantQueryDto extends PageQueryDto {
  @OneOf(PARTICIPANT_SORT_FIELDS, { default: 'code' })
  sort?: (typeof PARTICIPANT_SORT_FIELDS)[number];

  @IdUuid() siteId?: string;
  @IdUuid({ description: 'Only the participants of this group' }) groupId?: string;
  @SearchText('Part of the code', 24) q?: string;
}
