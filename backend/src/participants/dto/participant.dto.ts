import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Transform } from 'class-transformer';
import {
  IsIn,
  IsOptional,
  IsString,
  IsUUID,
  Matches,
  MaxLength,
  ValidateIf,
} from 'class-validator';
import {
  CALENDAR_DATE_PATTERN,
  PARTICIPANT_CODE_PATTERN,
  REPORT_STATES,
  type LatestValue,
  type Page,
  type ParticipantListItem,
  type ParticipantView,
  type ReportState,
} from '@gyre/shared';
import { PageQueryDto } from '../../common/pagination/page-query.dto';

const CODE_MESSAGE =
  'code must be a pseudonymous code: 3–24 upper-case letters and digits in hyphen-separated groups with at least one digit (e.g. AC-0042), never a name';

const trimmed = ({ value }: { value: unknown }): unknown =>
  typeof value === 'string' ? value.trim() : value;
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
  @Transform(trimmed)
  @IsString()
  @Matches(PARTICIPANT_CODE_PATTERN, { message: CODE_MESSAGE })
  code: string;

  @ApiPropertyOptional({
    example: '2026-03-02',
    description: 'Day 0 of the visit schedule (YYYY-MM-DD)',
  })
  @IsOptional()
  @Matches(CALENDAR_DATE_PATTERN, { message: DATE_MESSAGE })
  enrolmentDate?: string;

  @ApiPropertyOptional({ description: 'A group (arm) of the same study' })
  @IsOptional()
  @IsUUID()
  groupId?: string;
}

export class UpdateParticipantDto {
  @ApiPropertyOptional({ example: 'AC-0043', pattern: PARTICIPANT_CODE_PATTERN.source })
  @IsOptional()
  @Transform(trimmed)
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

  @ApiPropertyOptional({ description: 'Why the code changes; kept in the audit trail' })
  @IsOptional()
  @IsString()
  @MaxLength(2000)
  reason?: string;
}

export const PARTICIPANT_SORT_FIELDS = ['code', 'createdAt'] as const;

export class ParticipantQueryDto extends PageQueryDto {
  @ApiPropertyOptional({ enum: PARTICIPANT_SORT_FIELDS, default: 'code' })
  @IsOptional()
  @IsIn(PARTICIPANT_SORT_FIELDS)
  sort?: (typeof PARTICIPANT_SORT_FIELDS)[number];

  @ApiPropertyOptional()
  @IsOptional()
  @IsUUID()
  siteId?: string;

  @ApiPropertyOptional({ description: 'Only the participants of this group' })
  @IsOptional()
  @IsUUID()
  groupId?: string;

  @ApiPropertyOptional({ description: 'Part of the code' })
  @IsOptional()
  @IsString()
  @MaxLength(24)
  q?: string;
}

export class ParticipantResponseDto implements ParticipantView {
  @ApiProperty() id: string;
  @ApiProperty() studyId: string;
  @ApiProperty() siteId: string;
  @ApiProperty({ example: 'AC-0042' }) code: string;
  @ApiProperty({ type: String, nullable: true, example: '2026-03-02' })
  enrolmentDate: string | null;
  @ApiProperty({ type: String, nullable: true }) groupId: string | null;
  @ApiProperty() createdAt: string;
  @ApiProperty() updatedAt: string;
}

class LatestValueDto implements LatestValue {
  @ApiProperty({ description: 'Hz' }) hz: number;
  @ApiProperty() visitId: string;
  @ApiProperty() visitLabel: string;
}

class ListReportDto {
  @ApiProperty({ enum: REPORT_STATES }) state: ReportState;
  @ApiProperty({ type: Number, nullable: true }) latestRevision: number | null;
}

class LatestVisitDto {
  @ApiProperty() id: string;
  @ApiProperty() label: string;
  @ApiProperty({ example: '2026-03-02' }) visitDate: string;
  @ApiProperty({ type: ListReportDto, nullable: true }) report: ListReportDto | null;
}

export class ParticipantListItemDto extends ParticipantResponseDto implements ParticipantListItem {
  @ApiProperty() siteName: string;
  @ApiProperty({ type: String, nullable: true }) groupName: string | null;
  @ApiProperty() visitCount: number;
  @ApiProperty({ type: LatestValueDto, nullable: true }) latestPaf: LatestValue | null;
  @ApiProperty({ type: LatestValueDto, nullable: true }) latestDeltaF: LatestValue | null;
  @ApiProperty({
    type: Number,
    nullable: true,
    description: 'Raised flags; null when your role does not read flags',
  })
  openFlags: number | null;
  @ApiProperty({ type: LatestVisitDto, nullable: true })
  latestVisit: LatestVisitDto | null;
}

export class ParticipantPageDto implements Page<ParticipantListItem> {
  @ApiProperty({ type: [ParticipantListItemDto] }) items: ParticipantListItem[];
  @ApiProperty() total: number;
  @ApiProperty() page: number;
  @ApiProperty() pageSize: number;
}
