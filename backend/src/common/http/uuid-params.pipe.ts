import { ArgumentMetadata, Injectable, PipeTransform } from '@nestjs/common';
import { isUUID } from 'class-validator';
import { validationFailed } from '../errors/validation-problems';

/** Route parameters that hold a row id: `id` and every name ending in `Id` (visitId, …). */
export function isIdParam(name: string | undefined): name is string {
  return name !== undefined && (name === 'id' || name.endsWith('Id'));
}

/**
 * Registered globally (app.factory.ts): a malformed id in any id route parameter is a 400
 * naming the parameter, before any controller or service looks for a row (which would answer
 * 404 for what is a bad request). The check is class-validator's isUUID, as ParseUUIDPipe's.
 */
@Injectable()
export class UuidParamsPipe implements PipeTransform<unknown> {
  transform(value: unknown, metadata: ArgumentMetadata): unknown {
    if (metadata.type !== 'param' || !isIdParam(metadata.data)) return value;
    if (typeof value === 'string' && isUUID(value)) return value;
    const field = metadata.data;
    throw validationFailed([
      { field, reason: `${field}: expected a UUID, found ${JSON.stringify(value)}` },
    ]);
  }
}
