import { Column, Entity, PrimaryColumn } from 'typeorm';

@Entity('site')
export class Site {
  @PrimaryColumn('varchar') id: string;
  @Column('varchar') studyId: string;
  @Column('varchar') code: string;
  @Column('varchar') name: string;
  @Column('varchar') createdAt: string;
  @Column('varchar') updatedAt: string;
}
