import { Column, Entity } from 'typeorm';
import { StudyRowColumns } from '../common/database/model-columns';

/** One visit of a participant; `studyId`/`siteId` are copied from the participant for scoping. */
@Entity('visit')
export class Visit extends StudyRowColumns {
  @Column('varchar') participantId: string;
  @Column('varchar') siteId: string;

  /** The planned visit's name when one was picked (so every screen keeps showing it). */
  @Column('varchar') label: string;

  /** The study's planned visit this visit was registered on; null for an unscheduled visit. */
  @Column('varchar', { nullable: true }) plannedVisitId: string | null;

  /** Calendar date, `YYYY-MM-DD`. */
  @Column('varchar') visitDate: string;
}
