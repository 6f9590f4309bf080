import { Column, PrimaryColumn } from 'typeorm';

/**
 * The columns of a user's stored token (e-mailed one-time tokens, refresh tokens), declared
 * once; each entity keeps its own table. Only the token's SHA-256 is stored, never the token.
 */
export abstract class UserTokenColumns {
  @PrimaryColumn('varchar') id: string;
  @Column('varchar') userId: string;
  @Column('varchar') tokenHash: string;
  @Column('varchar') createdAt: string;
  @Column('varchar') expiresAt: string;
  @Column({ type: 'varchar', nullable: true }) usedAt: string | null;
}
