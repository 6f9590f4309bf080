import { Column, Entity, Index, PrimaryColumn } from 'typeorm';

/**
 * A visit's blinded-review code: random, stored once and never changed, so an analyst sees
 * the same code for the same visit every time. Nothing about the visit can be read from it.
 */
@Entity('visit_blind_code')
@Index('UQ_visit_blind_code_study_code', ['studyId', 'code'], { unique: true })
export class VisitBlindCode {
  @PrimaryColumn('varchar', { length: 36 }) visitId: string;
  @Column('varchar', { length: 36 }) studyId: string;

  /** `B-` and four characters of {@link BLIND_CODE_ALPHABET}, unique within the study. */
  @Column('varchar', { length: 16 }) code: string;
  @Column('varchar', { length: 30 }) createdAt: string;
}
