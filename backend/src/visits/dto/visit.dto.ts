import { ApiProperty, ApiPropertyOptional, PartialType, PickType } from '@nestjs/swagger';
import {
  IsBoolean,
  IsNotEmpty,
  IsOptional,
  IsString,
  IsUUID,
  MaxLength,
  ValidateIf,
} from 'class-validator';
import { IdUuid, OneOf } from '../../common/dto/query-filters';
import { AuditReasonText, CalendarDateText, Trimmed } from '../../common/dto/text-fields';
import { PageQueryDto } from '../../common/pagination/page-query.dto';

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
  @Trimmed()
  @IsString()
  @IsNotEmpty()
  @MaxLength(40)
  label?: string;

  @CalendarDateText({ example: '2026-03-14', description: 'Calendar date, YYYY-MM-DD' })
  visitDate: string;
}

/** Label and date as on creation, each optional; the planned visit may also be cleared. */
export class UpdateVisitDto extends PartialType(
  PickType(CreateVisitDto, ['label', 'visitDate'] as const),
) {
  @ApiPropertyOptional({
    nullable: true,
    description: 'Move the visit to another planned visit; null makes it unscheduled',
  })
  @ValidateIf((_: object, value: unknown) => value !== null && value !== undefined)
  @IsUUID()
  plannedVisitId?: string | null;

  @AuditReasonText() reason?: string;
}

export const VISIT_SORT_FIELDS = ['visitDate', 'label', 'createdAt'] as const;

export class VisitQueryDto extends PageQueryDto {
  @OneOf(VISIT_SORT_FIELDS, { default: 'visitDate' }) sort?: (typeof VISIT_SORT_FIELDS)[number];
  @IdUuid() participantId?: string;
  @IdUuid() siteId?: string;
  @IdUuid() plannedVisitId?: string;

  @CalendarDateText({ description: 'Visits on or after, YYYY-MM-DD', optional: true })
  from?: string;

  @CalendarDateText({ description: 'Visits on or before, YYYY-MM-DD', optional: true })
  to?: string;
}
