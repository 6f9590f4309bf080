import { applyDecorators, Delete, Get, HttpCode, HttpStatus, Patch, Post } from '@nestjs/common';
import { ApiConflictResponse, ApiNoContentResponse, ApiNotFoundResponse } from '@nestjs/swagger';
import type { SubjectName } from '@gyre/shared';
import { RequirePermission } from '../../auth/decorators';
import { ApiResult, type SharedSchemaName } from '../../openapi/api-responses';

/*
 * The routes the study model's controllers share (studies, sites, users, participants, visits,
 * the schedule, worker tokens). Each decorator is one route: its HTTP method and path, the CASL
 * rule it needs (the action is in its name, the subject its first argument) and the answers it
 * documents, so that a controller method says only what it calls.
 */

interface RouteOptions {
  /** Below the controller's path; the default is the route's usual one ('' or ':id'). */
  path?: string;
  /** What the success body is. */
  description: string;
  /** The 404's description, for a row outside the caller's scope. */
  notFound?: string;
  /** The 409's description, for a name or state that refuses the change. */
  conflict?: string;
}

function refusals(options: Pick<RouteOptions, 'notFound' | 'conflict'>): MethodDecorator[] {
  const documented: MethodDecorator[] = [];
  if (options.notFound !== undefined) {
    documented.push(ApiNotFoundResponse({ description: options.notFound }));
  }
  if (options.conflict !== undefined) {
    documented.push(ApiConflictResponse({ description: options.conflict }));
  }
  return documented;
}

/** `GET`: the rows of `schema` in the caller's scope, a page of them unless `array`. */
export function ListRoute(
  subject: SubjectName,
  schema: SharedSchemaName,
  options: RouteOptions & { array?: boolean },
): MethodDecorator {
  const array = options.array === true;
  return applyDecorators(
    Get(options.path ?? ''),
    RequirePermission('read', subject),
    ApiResult(schema, { description: options.description, page: !array, array }),
    ...refusals(options),
  );
}

/**
 * A route that answers one row of `schema`: `method` at `defaultPath` unless the options name
 * another path, needing `action` on the subject.
 */
function rowRoute(
  method: (path: string) => MethodDecorator,
  action: 'read' | 'create' | 'update',
  defaultPath: string,
  status: HttpStatus.OK | HttpStatus.CREATED = HttpStatus.OK,
) {
  return (subject: SubjectName, schema: SharedSchemaName, options: RouteOptions): MethodDecorator =>
    applyDecorators(
      method(options.path ?? defaultPath),
      RequirePermission(action, subject),
      ApiResult(schema, { description: options.description, status }),
      ...refusals(options),
    );
}

/** `GET :id`: one row. */
export const ReadRoute = rowRoute(Get, 'read', ':id');

/** `POST`: a new row, answered 201 with it. */
export const CreateRoute = rowRoute(Post, 'create', '', HttpStatus.CREATED);

/** `PATCH :id`: the changed row. */
export const UpdateRoute = rowRoute(Patch, 'update', ':id');

/** `DELETE :id`: 204 without a body. */
export function DeleteRoute(
  subject: SubjectName,
  options: Omit<RouteOptions, 'description'>,
): MethodDecorator {
  return applyDecorators(
    Delete(options.path ?? ':id'),
    HttpCode(HttpStatus.NO_CONTENT),
    RequirePermission('delete', subject),
    ApiNoContentResponse(),
    ...refusals(options),
  );
}
