import { ApiProperty } from '@nestjs/swagger';
import { IsNumber, IsString, Max, MaxLength, Min, MinLength } from 'class-validator';

/** `POST /api/worker/jobs/:jobId/:attempt/progress` */
export class WorkerProgressDto {
  @ApiProperty({ example: 42, description: 'Percent done, 0–100' })
  @IsNumber({ allowNaN: false, allowInfinity: false })
  @Min(0)
  @Max(100)
  percent: number;
}

/** `POST /api/worker/jobs/:jobId/:attempt/failure`: the computation failed (counts an attempt). */
export class WorkerFailureDto {
  @ApiProperty({ example: 'stored file: SHA-256 … found, … expected' })
  @IsString()
  @MinLength(1)
  @MaxLength(4000)
  message: string;
}
