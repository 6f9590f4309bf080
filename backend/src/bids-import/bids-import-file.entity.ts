import { Column, Entity } from 'typeorm';
import { StudySiteColumns } from '../common/database/scoped-columns';

/**
 * Where an imported recording came from and what its EEG-BIDS sidecars said: the path in the
 * uploaded folder, the task, the power line frequency (which line-noise check applies) and the
 * channels its `*_channels.tsv` marked bad. One row per recording an import created.
 */
@Entity('bids_import_file')
export class BidsImportFile extends StudySiteColumns {
  /** One import's rows share it (the audit entry `bids-import` names it). */
  @Column('varchar', { length: 36 })
  importId: string;

  @Column('varchar', { length: 36 })
  recordingId: string;

  @Column('varchar', { length: 36 })
  visitId: string;

  @Column('varchar', { length: 1000 })
  path: string;

  @Column('varchar', { length: 200 })
  task: string;

  @Column('varchar', { length: 200, nullable: true })
  taskName: string | null;

  /** 50 or 60 (Hz), or null when the sidecar says n/a. */
  @Column('integer', { nullable: true })
  lineFrequencyHz: number | null;

  /** JSON of `BidsBadChannel[]`. */
  @Column('text')
  badChannelsJson: string;

  @Column('varchar', { length: 36 })
  importedById: string;

  @Column('varchar', { length: 30 })
  createdAt: string;
}
