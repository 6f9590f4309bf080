import { ExecutionContext, Injectable } from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import { AuthGuard } from '@nestjs/passport';
import { IS_PUBLIC_KEY } from '../common/decorators/public.decorator';
import { GyreException } from '../common/errors/gyre.exception';
import { WorkerTokenAuthService } from '../worker-tokens/worker-token-auth.service';
import { workerTokenInHeader } from '../worker-tokens/worker-token-secret';
import { AuthError, authError } from './auth.errors';
import { GyreRequest } from './auth-user';

/**
 * The global sign-in guard: every route needs a valid access token unless it is `@Public()`.
 * A `gyre_wt_` bearer is a worker token instead: checked here (401 when unknown or revoked) and
 * attached as `request.worker`, never as a user; PermissionsGuard then gives it the worker's rules.
 */
@Injectable()
export class JwtAuthGuard extends AuthGuard('jwt') {
  constructor(
    private readonly reflector: Reflector,
    private readonly workerTokens: WorkerTokenAuthService,
  ) {
    super();
  }

  override canActivate(context: ExecutionContext) {
    const isPublic = this.reflector.getAllAndOverride<boolean>(IS_PUBLIC_KEY, [
      context.getHandler(),
      context.getClass(),
    ]);
    if (isPublic === true) return true;
    const request = context.switchToHttp().getRequest<GyreRequest>();
    const workerToken = workerTokenInHeader(request.headers.authorization);
    if (workerToken !== null) return this.signInWorker(request, workerToken);
    return super.canActivate(context);
  }

  private async signInWorker(request: GyreRequest, token: string): Promise<boolean> {
    request.worker = await this.workerTokens.authenticate(token);
    return true;
  }

  override handleRequest<TUser>(error: unknown, user: TUser | false): TUser {
    if (error !== null && error !== undefined && !(error instanceof Error)) throw error;
    if (error instanceof GyreException) throw error;
    if (user === false || user === null || user === undefined) {
      throw authError(
        AuthError.TokenInvalid,
        'Sign-in is missing, expired or invalid: sign in again.',
      );
    }
    return user;
  }
}
