/**
 * Gyre's colours as data, for the client's theme (frontend/src/app/theme.ts builds the antd
 * tokens from them) and the visit report PDF (backend/src/report-document/report-canvas.ts).
 * A subpath of its own (`@gyre/shared/palette`) that imports nothing: the sign-in page loads
 * it with the theme and nothing else of `@gyre/shared` comes with it.
 *
 * Slate-teal primary, amber for flags and warnings (docs/architecture.md).
 */
export const GYRE_COLORS = {
  primary: '#24525A',
  amber: '#C77C02',
  /** Amber for text and tags with amber words (the brand amber reads 3:1 on its own tint). */
  amberText: '#8A5300',
  ink: '#1D2B2F',
  mist: '#F4F7F7',
  /** The deeper mist: the sign-in backdrop's far end and the round of Gyre's pictures. */
  mistDeep: '#E3ECEC',
  /** The warm light of Gyre's mark and pictures, on the primary. */
  cream: '#F3EBDD',
  /** The tint behind a raised flag. */
  amberBg: '#FDF5E6',
  paper: '#FFFFFF',
  line: '#DCE5E6',
  /** Text on a line-grey badge (≥ 4.5:1 on `line`). */
  inkOnLine: '#33474B',
  /** Secondary text: solid, so it keeps ≥ 4.5:1 on paper, mist and the info tint (WCAG 1.4.3). */
  inkSoft: '#4F5F63',
  /** Descriptions and hints (antd derives them at 45 % of the ink, about 2.7:1 on white). */
  inkMuted: '#55666A',
  /** The tint of informational notices, and their border. */
  infoBg: '#EAF2F3',
  infoBorder: '#BCD2D5',
  /** Status colours dark enough for text on their own light tint (tags) and under white (buttons). */
  success: '#2E7D32',
  successBg: '#EDF7EE',
  successBorder: '#B7DDB9',
  error: '#B3261E',
  errorBg: '#FDEDEC',
  errorBorder: '#F2B8B5',
} as const;

/** The chart colours beyond the primary and the amber, by name (the PDF's plots pick by name). */
export const CHART_COLORS = {
  sage: '#5B8C85',
  plum: '#8E5572',
  blue: '#3E6FA3',
  olive: '#9AA63B',
} as const;

/** One palette for every chart, so a series keeps its colour from screen to screen and in the PDF. */
export const CHART_PALETTE: readonly string[] = [
  GYRE_COLORS.primary,
  GYRE_COLORS.amber,
  CHART_COLORS.sage,
  CHART_COLORS.plum,
  CHART_COLORS.blue,
  CHART_COLORS.olive,
];
