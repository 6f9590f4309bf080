import { ApiProperty } from '@nestjs/swagger';
import type {
  AuditAnchorsCheck,
  AuditCheckpointView,
  AuditEntryView,
  AuditVerifyResult,
  Page,
} from '@gyre/shared';

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
