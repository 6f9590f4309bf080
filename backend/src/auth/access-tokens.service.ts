import { Injectable } from '@nestjs/common';
import { JwtService } from '@nestjs/jwt';

export const ACCESS_TOKEN_ISSUER = 'gyre';
export const ACCESS_TOKEN_AUDIENCE = 'gyre-api';
/** 15 minutes: a stolen access token is worth little; the refresh cookie renews it. */
export const ACCESS_TOKEN_LIFETIME_S = 15 * 60;

@Injectable()
export class AccessTokens {
  constructor(private readonly jwt: JwtService) {}

  issue(user: { id: string; role: string }): string {
    return this.jwt.sign(
      { sub: user.id, role: user.role, typ: 'access' },
      {
        algorithm: 'HS256',
        expiresIn: ACCESS_TOKEN_LIFETIME_S,
        issuer: ACCESS_TOKEN_ISSUER,
        audience: ACCESS_TOKEN_AUDIENCE,
      },
    );
  }
}
