import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Transform } from 'class-transformer';
import { IsIn, IsNotEmpty, IsOptional, IsString, MaxLength } from 'class-validator';
import {
  WORKER_TOKEN_STATES,
  type CreatedWorkerTokenView,
  type Page,
  type WorkerTokenState,
  type WorkerTokenView,
} from '@gyre/shared';
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
  @ApiPropertyOptional({ enum: WORKER_TOKEN_STATES, description: 'Default: both' })
  @IsOptional()
  @IsIn(WORKER_TOKEN_STATES)
  state?: WorkerTokenState;
}

export class WorkerTokenResponseDto implements WorkerTokenView {
  @ApiProperty() id: string;
  @ApiProperty() name: string;
  @ApiProperty({ description: "The server's own token for workers on its machine" })
  local: boolean;
  @ApiProperty() createdAt: string;
  @ApiProperty({ type: String, nullable: true }) createdById: string | null;
  @ApiProperty({ type: String, nullable: true }) createdByName: string | null;
  @ApiProperty({ type: String, nullable: true }) lastUsedAt: string | null;
  @ApiProperty({ type: String, nullable: true }) revokedAt: string | null;
  @ApiProperty({ type: String, nullable: true }) revokedById: string | null;
  @ApiProperty({ type: String, nullable: true }) revokedByName: string | null;
  @ApiProperty({ type: String, nullable: true }) revokedReason: string | null;
}

export class CreatedWorkerTokenResponseDto
  extends WorkerTokenResponseDto
  implements CreatedWorkerTokenView
{
  @ApiProperty({ description: 'Shown this once: `Authorization: Bearer <secret>`' })
  secret: string;
}

export class WorkerTokenPageDto implements Page<WorkerTokenView> {
  @ApiProperty({ type: [WorkerTokenResponseDto] }) items: WorkerTokenView[];
  @ApiProperty() total: number;
  @ApiProperty() page: number;
  @ApiProperty() pageSize: number;
}
