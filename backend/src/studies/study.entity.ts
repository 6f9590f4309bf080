import { Column, Entity, PrimaryColumn } from 'typeorm';

@Entity('study')
export class Study {
  @PrimaryColumn('varchar')
  id: string;

  @Column('varchar')
  code: string;

  @Column('varchar')
  name: string;

  @Column('text')
  description: string;

  @Column('varchar')
  createdAt: string;

  @Column('varchar')
  updatedAt: string;
}
