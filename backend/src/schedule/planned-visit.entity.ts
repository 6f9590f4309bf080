import { Column, Entity, PrimaryColumn } from 'typeorm';

/** One visit of a study's schedule: a target day counted from enrolment and its window. */
@Entity('planned_visit')
export class PlannedVisit {
  @PrimaryColumn('varchar') id: string;
  @Column('varchar') studyId: string;
  @Column('varchar') name: string;
  @Column('integer') targetDay: number;
  @Column('integer') windowBeforeDays: number;
  @Column('integer') windowAfterDays: number;
  @Column('integer') position: number;
  @Column('varchar') createdAt: string;
  @Column('varchar') updatedAt: string;
}
