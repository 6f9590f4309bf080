import { ExecutionContext, Injectable } from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import { AuthGuard } from '@nestjs/passport';
import { IS_PUBLIC_KEY } from '../common/decorators/public.decorator';
import { ErrorKind, GyreException } from '../common/errors/gyre.exception';
import { AuthError } from './auth.errors';

/** The global sign-in guard: every route needs a valid access token unless it is `@Public()`. */
@Injectable()
export class JwtAuthGuard extends AuthGuard('jwt') {
  constructor(private readonly reflector: Reflector) {
    super();
  }

  override canActivate(context: ExecutionContext) {
    const isPublic = this.reflector.getAllAndOverride<boolean>(IS_PUBLIC_KEY, [
      context.getHandler(),
      context.getClass(),
    ]);
    if (isPublic === true) return true;
    return super.canActivate(context);
  }

  override handleRequest<TUser>(error: unknown, user: TUser | false): TUser {
    if (error !== null && error !== undefined && !(error instanceof Error)) throw error;
    if (error instanceof GyreException) throw error;
    if (user === false || user === null || user === undefined) {
      throw new GyreException(
        ErrorKind.Unauthenticated,
        AuthError.TokenInvalid,
        'Sign-in is missing, expired or invalid: sign in again.',
      );
    }
    return user;
  }
}
