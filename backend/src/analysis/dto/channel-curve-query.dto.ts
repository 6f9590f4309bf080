import { ApiProperty } from '@nestjs/swagger';
import { IsNotEmpty, IsString, MaxLength } from 'class-validator';
import { ResultsQueryDto } from './results-query.dto';

export class ChannelCurveQueryDto extends ResultsQueryDto {
  @ApiProperty({
    description: "A channel's label as the file names it (one of the results' curveChannels)",
    example: 'EEG O1-REF',
  })
  @IsString()
  @IsNotEmpty()
  // EDF labels are 16 characters (Kemp et al. 1992); the room above is for safety only.
  @MaxLength(80)
  channel: string;
}
