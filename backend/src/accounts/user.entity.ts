import { Column, Entity } from 'typeorm';
import type { Role, UserState } from '@gyre/shared';
import { ModelRowColumns } from '../common/database/model-columns';

/** A person who signs in. Never returned by a handler: see `UserView` (users/user-view.ts). */
@Entity('user')
export class User extends ModelRowColumns {
  /** Stored lower-cased; unique. */
  @Column('varchar') email: string;
  @Column('varchar') name: string;
  @Column('varchar') role: Role;
  @Column({ type: 'varchar', nullable: true }) studyId: string | null;
  @Column({ type: 'varchar', nullable: true }) siteId: string | null;

  /** bcrypt hash; null while the invitation is not yet accepted. */
  @Column({ type: 'varchar', nullable: true }) passwordHash: string | null;
  @Column('varchar') state: UserState;
  @Column('integer') failedSignIns: number;
  @Column({ type: 'varchar', nullable: true }) lockedUntil: string | null;
  @Column({ type: 'varchar', nullable: true }) lastSignInAt: string | null;
  @Column({ type: 'varchar', nullable: true }) passwordChangedAt: string | null;
}
