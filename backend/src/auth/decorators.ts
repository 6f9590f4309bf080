import { createParamDecorator, ExecutionContext, SetMetadata } from '@nestjs/common';
import type { Action, AppAbility, SubjectName } from '@gyre/shared';
import { clientAddressOf } from '../common/http/client-address';
import { AuthError, authError } from './auth.errors';
import { AuthUser, GyreRequest, WorkerPrincipal } from './auth-user';

export const REQUIRED_PERMISSION_KEY = 'gyre:requiredPermission';
export const SIGNED_IN_ONLY_KEY = 'gyre:signedInOnly';

export interface RequiredPermission {
  action: Action;
  subject: SubjectName;
}

/**
 * The type-level rule a route needs ("may this role ever read a Result?"): 403 when not.
 * Row-level conditions (study, site) are applied by the service inside its query.
 */
export const RequirePermission = (
  action: Action,
  subject: SubjectName,
): MethodDecorator & ClassDecorator =>
  SetMetadata(REQUIRED_PERMISSION_KEY, { action, subject } satisfies RequiredPermission);

/** For the few routes any signed-in user may call (e.g. `GET /api/auth/me`). */
export const SignedInOnly = (): MethodDecorator & ClassDecorator =>
  SetMetadata(SIGNED_IN_ONLY_KEY, true);

function requestOf(context: ExecutionContext): GyreRequest {
  return context.switchToHttp().getRequest<GyreRequest>();
}

function signedIn(request: GyreRequest): { user: AuthUser; ability: AppAbility } {
  if (request.user === undefined || request.ability === undefined) {
    throw authError(AuthError.SignInRequired, 'Sign in first.');
  }
  return { user: request.user, ability: request.ability };
}

/** The signed-in user; only on routes behind the global guard. */
export const CurrentUser = createParamDecorator(
  (_data: unknown, context: ExecutionContext): AuthUser => signedIn(requestOf(context)).user,
);

/**
 * The worker token's holder, on routes that require a worker subject (`JobInput`,
 * `JobResult`); 401 when the caller is a user or nobody.
 */
export const CurrentWorker = createParamDecorator(
  (_data: unknown, context: ExecutionContext): WorkerPrincipal => {
    const request = requestOf(context);
    if (request.worker === undefined) {
      throw authError(
        AuthError.SignInRequired,
        'This route is for worker processes: send a worker token.',
      );
    }
    return request.worker;
  },
);

/** Who is calling and from where: what services need for scoping and for the audit trail. */
export interface Caller {
  user: AuthUser;
  ability: AppAbility;
  clientIp: string | null;
}

export const CurrentCaller = createParamDecorator(
  (_data: unknown, context: ExecutionContext): Caller => {
    const request = requestOf(context);
    return { ...signedIn(request), clientIp: clientAddressOf(request) };
  },
);

/** The client's address, also on public routes. */
export const ClientIp = createParamDecorator(
  (_data: unknown, context: ExecutionContext): string | null => clientAddressOf(requestOf(context)),
);
