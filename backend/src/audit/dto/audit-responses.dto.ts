import { ApiProperty } from '@nestjs/swagger';
import type {
  AuditEntryContext,
  AuditAnchorsCheck,
  AuditCheckpointView,
  AuditEntryView,
  AuditVerifyResult,
  Page,
} from '@gyre/shared';

class AuditEntryContextDto implements AuditEntryContext {
  @ApiProperty({ type: String, nullable: true, description: 'Null: the system, or out of scope' })
  actorName: string | null;
  @ApiProperty({ type: String, nullable: true }) participantId: string | null;
  @ApiProperty({ type: String, nullable: true, example: 'A1-0001' }) participantCode: string | null;
  @ApiProperty({ type: String, nullable: true }) visitId: string | null;
  @ApiProperty({ type: String, nullable: true, example: 'V1' }) visitLabel: string | null;
  @ApiProperty({ type: String, nullable: true, example: 'resting' }) recordingKind: string | null;
  @ApiProperty({
    type: 'object',
    additionalProperties: { type: 'string' },
    description: 'Display names of the users the entry names, by id (only those in scope)',
  })
  people: Record<string, string>;
}

export class AuditEntryResponseDto implements AuditEntryView {
  @ApiProperty() seq: number;
  @ApiProperty() at: string;
  @ApiProperty({ type: String, nullable: true }) actorId: string | null;
  @ApiProperty({ type: String, nullable: true }) actorEmail: string | null;
  @ApiProperty({ example: 'update' }) action: string;
  @ApiProperty({ example: 'Participant' }) objectType: string;
  @ApiProperty({ type: String, nullable: true }) objectId: string | null;
  @ApiProperty({ type: String, nullable: true }) studyId: string | null;
  @ApiProperty({ type: String, nullable: true }) siteId: string | null;
  @ApiProperty({ nullable: true, description: 'The object before the change' }) before: unknown;
  @ApiProperty({ nullable: true, description: 'The object after the change' }) after: unknown;
  @ApiProperty({ type: String, nullable: true }) reason: string | null;
  @ApiProperty({ type: String, nullable: true }) clientIp: string | null;
  @ApiProperty() prevHash: string;
  @ApiProperty({ description: 'SHA-256 of prevHash + canonical JSON of the entry' }) hash: string;
  @ApiProperty({
    type: AuditEntryContextDto,
    required: false,
    description: 'Names and links behind the ids, for the reader (not part of the hash)',
  })
  context?: AuditEntryContextDto;
}

export class AuditPageDto implements Page<AuditEntryView> {
  @ApiProperty({ type: [AuditEntryResponseDto] }) items: AuditEntryView[];
  @ApiProperty() total: number;
  @ApiProperty() page: number;
  @ApiProperty() pageSize: number;
}

class BrokenEntryDto {
  @ApiProperty() seq: number;
  @ApiProperty() reason: string;
}

class CheckpointDto implements AuditCheckpointView {
  @ApiProperty({ description: 'Line number in the anchor file' }) line: number;
  @ApiProperty() seq: number;
  @ApiProperty() hash: string;
  @ApiProperty() at: string;
}

class AnchorsCheckDto implements AuditAnchorsCheck {
  @ApiProperty() intact: boolean;
  @ApiProperty({ description: 'Lines of the anchor file read' }) checkpoints: number;
  @ApiProperty({ type: CheckpointDto, nullable: true }) latest: CheckpointDto | null;
  @ApiProperty({ description: 'Entries after the newest checkpoint' }) unanchored: number;
  @ApiProperty({ type: String, nullable: true }) keyFingerprint: string | null;
  @ApiProperty({ type: [String], description: 'Each finding in plain words' }) problems: string[];
}

export class AuditVerifyResponseDto implements AuditVerifyResult {
  @ApiProperty() intact: boolean;
  @ApiProperty() checked: number;
  @ApiProperty({ type: BrokenEntryDto, nullable: true }) firstBroken: BrokenEntryDto | null;
  @ApiProperty({ type: String, nullable: true }) lastHash: string | null;
  @ApiProperty({ type: AnchorsCheckDto }) anchors: AnchorsCheckDto;
}
