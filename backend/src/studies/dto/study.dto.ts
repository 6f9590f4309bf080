import { ApiPropertyOptional, PartialType } from '@nestjs/swagger';
import { IsBoolean, IsInt, IsOptional, IsString, Max, MaxLength, Min } from 'class-validator';
import { DEFAULT_TREND_MIN_SPAN_DAYS, DEFAULT_TREND_MIN_VISITS } from '@gyre/shared';
import { OneOf, SearchText } from '../../common/dto/query-filters';
import { NameText, StudyCodeText, WrittenReasonText } from '../../common/dto/text-fields';
import { PageQueryDto } from '../../common/pagination/page-query.dto';

export class CreateStudyDto {
  @StudyCodeText('ALPHA-AGE') code: string;
  @NameText({ example: 'Alpha rhythm in healthy ageing' }) name: string;

  @ApiPropertyOptional()
  @IsOptional()
  @IsString()
  @MaxLength(4000)
  description?: string;

  @ApiPropertyOptional({
    default: DEFAULT_TREND_MIN_VISITS,
    description: 'A participant trend slope is shown from this many visits with a value (2–50)',
  })
  @IsOptional()
  @IsInt()
  @Min(2)
  @Max(50)
  trendMinVisits?: number;

  @ApiPropertyOptional({
    default: DEFAULT_TREND_MIN_SPAN_DAYS,
    description: '…when those visits span at least this many days (0–3650)',
  })
  @IsOptional()
  @IsInt()
  @Min(0)
  @Max(3650)
  trendMinSpanDays?: number;

  @ApiPropertyOptional({
    default: false,
    description: 'Blinded review: analysts see visits under codes until they record their decision',
  })
  @IsOptional()
  @IsBoolean()
  blindedReview?: boolean;
}

export class UpdateStudyDto extends PartialType(CreateStudyDto) {
  @WrittenReasonText({
    description: 'Why (kept in the audit trail); required when blindedReview changes',
    optional: true,
  })
  reason?: string;
}

export const STUDY_SORT_FIELDS = ['code', 'name', 'createdAt'] as const;

export class StudyQueryDto extends PageQueryDto {
  @OneOf(STUDY_SORT_FIELDS, { default: 'code' }) sort?: (typeof STUDY_SORT_FIELDS)[number];
  @SearchText('Part of the code or name') q?: string;
}
