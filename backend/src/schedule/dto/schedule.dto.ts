import { ApiProperty, ApiPropertyOptional, PartialType } from '@nestjs/swagger';
import { IsInt, IsNotEmpty, IsOptional, IsString, Max, MaxLength, Min } from 'class-validator';
import { Trimmed } from '../../common/dto/text-fields';

/** About 30 years: a schedule day beyond it is a typing error, not a protocol. */
const MAX_DAY = 11_000;

export class CreatePlannedVisitDto {
  @ApiProperty({
    example: 'Week 12',
    description: 'Unique within the study; at most 40 characters',
  })
  @Trimmed()
  @IsString()
  @IsNotEmpty()
  @MaxLength(40)
  name: string;

  @ApiProperty({ example: 84, description: 'Days after enrolment (enrolment = day 0)' })
  @IsInt()
  @Min(0)
  @Max(MAX_DAY)
  targetDay: number;

  @ApiProperty({ example: 14, description: 'Days before the target day still in window' })
  @IsInt()
  @Min(0)
  @Max(MAX_DAY)
  windowBeforeDays: number;

  @ApiProperty({ example: 14, description: 'Days after the target day still in window' })
  @IsInt()
  @Min(0)
  @Max(MAX_DAY)
  windowAfterDays: number;

  @ApiPropertyOptional({ description: 'Order in the schedule; default: after the last one' })
  @IsOptional()
  @IsInt()
  @Min(0)
  @Max(1000)
  position?: number;
}

export class UpdatePlannedVisitDto extends PartialType(CreatePlannedVisitDto) {}

export class CreateStudyGroupDto {
  @ApiProperty({ example: 'Arm A', description: 'Unique within the study; at most 60 characters' })
  @Trimmed()
  @IsString()
  @IsNotEmpty()
  @MaxLength(60)
  name: string;

  @ApiPropertyOptional({ example: 'Active training, twice a week' })
  @IsOptional()
  @Trimmed()
  @IsString()
  @MaxLength(2000)
  description?: string;
}

export class UpdateStudyGroupDto extends PartialType(CreateStudyGroupDto) {}
