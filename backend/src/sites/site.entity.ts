import { Column, Entity } from 'typeorm';
import { StudyRowColumns } from '../common/database/model-columns';

@Entity('site')
export class Site extends StudyRowColumns {
  @Column('varchar') code: string;
  @Column('varchar') name: string;
}
