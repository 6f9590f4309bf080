import { Column, PrimaryColumn } from 'typeorm';

/*
 * The columns every row of the study model has, declared once (TypeORM copies a base class's
 * columns into each entity's own table, as with scoped-columns.ts). Times are ISO 8601 text.
 */

/** A row of the study model: its id, when it was made and when it last changed. */
export abstract class ModelRowColumns {
  @PrimaryColumn('varchar') id: string;
  @Column('varchar') createdAt: string;
  @Column('varchar') updatedAt: string;
}

/** A row that belongs to one study (a site, a planned visit, a group, a visit). */
export abstract class StudyRowColumns extends ModelRowColumns {
  @Column('varchar') studyId: string;
}
