import { Column, Entity, PrimaryColumn } from 'typeorm';

/** A study participant, known only by a pseudonymous code. */
@Entity('participant')
export class Participant {
  @PrimaryColumn('varchar') id: string;
  @Column('varchar') studyId: string;
  @Column('varchar') siteId: string;
  @Column('varchar') code: string;

  /** `YYYY-MM-DD`, day 0 of the visit schedule; null for rows from before the schedule. */
  @Column('varchar', { nullable: true }) enrolmentDate: string | null;

  /** The participant's group (arm) in the same study. */
  @Column('varchar', { nullable: true }) groupId: string | null;
  @Column('varchar') createdAt: string;
  @Column('varchar') updatedAt: string;
}
