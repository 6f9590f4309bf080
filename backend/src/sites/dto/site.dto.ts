import { ApiProperty, ApiPropertyOptional, OmitType, PartialType } from '@nestjs/swagger';
import {
  IsIn,
  IsNotEmpty,
  IsOptional,
  IsString,
  IsUUID,
  Matches,
  MaxLength,
} from 'class-validator';
import { STUDY_CODE_PATTERN, type Page, type SiteView } from '@gyre/shared';
import { PageQueryDto } from '../../common/pagination/page-query.dto';
import { SiteResponseDto } from '../../studies/dto/study-responses.dto';

export class CreateSiteDto {
  @ApiProperty()
  @IsUUID()
  studyId: string;

  @ApiProperty({ example: 'NORTH', pattern: STUDY_CODE_PATTERN.source })
  @Matches(STUDY_CODE_PATTERN, {
    message: 'code must be 2–32 upper-case letters, digits or inner hyphens, e.g. NORTH',
  })
  code: string;

  @ApiProperty({ example: 'North Hospital EEG lab' })
  @IsString()
  @IsNotEmpty()
  @MaxLength(200)
  name: string;
}

/** A site never moves to another study. */
export class UpdateSiteDto extends PartialType(OmitType(CreateSiteDto, ['studyId'] as const)) {}

export const SITE_SORT_FIELDS = ['code', 'name', 'createdAt'] as const;

export class SiteQueryDto extends PageQueryDto {
  @ApiPropertyOptional({ enum: SITE_SORT_FIELDS, default: 'code' })
  @IsOptional()
  @IsIn(SITE_SORT_FIELDS)
  sort?: (typeof SITE_SORT_FIELDS)[number];

  @ApiPropertyOptional()
  @IsOptional()
  @IsUUID()
  studyId?: string;

  @ApiPropertyOptional({ description: 'Part of the code or name' })
  @IsOptional()
  @IsString()
  @MaxLength(100)
  q?: string;
}

export class SitePageDto implements Page<SiteView> {
  @ApiProperty({ type: [SiteResponseDto] }) items: SiteView[];
  @ApiProperty() total: number;
  @ApiProperty() page: number;
  @ApiProperty() pageSize: number;
}
