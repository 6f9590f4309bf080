import { ApiProperty } from '@nestjs/swagger';
import { ValidateIf } from 'class-validator';
import type { VisitAnalysisOverrideChange } from '@gyre/shared';
import { changeReason, onsetLabel, pair, roiLabels } from './analysis-settings-change.dto';

/** A visit's own region of interest, band and onset label (null = the study's), with a reason. */
export class VisitAnalysisOverrideChangeDto implements VisitAnalysisOverrideChange {
  @ApiProperty({ type: [String], nullable: true, example: ['O1', 'Pz'] })
  @ValidateIf((o: VisitAnalysisOverrideChangeDto) => o.roi !== null)
  @roiLabels()
  roi: string[] | null;

  @ApiProperty({ type: [Number], nullable: true, example: null })
  @ValidateIf((o: VisitAnalysisOverrideChangeDto) => o.bandHz !== null)
  @pair()
  bandHz: [number, number] | null;

  @ApiProperty({ nullable: true, example: null })
  @onsetLabel()
  onsetLabel: string | null;

  @ApiProperty({ minLength: 10, example: 'O1 saturated in this session; use the parietal set' })
  @changeReason()
  reason: string;
}
