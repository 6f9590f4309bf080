import { Column, Entity, PrimaryColumn } from 'typeorm';

/** One refresh token of a rotation family; only the SHA-256 of the token is stored. */
@Entity('refresh_token')
export class RefreshToken {
  @PrimaryColumn('varchar')
  id: string;

  @Column('varchar')
  userId: string;

  /** Every token rotated from one sign-in shares it; reuse of a spent token revokes them all. */
  @Column('varchar')
  familyId: string;

  @Column('varchar')
  tokenHash: string;

  @Column('varchar')
  createdAt: string;

  @Column('varchar')
  expiresAt: string;

  @Column({ type: 'varchar', nullable: true })
  usedAt: string | null;

  @Column({ type: 'varchar', nullable: true })
  revokedAt: string | null;

  @Column({ type: 'varchar', nullable: true })
  revokedReason: string | null;

  /** The successor's secret, sealed with this token's secret: see `sealSuccessor`. */
  @Column({ type: 'varchar', nullable: true })
  successorSealed: string | null;
}
