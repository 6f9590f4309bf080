import { CanActivate, ExecutionContext, Injectable } from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import { defineAbilityFor } from '@gyre/shared';
import { IS_PUBLIC_KEY } from '../common/decorators/public.decorator';
import { ErrorKind, GyreException } from '../common/errors/gyre.exception';
import { AuthError } from './auth.errors';
import { GyreRequest } from './auth-user';
import { REQUIRED_PERMISSION_KEY, RequiredPermission, SIGNED_IN_ONLY_KEY } from './decorators';
import { aRole, capitalise } from './role-wording';

/**
 * Runs after the sign-in guard: builds the user's CASL ability and checks the route's
 * `@RequirePermission` at type level (403). A route that declares neither a permission,
 * `@SignedInOnly()` nor `@Public()` is refused, so that no route is open by omission.
 */
@Injectable()
export class PermissionsGuard implements CanActivate {
  constructor(private readonly reflector: Reflector) {}

  canActivate(context: ExecutionContext): boolean {
    const targets = [context.getHandler(), context.getClass()];
    if (this.reflector.getAllAndOverride<boolean>(IS_PUBLIC_KEY, targets) === true) return true;
    const request = context.switchToHttp().getRequest<GyreRequest>();
    if (request.user === undefined) {
      throw new GyreException(
        ErrorKind.Unauthenticated,
        AuthError.SignInRequired,
        'Sign in first.',
      );
    }
    const ability = defineAbilityFor(request.user);
    request.ability = ability;
    const required = this.reflector.getAllAndOverride<RequiredPermission | undefined>(
      REQUIRED_PERMISSION_KEY,
      targets,
    );
    if (required === undefined) {
      if (this.reflector.getAllAndOverride<boolean>(SIGNED_IN_ONLY_KEY, targets) === true) {
        return true;
      }
      throw new GyreException(
        ErrorKind.Forbidden,
        AuthError.RouteWithoutPermission,
        'This route declares no permission and is therefore closed.',
      );
    }
    if (!ability.can(required.action, required.subject)) {
      throw new GyreException(
        ErrorKind.Forbidden,
        AuthError.Forbidden,
        `${capitalise(aRole(request.user.role))} may not ${required.action} ${required.subject}.`,
        { action: required.action, subject: required.subject, role: request.user.role },
      );
    }
    return true;
  }
}
