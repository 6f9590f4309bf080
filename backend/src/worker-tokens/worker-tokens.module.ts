import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { AccountsModule } from '../accounts/accounts.module';
import { LocalWorkerTokenService } from './local-worker-token.service';
import { WorkerToken } from './worker-token.entity';
import { WorkerTokenAuthService } from './worker-token-auth.service';
import { WorkerTokensController } from './worker-tokens.controller';
import { WorkerTokensService } from './worker-tokens.service';

/**
 * Worker tokens: the admin routes, the check the sign-in guard runs on a `gyre_wt_` bearer,
 * and the local token written at start. Imports nothing of auth, so `AuthModule` can import it.
 */
@Module({
  imports: [TypeOrmModule.forFeature([WorkerToken]), AccountsModule],
  controllers: [WorkerTokensController],
  providers: [WorkerTokensService, WorkerTokenAuthService, LocalWorkerTokenService],
  exports: [WorkerTokenAuthService],
})
export class WorkerTokensModule {}
