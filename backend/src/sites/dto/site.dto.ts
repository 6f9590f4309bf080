import { ApiProperty, OmitType, PartialType } from '@nestjs/swagger';
import { IsNotEmpty, IsString, IsUUID, Matches, MaxLength } from 'class-validator';
import { STUDY_CODE_PATTERN } from '@gyre/shared';
import { IdUuid, OneOf, SearchText } from '../../common/dto/query-filters';
import { PageQueryDto } from '../../common/pagination/page-query.dto';

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
  @OneOf(SITE_SORT_FIELDS, { default: 'code' }) sort?: (typeof SITE_SORT_FIELDS)[number];
  @IdUuid() studyId?: string;
  @SearchText('Part of the code or name') q?: string;
}
