/** How a legend key draws its line: a series, a dashed marker or trend, or the faint background lines. */
export type LegendStroke = 'solid' | 'dashed' | 'faint';

const BORDER: Record<LegendStroke, (colour: string) => string> = {
  solid: (colour) => `3px solid ${colour}`,
  dashed: (colour) => `2px dashed ${colour}`,
  faint: (colour) => `1px solid ${colour}`,
};

/**
 * One key of a chart's legend written above it: a short line in the series' colour, then its
 * words. Long keys wrap inside the container instead of pushing past it on a narrow screen.
 */
export function LegendKey({
  colour,
  text,
  stroke = 'solid',
}: {
  colour: string;
  text: string;
  stroke?: LegendStroke;
}) {
  return (
    <span className="gyre-legend-key">
      <span
        aria-hidden="true"
        className="gyre-legend-swatch"
        style={{ borderTop: BORDER[stroke](colour), opacity: stroke === 'faint' ? 0.4 : 1 }}
      />
      {text}
    </span>
  );
}
