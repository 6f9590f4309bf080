import { Column, Entity, PrimaryColumn } from 'typeorm';

/** A group or arm of a study; participants belong to at most one. */
@Entity('study_group')
export class StudyGroup {
  @PrimaryColumn('varchar') id: string;
  @Column('varchar') studyId: string;
  @Column('varchar') name: string;
  @Column('varchar') description: string;
  @Column('varchar') createdAt: string;
  @Column('varchar') updatedAt: string;
}
