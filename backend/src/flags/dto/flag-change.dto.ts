import type { FlagChange } from '@gyre/shared';
import { WrittenReasonText } from '../../common/dto/text-fields';

/** Raising or clearing a flag always takes a written reason of at least 10 characters. */
export class FlagChangeDto implements FlagChange {
  @WrittenReasonText({ example: 'Δf −0.4 Hz with CI excluding 0, consistent across channels' })
  reason: string;
}
