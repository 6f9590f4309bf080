import { Injectable } from '@nestjs/common';
import { JwtService } from '@nestjs/jwt';

export const ACCESS_TOKEN_ISSUER = 'gyre';
export const ACCESS_TOKEN_AUDIENCE = 'gyre-api';
/** 15 minutes: a stolen access token is worth little; the refresh cookie renews it. */
export const ACCESS_TOKEN_LIFETIME_S = 15 * 60;

@Injectable()
export class AccessTokensService {
  constructor(private readonly jwt: JwtService) {}

  /** `sid` names the session (refresh family): the token is refused once that session ends. */
  issue(user: { id: string; role: string }, sessionId: string): string {
    return this.jwt.sign(
      { sub: user.id, sid: sessionId, role: user.role, typ: 'access' },
      {
        algorithm: 'HS256',
        expiresIn: ACCESS_TOKEN_LIFETIME_S,
        issuer: ACCESS_TOKEN_ISSUER,
        audience: ACCESS_TOKEN_AUDIENCE,
      },
    );
  }
}
