/**
 * Gyre's own pictures for "not for you" and "not here", and two small glyphs, drawn inline in
 * its colours (hand-drawn: @ant-design/icons is not a direct dependency of the client).
 */

import { GYRE_COLORS } from '../app/theme';
import { DecorativeSvg, RoundStroke } from './decorative-svg';

export function LockedIcon({ size = 72 }: { size?: number }) {
  return (
    <DecorativeSvg size={size} box={72}>
      <circle cx="36" cy="36" r="35" fill={GYRE_COLORS.mistDeep} />
      <rect x="22" y="33" width="28" height="21" rx="4" fill={GYRE_COLORS.primary} />
      <RoundStroke d="M27 33v-6a9 9 0 0 1 18 0v6" colour={GYRE_COLORS.primary} width={4} />
      <circle cx="36" cy="42" r="3" fill={GYRE_COLORS.cream} />
      <rect x="34.6" y="43" width="2.8" height="6" rx="1.4" fill={GYRE_COLORS.cream} />
    </DecorativeSvg>
  );
}

export function LostIcon({ size = 72 }: { size?: number }) {
  return (
    <DecorativeSvg size={size} box={72}>
      <circle cx="36" cy="36" r="35" fill={GYRE_COLORS.mistDeep} />
      <RoundStroke
        d="M36 16a20 20 0 1 0 20 20 14 14 0 0 0-14-14 9 9 0 0 0-9 9 5 5 0 0 0 5 5"
        colour={GYRE_COLORS.primary}
        width={4}
      />
      <circle cx="38" cy="36" r="2.5" fill={GYRE_COLORS.amber} />
    </DecorativeSvg>
  );
}

/** Three bars: the button that opens the menu on narrow screens. */
export function MenuGlyph({ size = 18 }: { size?: number }) {
  return (
    <DecorativeSvg size={size} box={18}>
      <RoundStroke d="M2 4h14M2 9h14M2 14h14" colour="currentColor" width={1.8} />
    </DecorativeSvg>
  );
}

/** A magnifier for search buttons (they carry their own aria-label). */
export function SearchGlyph({ size = 14 }: { size?: number }) {
  return (
    <DecorativeSvg size={size} box={16}>
      <circle cx="7" cy="7" r="4.8" fill="none" stroke="currentColor" strokeWidth="1.8" />
      <RoundStroke d="M10.6 10.6 14 14" colour="currentColor" width={1.8} />
    </DecorativeSvg>
  );
}
