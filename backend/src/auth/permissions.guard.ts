import { CanActivate, ExecutionContext, Injectable } from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import { defineAbilityFor, defineWorkerAbility, type AppAbility } from '@gyre/shared';
import { IS_PUBLIC_KEY } from '../common/decorators/public.decorator';
import { ErrorKind, GyreException } from '../common/errors/gyre.exception';
import { AuthError } from './auth.errors';
import { GyreRequest } from './auth-user';
import { REQUIRED_PERMISSION_KEY, RequiredPermission, SIGNED_IN_ONLY_KEY } from './decorators';
import { aRole, capitalise } from './role-wording';

/**
 * Runs after the sign-in guard: builds the caller's CASL ability (a user's from their role, a
 * worker token's from the worker rules) and checks the route's `@RequirePermission` at type
 * level (403). A route that declares neither a permission, `@SignedInOnly()` nor `@Public()` is
 * refused, so that no route is open by omission. `@SignedInOnly()` means a signed-in *user*:
 * a worker token is refused there too.
 */
@Injectable()
export class PermissionsGuard implements CanActivate {
  constructor(private readonly reflector: Reflector) {}

  canActivate(context: ExecutionContext): boolean {
    const targets = [context.getHandler(), context.getClass()];
    if (this.reflector.getAllAndOverride<boolean>(IS_PUBLIC_KEY, targets) === true) return true;
    const request = context.switchToHttp().getRequest<GyreRequest>();
    const caller = callerOf(request);
    request.ability = caller.ability;
    const required = this.reflector.getAllAndOverride<RequiredPermission | undefined>(
      REQUIRED_PERMISSION_KEY,
      targets,
    );
    if (required === undefined) {
      if (
        caller.kind === 'user' &&
        this.reflector.getAllAndOverride<boolean>(SIGNED_IN_ONLY_KEY, targets) === true
      ) {
        return true;
      }
      throw new GyreException(
        ErrorKind.Forbidden,
        caller.kind === 'user' ? AuthError.RouteWithoutPermission : AuthError.Forbidden,
        caller.kind === 'user'
          ? 'This route declares no permission and is therefore closed.'
          : 'A worker token may only read job inputs and write job results.',
      );
    }
    if (!caller.ability.can(required.action, required.subject)) {
      throw new GyreException(
        ErrorKind.Forbidden,
        AuthError.Forbidden,
        `${caller.who} may not ${required.action} ${required.subject}.`,
        { action: required.action, subject: required.subject, ...caller.details },
      );
    }
    return true;
  }
}

interface CallerAbility {
  kind: 'user' | 'worker';
  ability: AppAbility;
  /** The subject of the refusal message: "An analyst", "A worker token". */
  who: string;
  details: Record<string, string>;
}

function callerOf(request: GyreRequest): CallerAbility {
  if (request.worker !== undefined) {
    return {
      kind: 'worker',
      ability: defineWorkerAbility(),
      who: 'A worker token',
      details: { principal: 'worker' },
    };
  }
  if (request.user === undefined) {
    throw new GyreException(ErrorKind.Unauthenticated, AuthError.SignInRequired, 'Sign in first.');
  }
  return {
    kind: 'user',
    ability: defineAbilityFor(request.user),
    who: capitalise(aRole(request.user.role)),
    details: { role: request.user.role },
  };
}
