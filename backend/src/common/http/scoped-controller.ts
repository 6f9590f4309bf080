import { applyDecorators } from '@nestjs/common';
import { ApiBearerAuth, ApiForbiddenResponse, ApiTags } from '@nestjs/swagger';

/** A controller whose routes need a signed-in caller, and a role the rules allow. */
export function ScopedController(
  tag: string,
  forbidden = 'The role may never do this',
): ClassDecorator {
  return applyDecorators(
    ApiTags(tag),
    ApiBearerAuth(),
    ApiForbiddenResponse({ description: forbidden }),
  );
}
