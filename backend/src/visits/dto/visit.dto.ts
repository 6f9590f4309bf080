import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Transform } from 'class-transformer';
import {
  IsBoolean,
  IsIn,
  IsNotEmpty,
  IsOptional,
  IsString,
  IsUUID,
  Matches,
  MaxLength,
  ValidateIf,
} from 'class-validator';
import {
  VISIT_WINDOWS,
  type Page,
  type VisitScheduleStatus,
  type VisitView,
  type VisitWindow,
} from '@gyre/shared';
import { PageQueryDto } from '../../common/pagination/page-query.dto';

const trimmed = ({ value }: { value: unknown }): unknown =>
  typeof value === 'string' ? value.trim() : value;
const DATE_PATTERN = /^\d{4}-\d{2}-\d{2}$/;

export class CreateVisitDto {
  @ApiProperty()
  @IsUUID()
  participantId: string;

  @ApiPropertyOptional({
    description:
      "The study's planned visit this visit is; required when the study has a schedule, unless unscheduled is true",
  })
  @IsOptional()
  @IsUUID()
  plannedVisitId?: string;

  @ApiPropertyOptional({
    description: 'true: a visit outside the schedule (then label is required)',
  })
  @IsOptional()
  @IsBoolean()
  unscheduled?: boolean;

  @ApiPropertyOptional({
    example: 'V1',
    description:
      "Unique per participant; required for an unscheduled visit, else the planned visit's name",
  })
  @IsOptional()
  @Transform(trimmed)
  @IsString()
  @IsNotEmpty()
  @MaxLength(40)
  label?: string;

  @ApiProperty({ example: '2026-03-14', description: 'Calendar date, YYYY-MM-DD' })
  @Matches(DATE_PATTERN, { message: 'visitDate must be a calendar date written YYYY-MM-DD' })
  visitDate: string;
}

export class UpdateVisitDto {
  @ApiPropertyOptional({
    nullable: true,
    description: 'Move the visit to another planned visit; null makes it unscheduled',
  })
  @ValidateIf((_: object, value: unknown) => value !== null && value !== undefined)
  @IsUUID()
  plannedVisitId?: string | null;

  @ApiPropertyOptional({ example: 'V2' })
  @IsOptional()
  @Transform(trimmed)
  @IsString()
  @IsNotEmpty()
  @MaxLength(40)
  label?: string;

  @ApiPropertyOptional({ example: '2026-03-15' })
  @IsOptional()
  @Matches(DATE_PATTERN, { message: 'visitDate must be a calendar date written YYYY-MM-DD' })
  visitDate?: string;

  @ApiPropertyOptional({ description: 'Why; kept in the audit trail' })
  @IsOptional()
  @IsString()
  @MaxLength(2000)
  reason?: string;
}

export const VISIT_SORT_FIELDS = ['visitDate', 'label', 'createdAt'] as const;

export class VisitQueryDto extends PageQueryDto {
  @ApiPropertyOptional({ enum: VISIT_SORT_FIELDS, default: 'visitDate' })
  @IsOptional()
  @IsIn(VISIT_SORT_FIELDS)
  sort?: (typeof VISIT_SORT_FIELDS)[number];

  @ApiPropertyOptional()
  @IsOptional()
  @IsUUID()
  participantId?: string;

  @ApiPropertyOptional()
  @IsOptional()
  @IsUUID()
  siteId?: string;

  @ApiPropertyOptional()
  @IsOptional()
  @IsUUID()
  plannedVisitId?: string;

  @ApiPropertyOptional({ description: 'Visits on or after, YYYY-MM-DD' })
  @IsOptional()
  @Matches(DATE_PATTERN, { message: 'from must be YYYY-MM-DD' })
  from?: string;

  @ApiPropertyOptional({ description: 'Visits on or before, YYYY-MM-DD' })
  @IsOptional()
  @Matches(DATE_PATTERN, { message: 'to must be YYYY-MM-DD' })
  to?: string;
}

export class VisitScheduleStatusDto implements VisitScheduleStatus {
  @ApiProperty({ type: String, nullable: true }) plannedVisitId: string | null;
  @ApiProperty({ type: String, nullable: true }) plannedVisitName: string | null;
  @ApiProperty({ type: Number, nullable: true, description: 'visitDate − enrolmentDate, days' })
  studyDay: number | null;
  @ApiProperty({ type: Number, nullable: true }) targetDay: number | null;
  @ApiProperty({ type: Number, nullable: true }) daysFromTarget: number | null;
  @ApiProperty({ enum: VISIT_WINDOWS }) window: VisitWindow;
}

export class VisitResponseDto implements VisitView {
  @ApiProperty() id: string;
  @ApiProperty() participantId: string;
  @ApiProperty() studyId: string;
  @ApiProperty() siteId: string;
  @ApiProperty() label: string;
  @ApiProperty({ example: '2026-03-14' }) visitDate: string;
  @ApiProperty({ type: String, nullable: true }) plannedVisitId: string | null;
  @ApiProperty({ type: VisitScheduleStatusDto }) schedule: VisitScheduleStatus;
  @ApiProperty() createdAt: string;
  @ApiProperty() updatedAt: string;
}

export class VisitPageDto implements Page<VisitView> {
  @ApiProperty({ type: [VisitResponseDto] }) items: VisitView[];
  @ApiProperty() total: number;
  @ApiProperty() page: number;
  @ApiProperty() pageSize: number;
}
