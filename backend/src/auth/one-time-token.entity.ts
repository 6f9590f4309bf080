import { Column, Entity } from 'typeorm';
import { UserTokenColumns } from './user-token-columns';

export type OneTimeTokenPurpose = 'invitation' | 'password_reset';

/** An e-mailed, single-use, expiring token; only its SHA-256 is stored. */
@Entity('one_time_token')
export class OneTimeToken extends UserTokenColumns {
  @Column('varchar') purpose: OneTimeTokenPurpose;
}
