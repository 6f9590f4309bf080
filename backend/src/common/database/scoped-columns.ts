import { Column, PrimaryColumn } from 'typeorm';

/*
 * The columns the rows of the recording pipeline share, declared once (TypeORM copies a base
 * class's columns into each entity's own table; nothing is joined or embedded). `studyId` and
 * `siteId` are copied from the visit when a row is written, so that every query and every
 * CASL row condition is scoped without a join.
 */

/** A row of a study at a site: its id and the two columns the scope rules read. */
export abstract class StudySiteColumns {
  @PrimaryColumn('varchar', { length: 36 }) id: string;
  @Column('varchar', { length: 36 }) studyId: string;
  @Column('varchar', { length: 36 }) siteId: string;
}

/** A row about one visit of one participant (recordings, runs, flags, reviews, revisions). */
export abstract class VisitColumns extends StudySiteColumns {
  @Column('varchar', { length: 36 }) visitId: string;
  @Column('varchar', { length: 36 }) participantId: string;
}
