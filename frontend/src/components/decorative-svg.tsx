import type { ReactNode } from 'react';

/**
 * A square picture drawn inline, `box` units a side, shown `size` px wide. Decorative: hidden
 * from screen readers and never focused (its button or heading carries the words).
 */
export function DecorativeSvg({
  size,
  box,
  children,
}: {
  size: number;
  box: number;
  children: ReactNode;
}) {
  return (
    <svg
      width={size}
      height={size}
      viewBox={`0 0 ${box} ${box}`}
      aria-hidden="true"
      focusable="false"
    >
      {children}
    </svg>
  );
}

/** An unfilled line with round ends. */
export function RoundStroke({ d, colour, width }: { d: string; colour: string; width: number }) {
  return <path d={d} fill="none" stroke={colour} strokeWidth={width} strokeLinecap="round" />;
}
