import { Column, Entity } from 'typeorm';
import { StudyRowColumns } from '../common/database/model-columns';

/** One visit of a study's schedule: a target day counted from enrolment and its window. */
@Entity('planned_visit')
export class PlannedVisit extends StudyRowColumns {
  @Column('varchar') name: string;
  @Column('integer') targetDay: number;
  @Column('integer') windowBeforeDays: number;
  @Column('integer') windowAfterDays: number;
  @Column('integer') position: number;
}
