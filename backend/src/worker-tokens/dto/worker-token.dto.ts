import { ApiProperty } from '@nestjs/swagger';
import { IsNotEmpty, IsString, MaxLength } from 'class-validator';
import { WORKER_TOKEN_STATES, type WorkerTokenState } from '@gyre/shared';
import { OneOf } from '../../common/dto/query-filters';
import { AuditReasonText, Trimmed } from '../../common/dto/text-fields';
import { PageQueryDto } from '../../common/pagination/page-query.dto';

export class CreateWorkerTokenDto {
  @ApiProperty({ example: 'compute node 2', description: 'Unique among live tokens' })
  @Trimmed()
  @IsString()
  @IsNotEmpty({ message: 'name must not be empty' })
  @MaxLength(100)
  name: string;
}

export class RevokeWorkerTokenDto {
  @AuditReasonText()
  @Trimmed()
  reason?: string;
}

export class WorkerTokenQueryDto extends PageQueryDto {
  @OneOf(WORKER_TOKEN_STATES, { description: 'Default: both' }) state?: WorkerTokenState;
}
