import { Column, Entity, PrimaryColumn } from 'typeorm';

/**
 * A credential for worker processes (docs/security.md, "Worker tokens"). Only the SHA-256 of
 * its secret is stored; revoked rows stay, so the list and the audit trail keep their names.
 */
@Entity('worker_token')
export class WorkerToken {
  @PrimaryColumn('varchar') id: string;
  @Column('varchar') name: string;

  /** SHA-256 (hex) of the secret part of the token. */
  @Column('varchar') secretHash: string;

  /** The server's own token for workers on its machine (written to DATA_DIR/worker-token). */
  @Column('boolean') local: boolean;
  @Column('varchar') createdAt: string;

  /** `null` when Gyre made it itself. */
  @Column({ type: 'varchar', nullable: true }) createdById: string | null;
  @Column({ type: 'varchar', nullable: true }) lastUsedAt: string | null;
  @Column({ type: 'varchar', nullable: true }) revokedAt: string | null;

  /** `null` when Gyre revoked it itself (the local token, replaced at start). */
  @Column({ type: 'varchar', nullable: true }) revokedById: string | null;
  @Column({ type: 'varchar', nullable: true }) revokedReason: string | null;
}
