import { ApiPropertyOptional } from '@nestjs/swagger';
import { IsOptional, IsUUID } from 'class-validator';

/** `?studyId=` of `GET /api/calibration-runs/latest`. */
export class LatestCalibrationQueryDto {
  @ApiPropertyOptional({ format: 'uuid', description: 'Only the sites of this study' })
  @IsOptional()
  @IsUUID()
  studyId?: string;
}
