import { ApiPropertyOptional } from '@nestjs/swagger';
import { IsOptional, IsString, MaxLength } from 'class-validator';

export class ResultsQueryDto {
  @ApiPropertyOptional({ description: 'A run of this recording; default: the latest' })
  @IsOptional()
  @IsString()
  @MaxLength(64)
  runId?: string;
}
