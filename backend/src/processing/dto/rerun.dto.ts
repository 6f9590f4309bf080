import { ApiPropertyOptional } from '@nestjs/swagger';
import { IsOptional, IsString, MaxLength } from 'class-validator';

export class RerunDto {
  @ApiPropertyOptional({ example: 'Settings v3: narrower band' })
  @IsOptional()
  @IsString()
  @MaxLength(2000)
  reason?: string;
}
