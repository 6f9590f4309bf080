import { Column, Entity, Index } from 'typeorm';
import type { RecordingKind, RecordingState } from '@gyre/shared';
import { VisitColumns } from '../common/database/scoped-columns';

/**
 * One uploaded file of a visit. `studyId`/`siteId`/`participantId` are copied from the
 * visit so that every query can be scoped without a join. The file itself lives under
 * `data/uploads/<checksum>.edf` (patient field blanked); a rejected recording keeps
 * only its checksum and the reason.
 */
@Entity('recording')
@Index('IDX_recording_visit', ['visitId', 'createdAt'])
export class Recording extends VisitColumns {
  @Column('varchar', { length: 16 }) kind: RecordingKind;
  @Column('varchar', { length: 16 }) state: RecordingState;

  /** SHA-256 (hex) of the stored, blanked copy. */
  @Column('varchar', { length: 64 }) checksumSha256: string;
  @Column('integer') sizeBytes: number;

  /**
   * The uploaded file's name as the technician's computer gave it (last path segment), or
   * null (none sent, or uploaded before names were kept). It may hold personal data: it is
   * read only in the recording's row scope, and kept out of the audit trail. The EDF
   * header's patient field is never stored (blanked on the way in).
   */
  @Column('varchar', { length: 255, nullable: true }) fileName: string | null;

  /** 50 or 60 (Hz) when the file's source declared it (EEG-BIDS `PowerLineFrequency`), else null. */
  @Column('integer', { nullable: true }) lineFrequencyHz: 50 | 60 | null;

  /** File name under the uploads folder, null while received and once rejected. */
  @Column('varchar', { length: 80, nullable: true }) storedFile: string | null;

  /** JSON of the validated file's facts (RecordingFacts). */
  @Column('text', { nullable: true }) factsJson: string | null;

  /** JSON list of `{ onsetS, label }` from the onset CSV, when one came with the file. */
  @Column('text', { nullable: true }) csvOnsetsJson: string | null;

  /** SHA-256 of the onset CSV as received. */
  @Column('varchar', { length: 64, nullable: true }) onsetsChecksumSha256: string | null;

  /** JSON `{ message, field, found, expected }` when rejected. */
  @Column('text', { nullable: true }) rejectionJson: string | null;

  /** The technician confirmed the kind although the file looks like the other kind. */
  @Column('boolean', { default: false }) kindConfirmed: boolean;

  /** The earlier recording of the same kind this one replaced, and why. */
  @Column('varchar', { length: 36, nullable: true }) replacesId: string | null;
  @Column('text', { nullable: true }) replacementReason: string | null;

  /** The newer recording that replaced this one. */
  @Column('varchar', { length: 36, nullable: true }) supersededById: string | null;

  /** The run behind the recording's current numbers (set when it becomes ready). */
  @Column('varchar', { length: 36, nullable: true }) latestRunId: string | null;

  /** JSON RoiUsageView of that run. */
  @Column('text', { nullable: true }) roiUsageJson: string | null;

  /** JSON list of that run's warnings (reader and analysis). */
  @Column('text', { nullable: true }) resultWarningsJson: string | null;

  /** The last computation error, when failed. */
  @Column('text', { nullable: true }) failureMessage: string | null;
  @Column('varchar', { length: 36 }) uploadedById: string;
  @Column('varchar', { length: 30 }) createdAt: string;
  @Column('varchar', { length: 30 }) updatedAt: string;
}
