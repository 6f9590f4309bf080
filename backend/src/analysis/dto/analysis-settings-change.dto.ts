import { applyDecorators } from '@nestjs/common';
import { ApiProperty } from '@nestjs/swagger';
import {
  ArrayMaxSize,
  ArrayMinSize,
  IsArray,
  IsIn,
  IsNumber,
  IsOptional,
  IsString,
  Matches,
  MaxLength,
  MinLength,
  ValidateIf,
} from 'class-validator';
import { ANALYSIS_METHODS } from '@gyre/shared';
import type { AnalysisMethod, AnalysisSettingsChange } from '@gyre/shared';

export const finite = { allowNaN: false, allowInfinity: false };
export const pair = (): PropertyDecorator =>
  applyDecorators(IsArray(), ArrayMinSize(2), ArrayMaxSize(2), IsNumber(finite, { each: true }));

/** A region of interest: 1 to 64 channel labels of the 10-10 system (O1, Pz, …). */
export const roiLabels = (): PropertyDecorator =>
  applyDecorators(
    IsArray(),
    ArrayMinSize(1),
    ArrayMaxSize(64),
    IsString({ each: true }),
    Matches(/^[A-Za-z]{1,2}([1-9]|10|z|Z)$/, { each: true }),
  );

/** The annotation text that marks a stimulus onset; null = the study's or any. */
export const onsetLabel = (): PropertyDecorator =>
  applyDecorators(IsOptional(), IsString(), MaxLength(200));

/** Why the change is made, kept in the audit trail: 10 to 2,000 characters. */
export const changeReason = (): PropertyDecorator =>
  applyDecorators(IsString(), MinLength(10), MaxLength(2000));

/** A new version of a study's analysis settings; every field is given, with a reason. */
export class AnalysisSettingsChangeDto implements AnalysisSettingsChange {
  @ApiProperty({
    type: [Number],
    nullable: true,
    example: null,
    description: '[low, high] Hz; null = visit IAF ± 2 Hz when known, else 8–13 Hz',
  })
  @ValidateIf((o: AnalysisSettingsChangeDto) => o.bandHz !== null)
  @pair()
  bandHz: [number, number] | null;

  @ApiProperty({ enum: ANALYSIS_METHODS })
  @IsIn(ANALYSIS_METHODS)
  method: AnalysisMethod;

  @ApiProperty({ example: 7 })
  @IsNumber(finite)
  morletCycles: number;

  @ApiProperty({ type: [Number], example: [-1, 2] })
  @pair()
  epochWindowS: [number, number];

  @ApiProperty({ type: [Number], example: [-0.5, 0] })
  @pair()
  baselineWindowS: [number, number];

  @ApiProperty({ type: [Number], example: [0.2, 0.8] })
  @pair()
  postWindowS: [number, number];

  @ApiProperty({ example: 100 })
  @IsNumber(finite)
  rejectionThresholdUv: number;

  @ApiProperty({ example: -0.2 })
  @IsNumber(finite)
  flagThresholdHz: number;

  @ApiProperty({ type: [String], example: ['O1', 'O2', 'Oz', 'Pz'] })
  @roiLabels()
  roi: string[];

  @ApiProperty({ nullable: true, example: null })
  @onsetLabel()
  onsetLabel: string | null;

  @ApiProperty({
    nullable: true,
    example: null,
    description:
      'Envelope percentile (1–90) under which instantaneous-frequency samples are left out; null = off',
  })
  @ValidateIf((o: AnalysisSettingsChangeDto) => o.amplitudeGatePercentile !== null)
  @IsNumber(finite)
  amplitudeGatePercentile: number | null;

  @ApiProperty({ example: 0.1, description: 'Warn when the two Δf estimates differ by more, Hz' })
  @IsNumber(finite)
  cycleDisagreementHz: number;

  @ApiProperty({
    type: [String],
    nullable: true,
    example: null,
    description: 'Two onset labels whose Δf difference is reported; null = the first two found',
  })
  @ValidateIf((o: AnalysisSettingsChangeDto) => o.compareConditions !== null)
  @IsArray()
  @ArrayMinSize(2)
  @ArrayMaxSize(2)
  @IsString({ each: true })
  @MaxLength(200, { each: true })
  compareConditions: [string, string] | null;

  @ApiProperty({ minLength: 10, example: 'Narrower band after the pilot review' })
  @changeReason()
  reason: string;
}
