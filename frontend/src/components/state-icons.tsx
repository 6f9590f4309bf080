/**
 * Gyre's own pictures for "not for you" and "not here", and two small glyphs, drawn inline in
 * its colours (hand-drawn: @ant-design/icons is not a direct dependency of the client).
 */

import { GYRE_COLORS } from '../app/theme';

export function LockedIcon({ size = 72 }: { size?: number }) {
  return (
    <svg width={size} height={size} viewBox="0 0 72 72" aria-hidden="true" focusable="false">
      <circle cx="36" cy="36" r="35" fill={GYRE_COLORS.mistDeep} />
      <rect x="22" y="33" width="28" height="21" rx="4" fill={GYRE_COLORS.primary} />
      <path
        d="M27 33v-6a9 9 0 0 1 18 0v6"
        fill="none"
        stroke={GYRE_COLORS.primary}
        strokeWidth="4"
        strokeLinecap="round"
      />
      <circle cx="36" cy="42" r="3" fill={GYRE_COLORS.cream} />
      <rect x="34.6" y="43" width="2.8" height="6" rx="1.4" fill={GYRE_COLORS.cream} />
    </svg>
  );
}

export function LostIcon({ size = 72 }: { size?: number }) {
  return (
    <svg width={size} height={size} viewBox="0 0 72 72" aria-hidden="true" focusable="false">
      <circle cx="36" cy="36" r="35" fill={GYRE_COLORS.mistDeep} />
      <path
        d="M36 16a20 20 0 1 0 20 20 14 14 0 0 0-14-14 9 9 0 0 0-9 9 5 5 0 0 0 5 5"
        fill="none"
        stroke={GYRE_COLORS.primary}
        strokeWidth="4"
        strokeLinecap="round"
      />
      <circle cx="38" cy="36" r="2.5" fill={GYRE_COLORS.amber} />
    </svg>
  );
}

/** Three bars: the button that opens the menu on narrow screens. */
export function MenuGlyph({ size = 18 }: { size?: number }) {
  return (
    <svg width={size} height={size} viewBox="0 0 18 18" aria-hidden="true" focusable="false">
      <path
        d="M2 4h14M2 9h14M2 14h14"
        stroke="currentColor"
        strokeWidth="1.8"
        strokeLinecap="round"
      />
    </svg>
  );
}

/** A magnifier for search buttons (they carry their own aria-label). */
export function SearchGlyph({ size = 14 }: { size?: number }) {
  return (
    <svg width={size} height={size} viewBox="0 0 16 16" aria-hidden="true" focusable="false">
      <circle cx="7" cy="7" r="4.8" fill="none" stroke="currentColor" strokeWidth="1.8" />
      <path d="M10.6 10.6 14 14" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" />
    </svg>
  );
}
