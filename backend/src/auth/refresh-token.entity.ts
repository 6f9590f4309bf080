import { Column, Entity } from 'typeorm';
import { UserTokenColumns } from './user-token-columns';

/** One refresh token of a rotation family; only the SHA-256 of the token is stored. */
@Entity('refresh_token')
export class RefreshToken extends UserTokenColumns {
  /** Every token rotated from one sign-in shares it; reuse of a spent token revokes them all. */
  @Column('varchar') familyId: string;
  @Column({ type: 'varchar', nullable: true }) revokedAt: string | null;
  @Column({ type: 'varchar', nullable: true }) revokedReason: string | null;

  /** The successor's secret, sealed with this token's secret: see `sealSuccessor`. */
  @Column({ type: 'varchar', nullable: true }) successorSealed: string | null;
}
