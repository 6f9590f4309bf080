import type { ValidationError } from 'class-validator';
import type { ValidationProblem } from '@gyre/shared';
import { HttpEdgeError, httpEdgeError } from '../http/http-edge.errors';
import type { GyreException } from './gyre.exception';

/**
 * Every failed constraint of class-validator's error tree as `{ field, reason }`; nested
 * fields get their path (`items.0.name`) and the reason carries it in front, as Nest's own
 * ValidationPipe message does, so `message` reads as before.
 */
export function validationProblems(
  errors: readonly ValidationError[],
  parentPath = '',
): ValidationProblem[] {
  return errors.flatMap((error) => {
    const field = parentPath === '' ? error.property : `${parentPath}.${error.property}`;
    const prefix = parentPath === '' ? '' : `${parentPath}.`;
    const own = Object.values(error.constraints ?? {}).map((reason) => ({
      field,
      reason: `${prefix}${reason}`,
    }));
    return [...own, ...validationProblems(error.children ?? [], field)];
  });
}

/** The one answer to a request that failed validation: 400 `VALIDATION_FAILED`. */
export function validationFailed(problems: readonly ValidationProblem[]): GyreException {
  return httpEdgeError(
    HttpEdgeError.ValidationFailed,
    problems.map((problem) => problem.reason).join('; '),
    { problems },
  );
}

/** ValidationPipe's exceptionFactory (app.factory.ts). */
export function validationExceptionFactory(errors: ValidationError[]): GyreException {
  return validationFailed(validationProblems(errors));
}
