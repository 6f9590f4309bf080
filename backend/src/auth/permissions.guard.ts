import { CanActivate, ExecutionContext, Injectable } from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import {
  defineAbilityFor,
  defineWorkerAbility,
  type AbilityUser,
  type AppAbility,
} from '@gyre/shared';
import { IS_PUBLIC_KEY } from '../common/decorators/public.decorator';
import { AuthError, authError } from './auth.errors';
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
      throw authError(
        caller.kind === 'user' ? AuthError.RouteWithoutPermission : AuthError.Forbidden,
        caller.kind === 'user'
          ? 'This route declares no permission and is therefore closed.'
          : 'A worker token may only read job inputs and write job results.',
      );
    }
    if (!caller.ability.can(required.action, required.subject)) {
      throw authError(
        AuthError.Forbidden,
        `${caller.who} may not ${required.action} ${required.subject}.`,
        { action: required.action, subject: required.subject, ...caller.details },
      );
    }
    return true;
  }
}

/** Distinct users whose abilities are kept; past it, the oldest goes. */
const KEPT_ABILITIES = 1000;
const abilities = new Map<string, AppAbility>();
const WORKER_ABILITY = defineWorkerAbility();

/**
 * The CASL ability of a user, built once per distinct (id, role, study, site): the rules
 * depend on nothing else (`AbilityUser`), so a kept ability can never be out of date; a user
 * whose role or site changes has another key (and a new sign-in). Nothing mutates abilities.
 */
export function abilityOf(user: AbilityUser): AppAbility {
  const key = `${user.id}\n${user.role}\n${user.studyId ?? ''}\n${user.siteId ?? ''}`;
  let ability = abilities.get(key);
  if (ability === undefined) {
    ability = defineAbilityFor({
      id: user.id,
      role: user.role,
      studyId: user.studyId,
      siteId: user.siteId,
    });
    if (abilities.size >= KEPT_ABILITIES) abilities.delete(abilities.keys().next().value as string);
    abilities.set(key, ability);
  }
  return ability;
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
      ability: WORKER_ABILITY,
      who: 'A worker token',
      details: { principal: 'worker' },
    };
  }
  if (request.user === undefined) {
    throw authError(AuthError.SignInRequired, 'Sign in first.');
  }
  return {
    kind: 'user',
    ability: abilityOf(request.user),
    who: capitalise(aRole(request.user.role)),
    details: { role: request.user.role },
  };
}
