import { Module } from '@nestjs/common';
import { APP_GUARD } from '@nestjs/core';
import { JwtModule } from '@nestjs/jwt';
import { PassportModule } from '@nestjs/passport';
import { ThrottlerModule } from '@nestjs/throttler';
import { AccountsModule } from '../accounts/accounts.module';
import type { AppConfig } from '../config/app.config';
import { APP_CONFIG } from '../config/config.module';
import { SitesModule } from '../sites/sites.module';
import { StudiesModule } from '../studies/studies.module';
import { WorkerTokensModule } from '../worker-tokens/worker-tokens.module';
import { AccessTokensService } from './access-tokens.service';
import { AuthThrottlerGuard } from './auth-throttler.guard';
import { AuthController } from './auth.controller';
import { AuthService } from './auth.service';
import { JwtAuthGuard } from './jwt-auth.guard';
import { JwtStrategy } from './jwt.strategy';
import { OneTimeTokensService } from './one-time-tokens.service';
import { PasswordHasherService } from './password-hasher.service';
import { PermissionsGuard } from './permissions.guard';
import {
  REFRESH_REUSE_GRACE,
  REFRESH_REUSE_GRACE_MS,
  RefreshTokensService,
} from './refresh-tokens.service';
import { SignInThrottlesService } from './sign-in-throttle.service';

/** Requests per minute per client address on `/api/auth/*`. */
export const AUTH_THROTTLE_LIMIT = 60;

@Module({
  imports: [
    PassportModule,
    JwtModule.registerAsync({
      inject: [APP_CONFIG],
      useFactory: (config: AppConfig) => ({
        secret: config.jwtSecret,
        signOptions: { algorithm: 'HS256' },
        verifyOptions: { algorithms: ['HS256'] },
      }),
    }),
    ThrottlerModule.forRoot({
      throttlers: [{ name: 'auth', ttl: 60_000, limit: AUTH_THROTTLE_LIMIT }],
      // The library's headers are suffixed with the throttler's name (`Retry-After-auth`).
      setHeaders: false,
    }),
    AccountsModule,
    StudiesModule,
    SitesModule,
    // The sign-in guard checks worker tokens (`gyre_wt_…` bearers) with its WorkerTokenAuthService.
    WorkerTokensModule,
  ],
  controllers: [AuthController],
  providers: [
    AuthService,
    AccessTokensService,
    RefreshTokensService,
    OneTimeTokensService,
    PasswordHasherService,
    SignInThrottlesService,
    AuthThrottlerGuard,
    { provide: REFRESH_REUSE_GRACE, useValue: REFRESH_REUSE_GRACE_MS },
    JwtStrategy,
    // Order matters: sign-in first, then the permission check that needs the user.
    { provide: APP_GUARD, useClass: JwtAuthGuard },
    { provide: APP_GUARD, useClass: PermissionsGuard },
  ],
  exports: [PasswordHasherService, OneTimeTokensService, RefreshTokensService, AccessTokensService],
})
export class AuthModule {}
