import { Column, Entity } from 'typeorm';
import { StudyRowColumns } from '../common/database/model-columns';

/** A group or arm of a study; participants belong to at most one. */
@Entity('study_group')
export class StudyGroup extends StudyRowColumns {
  @Column('varchar') name: string;
  @Column('varchar') description: string;
}
