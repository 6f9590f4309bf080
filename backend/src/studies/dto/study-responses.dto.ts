import { ApiProperty } from '@nestjs/swagger';
import type { SiteView, StudyView } from '@gyre/shared';

export class StudyResponseDto implements StudyView {
  @ApiProperty() id: string;
  @ApiProperty({ example: 'ALPHA-AGE' }) code: string;
  @ApiProperty() name: string;
  @ApiProperty() description: string;
  @ApiProperty({ example: 3 }) trendMinVisits: number;
  @ApiProperty({ example: 90 }) trendMinSpanDays: number;
  @ApiProperty() createdAt: string;
  @ApiProperty() updatedAt: string;
}

export class SiteResponseDto implements SiteView {
  @ApiProperty() id: string;
  @ApiProperty() studyId: string;
  @ApiProperty({ example: 'NORTH' }) code: string;
  @ApiProperty() name: string;
  @ApiProperty() createdAt: string;
  @ApiProperty() updatedAt: string;
}
