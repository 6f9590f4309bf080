import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Transform } from 'class-transformer';
import { IsNotEmpty, IsOptional, IsString, MaxLength } from 'class-validator';
import { WORKER_TOKEN_STATES, type WorkerTokenState } from '@gyre/shared';
import { OneOf } from '../../common/dto/query-filters';
import { PageQueryDto } from '../../common/pagination/page-query.dto';

const trimmed = ({ value }: { value: unknown }): unknown =>
  typeof value === 'string' ? value.trim() : value;

export class CreateWorkerTokenDto {
  @ApiProperty({ example: 'compute node 2', description: 'Unique among live tokens' })
  @Transform(trimmed)
  @IsString()
  @IsNotEmpty({ message: 'name must not be empty' })
  @MaxLength(100)
  name: string;
}

export class RevokeWorkerTokenDto {
  @ApiPropertyOptional({ description: 'Why; kept in the audit trail' })
  @IsOptional()
  @Transform(trimmed)
  @IsString()
  @MaxLength(2000)
  reason?: string;
}

export class WorkerTokenQueryDto extends PageQueryDto {
  @OneOf(WORKER_TOKEN_STATES, { description: 'Default: both' }) state?: WorkerTokenState;
}
