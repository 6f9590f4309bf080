import { Column, Entity, PrimaryColumn } from 'typeorm';

/** A study participant, known only by a pseudonymous code. */
@Entity('participant')
export class Participant {
  @PrimaryColumn('varchar')
  id: string;

  @Column('varchar')
  studyId: string;

  @Column('varchar')
  siteId: string;

  @Column('varchar')
  code: string;

  @Column('varchar')
  createdAt: string;

  @Column('varchar')
  updatedAt: string;
}
