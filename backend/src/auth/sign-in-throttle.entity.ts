import { Column, Entity, PrimaryColumn } from 'typeorm';

export type SignInThrottleScope = 'account' | 'address' | 'pair';

/** Failed sign-ins counted for one account, one address, or one account from one address. */
@Entity('sign_in_throttle')
export class SignInThrottle {
  /** SHA-256 of the scope and the e-mail and/or address, so the table holds no addresses. */
  @PrimaryColumn('varchar', { length: 64 }) key: string;
  @Column('varchar', { length: 10 }) scope: SignInThrottleScope;
  @Column('integer') failures: number;
  @Column('varchar', { length: 30 }) lastFailureAt: string;

  /** No attempt under this key is evaluated before this instant. */
  @Column('varchar', { length: 30 }) blockedUntil: string;
}
