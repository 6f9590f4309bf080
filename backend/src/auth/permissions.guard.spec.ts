import type { ExecutionContext } from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import {
  ACTIONS,
  defineAbilityFor,
  defineWorkerAbility,
  ROLES,
  SUBJECTS,
  type AbilityUser,
  type Role,
} from '@gyre/shared';
import { GyreException } from '../common/errors/gyre.exception';
import type { GyreRequest } from './auth-user';
import { RequirePermission, SignedInOnly } from './decorators';
import { PermissionsGuard } from './permissions.guard';

/*
 * The expectations are the scale-out issue's words: "a worker token can only read job inputs
 * and write job results, nothing else", and users never gain those subjects. The handlers
 * below only carry route metadata for the guard; no application registers them.
 */
class Handlers {
  @RequirePermission('read', 'JobInput')
  readJobInput(): void {}

  @RequirePermission('create', 'JobResult')
  postJobResult(): void {}

  @RequirePermission('read', 'Participant')
  readParticipants(): void {}

  @SignedInOnly()
  me(): void {}

  undeclared(): void {}
}

const WORKER_SUBJECTS = ['JobInput', 'JobResult'] as const;

function contextFor(handler: keyof Handlers, request: Partial<GyreRequest>): ExecutionContext {
  return {
    getHandler: () => Handlers.prototype[handler],
    getClass: () => Handlers,
    switchToHttp: () => ({ getRequest: () => request }),
  } as unknown as ExecutionContext;
}

function statusOf(run: () => unknown): number {
  try {
    run();
    return 200;
  } catch (error) {
    if (!(error instanceof GyreException)) throw error;
    return error.kind === 'forbidden' ? 403 : error.kind === 'unauthenticated' ? 401 : 500;
  }
}

const guard = new PermissionsGuard(new Reflector());
const worker = (): Partial<GyreRequest> => ({ worker: { tokenId: 't1', name: 'node 1' } });

function userOf(role: Role): AbilityUser {
  const studyId = role === 'admin' ? null : 'S1';
  const siteId = role === 'technician' || role === 'coordinator' ? 'A' : null;
  return { id: `u-${role}`, role, studyId, siteId };
}

describe('the worker ability', () => {
  it('reads job inputs and creates job results, and nothing else of any subject', () => {
    const ability = defineWorkerAbility();
    const allowed = ACTIONS.flatMap((action) =>
      SUBJECTS.filter((subject) => ability.can(action, subject)).map((s) => `${action} ${s}`),
    );
    expect(allowed).toEqual(['read JobInput', 'create JobResult']);
  });

  it.each(ROLES)('gives no %s any right on job inputs or results', (role) => {
    const ability = defineAbilityFor(userOf(role));
    const granted = ACTIONS.flatMap((action) =>
      WORKER_SUBJECTS.filter((subject) => ability.can(action, subject)).map(
        (s) => `${action} ${s}`,
      ),
    );
    expect(granted).toEqual([]);
  });
});

describe('PermissionsGuard with a worker token', () => {
  it('lets a worker through to the job input and job result routes, with its ability attached', () => {
    for (const handler of ['readJobInput', 'postJobResult'] as const) {
      const request = worker();
      expect(statusOf(() => guard.canActivate(contextFor(handler, request)))).toBe(200);
      expect(request.ability?.can('read', 'Participant')).toBe(false);
    }
  });

  it('refuses a worker everywhere else: user subjects, signed-in-only and undeclared routes', () => {
    for (const handler of ['readParticipants', 'me', 'undeclared'] as const) {
      expect([handler, statusOf(() => guard.canActivate(contextFor(handler, worker())))]).toEqual([
        handler,
        403,
      ]);
    }
  });

  it.each(ROLES)('refuses a signed-in %s on the worker routes', (role) => {
    for (const handler of ['readJobInput', 'postJobResult'] as const) {
      const request = { user: { ...userOf(role), email: 'x@example.org', name: 'X' } };
      expect(statusOf(() => guard.canActivate(contextFor(handler, request)))).toBe(403);
    }
  });

  it('asks for sign-in when there is neither a user nor a worker', () => {
    expect(statusOf(() => guard.canActivate(contextFor('readJobInput', {})))).toBe(401);
  });
});
