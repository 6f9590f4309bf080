import { Column, Entity, PrimaryColumn } from 'typeorm';

/** One visit of a participant; `studyId`/`siteId` are copied from the participant for scoping. */
@Entity('visit')
export class Visit {
  @PrimaryColumn('varchar')
  id: string;

  @Column('varchar')
  participantId: string;

  @Column('varchar')
  studyId: string;

  @Column('varchar')
  siteId: string;

  @Column('varchar')
  label: string;

  /** Calendar date, `YYYY-MM-DD`. */
  @Column('varchar')
  visitDate: string;

  @Column('varchar')
  createdAt: string;

  @Column('varchar')
  updatedAt: string;
}
