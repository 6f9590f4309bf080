import { Column, Entity, PrimaryColumn } from 'typeorm';

export type OneTimeTokenPurpose = 'invitation' | 'password_reset';

/** An e-mailed, single-use, expiring token; only its SHA-256 is stored. */
@Entity('one_time_token')
export class OneTimeToken {
  @PrimaryColumn('varchar')
  id: string;

  @Column('varchar')
  userId: string;

  @Column('varchar')
  purpose: OneTimeTokenPurpose;

  @Column('varchar')
  tokenHash: string;

  @Column('varchar')
  createdAt: string;

  @Column('varchar')
  expiresAt: string;

  @Column({ type: 'varchar', nullable: true })
  usedAt: string | null;
}
