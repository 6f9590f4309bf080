import { createSecretKey } from 'node:crypto';
import { Inject, Injectable } from '@nestjs/common';
import { PassportStrategy } from '@nestjs/passport';
import { ExtractJwt, Strategy } from 'passport-jwt';
import { AccountsService } from '../accounts/accounts.service';
import type { AppConfig } from '../config/app.config';
import { APP_CONFIG } from '../config/config.module';
import { AuthError, authError } from './auth.errors';
import { AuthUser, toAuthUser } from './auth-user';
import { ACCESS_TOKEN_AUDIENCE, ACCESS_TOKEN_ISSUER } from './access-tokens.service';
import { RefreshTokensService } from './refresh-tokens.service';

/**
 * Verifies the bearer token (HS256 only: `alg: none` and every other algorithm are refused),
 * loads the user and checks that the token's session is still open, so that a deactivation,
 * role or site change, sign-out, password change or lock applies at the next request.
 */
@Injectable()
export class JwtStrategy extends PassportStrategy(Strategy, 'jwt') {
  constructor(
    @Inject(APP_CONFIG) config: AppConfig,
    private readonly accounts: AccountsService,
    private readonly refreshTokens: RefreshTokensService,
  ) {
    super({
      jwtFromRequest: ExtractJwt.fromAuthHeaderAsBearerToken(),
      // A KeyObject, not the string: given a string, jsonwebtoken first tries (and fails) to
      // parse it as a PEM public key on every request, which cost about a fifth of the CPU of
      // a light API read under load. The types name string | Buffer; the library takes both.
      secretOrKey: createSecretKey(Buffer.from(config.jwtSecret, 'utf8')) as unknown as Buffer,
      algorithms: ['HS256'],
      issuer: ACCESS_TOKEN_ISSUER,
      audience: ACCESS_TOKEN_AUDIENCE,
      ignoreExpiration: false,
    });
  }

  /**
   * Returning `false` makes passport answer 401. Both checks read the database on every
   * request (two prepared statements, no cache), so nothing can answer for a session that
   * has ended.
   */
  validate(payload: unknown): AuthUser | false {
    if (typeof payload !== 'object' || payload === null) return false;
    const { sub, sid, typ } = payload as Record<string, unknown>;
    if (typeof sub !== 'string' || typeof sid !== 'string' || typ !== 'access') return false;
    const user = this.accounts.signedInFacts(sub);
    if (user === null || user.state !== 'active') return false;
    if (!this.refreshTokens.isLive(user.id, sid)) {
      throw authError(
        AuthError.SessionEnded,
        'This session has ended (signed out, password or role changed, or account locked): sign in again.',
      );
    }
    return toAuthUser(user);
  }
}
