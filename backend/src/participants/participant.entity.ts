import { Column, Entity } from 'typeorm';
import { StudyRowColumns } from '../common/database/model-columns';

/** A study participant, known only by a pseudonymous code. */
@Entity('participant')
export class Participant extends StudyRowColumns {
  @Column('varchar') siteId: string;
  @Column('varchar') code: string;

  /** `YYYY-MM-DD`, day 0 of the visit schedule; null for rows from before the schedule. */
  @Column('varchar', { nullable: true }) enrolmentDate: string | null;

  /** The participant's group (arm) in the same study. */
  @Column('varchar', { nullable: true }) groupId: string | null;
}
