/** Gyre's mark: an inward spiral, drawn inline so it needs no request. */

import { GYRE_COLORS } from '../app/theme';
import { DecorativeSvg, RoundStroke } from './decorative-svg';

export function GyreMark({ size = 28 }: { size?: number }) {
  return (
    <DecorativeSvg size={size} box={32}>
      <rect width="32" height="32" rx="7" fill={GYRE_COLORS.primary} />
      <RoundStroke
        d="M16 6a10 10 0 1 0 10 10 7 7 0 0 0-7-7 4.5 4.5 0 0 0-4.5 4.5A2.5 2.5 0 0 0 17 16"
        colour={GYRE_COLORS.cream}
        width={2.4}
      />
    </DecorativeSvg>
  );
}
