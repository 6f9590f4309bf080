import { Inject, Injectable } from '@nestjs/common';
import { PassportStrategy } from '@nestjs/passport';
import { InjectRepository } from '@nestjs/typeorm';
import { ExtractJwt, Strategy } from 'passport-jwt';
import { Repository } from 'typeorm';
import type { AppConfig } from '../config/app.config';
import { APP_CONFIG } from '../config/config.module';
import { User } from '../users/user.entity';
import { AuthUser } from './auth-user';
import { ACCESS_TOKEN_AUDIENCE, ACCESS_TOKEN_ISSUER } from './access-tokens.service';

/**
 * Verifies the bearer token (HS256 only: `alg: none` and every other algorithm are refused)
 * and loads the user, so that a deactivation or role change applies at once.
 */
@Injectable()
export class JwtStrategy extends PassportStrategy(Strategy, 'jwt') {
  constructor(
    @Inject(APP_CONFIG) config: AppConfig,
    @InjectRepository(User) private readonly users: Repository<User>,
  ) {
    super({
      jwtFromRequest: ExtractJwt.fromAuthHeaderAsBearerToken(),
      secretOrKey: config.jwtSecret,
      algorithms: ['HS256'],
      issuer: ACCESS_TOKEN_ISSUER,
      audience: ACCESS_TOKEN_AUDIENCE,
      ignoreExpiration: false,
    });
  }

  /** Returning `false` makes passport answer 401. */
  async validate(payload: unknown): Promise<AuthUser | false> {
    if (typeof payload !== 'object' || payload === null) return false;
    const { sub, typ } = payload as Record<string, unknown>;
    if (typeof sub !== 'string' || typ !== 'access') return false;
    const user = await this.users.findOneBy({ id: sub });
    if (user === null || user.state !== 'active') return false;
    return {
      id: user.id,
      email: user.email,
      name: user.name,
      role: user.role,
      studyId: user.studyId,
      siteId: user.siteId,
    };
  }
}
