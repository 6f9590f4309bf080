import { Column, Entity, Index } from 'typeorm';
import { VisitColumns } from '../common/database/scoped-columns';

/**
 * One "visit reviewed" act: an analyst looked at the visit's current results and said so.
 * Rows are only ever added; the newest row of a visit is its review, and it holds only while
 * `fingerprint` equals the fingerprint of the visit's current runs (see review-fingerprint.ts).
 */
@Entity('visit_review')
@Index('IDX_visit_review_visit', ['visitId', 'reviewedAt'])
@Index('IDX_visit_review_study', ['studyId', 'visitId'])
export class VisitReview extends VisitColumns {
  @Column('varchar', { length: 36 }) reviewedById: string;

  /** The reviewer's name when they reviewed (kept even if the account is renamed). */
  @Column('varchar', { length: 200 }) reviewedByName: string;
  @Column('varchar', { length: 30 }) reviewedAt: string;

  /** SHA-256 (hex) over `runIds`. */
  @Column('varchar', { length: 64 }) fingerprint: string;

  /** JSON list of the runs reviewed, `kind:runId`, sorted. */
  @Column('text') runIdsJson: string;
}
