import { ApiProperty, OmitType, PartialType } from '@nestjs/swagger';
import { IsUUID } from 'class-validator';
import { IdUuid, OneOf, SearchText } from '../../common/dto/query-filters';
import { NameText, StudyCodeText } from '../../common/dto/text-fields';
import { PageQueryDto } from '../../common/pagination/page-query.dto';

export class CreateSiteDto {
  @ApiProperty()
  @IsUUID()
  studyId: string;

  @StudyCodeText('NORTH') code: string;
  @NameText({ example: 'North Hospital EEG lab' }) name: string;
}

/** A site never moves to another study. */
export class UpdateSiteDto extends PartialType(OmitType(CreateSiteDto, ['studyId'] as const)) {}

export const SITE_SORT_FIELDS = ['code', 'name', 'createdAt'] as const;

export class SiteQueryDto extends PageQueryDto {
  @OneOf(SITE_SORT_FIELDS, { default: 'code' }) sort?: (typeof SITE_SORT_FIELDS)[number];
  @IdUuid() studyId?: string;
  @SearchText('Part of the code or name') q?: string;
}
