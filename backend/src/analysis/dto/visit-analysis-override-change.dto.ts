import { ApiProperty } from '@nestjs/swagger';
import {
  ArrayMaxSize,
  ArrayMinSize,
  IsArray,
  IsOptional,
  IsString,
  Matches,
  MaxLength,
  MinLength,
  ValidateIf,
} from 'class-validator';
import type { VisitAnalysisOverrideChange } from '@gyre/shared';
import { pair } from './analysis-settings-change.dto';

/** A visit's own region of interest, band and onset label (null = the study's), with a reason. */
export class VisitAnalysisOverrideChangeDto implements VisitAnalysisOverrideChange {
  @ApiProperty({ type: [String], nullable: true, example: ['O1', 'Pz'] })
  @ValidateIf((o: VisitAnalysisOverrideChangeDto) => o.roi !== null)
  @IsArray()
  @ArrayMinSize(1)
  @ArrayMaxSize(64)
  @IsString({ each: true })
  @Matches(/^[A-Za-z]{1,2}([1-9]|10|z|Z)$/, { each: true })
  roi: string[] | null;

  @ApiProperty({ type: [Number], nullable: true, example: null })
  @ValidateIf((o: VisitAnalysisOverrideChangeDto) => o.bandHz !== null)
  @pair()
  bandHz: [number, number] | null;

  @ApiProperty({ nullable: true, example: null })
  @IsOptional()
  @IsString()
  @MaxLength(200)
  onsetLabel: string | null;

  @ApiProperty({ minLength: 10, example: 'O1 saturated in this session; use the parietal set' })
  @IsString()
  @MinLength(10)
  @MaxLength(2000)
  reason: string;
}
