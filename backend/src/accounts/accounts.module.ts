import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { AccountsService } from './accounts.service';
import { User } from './user.entity';

/**
 * Owns the `user` table and imports nothing of auth or users, so that both (and sign-off) can
 * depend on it without a module cycle (`UsersModule` imports `AuthModule`).
 */
@Module({
  imports: [TypeOrmModule.forFeature([User])],
  providers: [AccountsService],
  exports: [AccountsService],
})
export class AccountsModule {}
