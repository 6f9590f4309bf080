import { Inject, Injectable, OnModuleInit } from '@nestjs/common';
import { compare, hash } from 'bcryptjs';
import type { AppConfig } from '../config/app.config';
import { APP_CONFIG } from '../config/config.module';

/**
 * bcrypt through bcryptjs. Cost 12 in use; 10 (the floor Gyre allows) under NODE_ENV=test so
 * that the suites stay quick on two cores.
 */
@Injectable()
export class PasswordHasherService implements OnModuleInit {
  readonly cost: number;
  private dummyHash: Promise<string> | null = null;

  constructor(@Inject(APP_CONFIG) config: AppConfig) {
    this.cost = config.nodeEnv === 'test' ? 10 : 12;
  }

  /** Made at start-up, so that the first unknown e-mail does not take a hash longer. */
  async onModuleInit(): Promise<void> {
    await this.dummy();
  }

  hash(password: string): Promise<string> {
    return hash(password, this.cost);
  }

  verify(password: string, passwordHash: string): Promise<boolean> {
    return compare(password, passwordHash);
  }

  /** Spends the same time as a real check, so that an unknown e-mail cannot be told apart. */
  async verifyAgainstNothing(password: string): Promise<false> {
    await compare(password, await this.dummy());
    return false;
  }

  private dummy(): Promise<string> {
    this.dummyHash ??= hash('gyre-unknown-account-placeholder', this.cost);
    return this.dummyHash;
  }
}
