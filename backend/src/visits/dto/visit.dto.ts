import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Transform } from 'class-transformer';
import {
  IsIn,
  IsNotEmpty,
  IsOptional,
  IsString,
  IsUUID,
  Matches,
  MaxLength,
} from 'class-validator';
import type { Page, VisitView } from '@gyre/shared';
import { PageQueryDto } from '../../common/pagination/page-query.dto';

const trimmed = ({ value }: { value: unknown }): unknown =>
  typeof value === 'string' ? value.trim() : value;
const DATE_PATTERN = /^\d{4}-\d{2}-\d{2}$/;

export class CreateVisitDto {
  @ApiProperty()
  @IsUUID()
  participantId: string;

  @ApiProperty({ example: 'V1', description: 'Unique per participant' })
  @Transform(trimmed)
  @IsString()
  @IsNotEmpty()
  @MaxLength(40)
  label: string;

  @ApiProperty({ example: '2026-03-14', description: 'Calendar date, YYYY-MM-DD' })
  @Matches(DATE_PATTERN, { message: 'visitDate must be a calendar date written YYYY-MM-DD' })
  visitDate: string;
}

export class UpdateVisitDto {
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

  @ApiPropertyOptional({ description: 'Visits on or after, YYYY-MM-DD' })
  @IsOptional()
  @Matches(DATE_PATTERN, { message: 'from must be YYYY-MM-DD' })
  from?: string;

  @ApiPropertyOptional({ description: 'Visits on or before, YYYY-MM-DD' })
  @IsOptional()
  @Matches(DATE_PATTERN, { message: 'to must be YYYY-MM-DD' })
  to?: string;
}

export class VisitResponseDto implements VisitView {
  @ApiProperty() id: string;
  @ApiProperty() participantId: string;
  @ApiProperty() studyId: string;
  @ApiProperty() siteId: string;
  @ApiProperty() label: string;
  @ApiProperty({ example: '2026-03-14' }) visitDate: string;
  @ApiProperty() createdAt: string;
  @ApiProperty() updatedAt: string;
}

export class VisitPageDto implements Page<VisitView> {
  @ApiProperty({ type: [VisitResponseDto] }) items: VisitView[];
  @ApiProperty() total: number;
  @ApiProperty() page: number;
  @ApiProperty() pageSize: number;
}
