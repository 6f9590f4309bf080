import type { ThemeConfig } from 'antd';

/** Gyre's look (docs/architecture.md): slate-teal primary, amber for flags and warnings. */
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

/** One palette for every chart, so a series keeps its colour from screen to screen. */
export const CHART_PALETTE = ['#24525A', '#C77C02', '#5B8C85', '#8E5572', '#3E6FA3', '#9AA63B'];

export const gyreTheme: ThemeConfig = {
  token: {
    colorPrimary: GYRE_COLORS.primary,
    colorInfo: GYRE_COLORS.primary,
    // antd derives a mid grey from the dark primary for info notices; a light teal tint reads.
    colorInfoBg: GYRE_COLORS.infoBg,
    colorInfoBorder: GYRE_COLORS.infoBorder,
    colorWarning: GYRE_COLORS.amber,
    // antd's default green and red read at 2.2:1 and 3:1 in tags; its derived tints of a dark
    // seed turn grey, so the tints are set too.
    colorSuccess: GYRE_COLORS.success,
    colorSuccessBg: GYRE_COLORS.successBg,
    colorSuccessBorder: GYRE_COLORS.successBorder,
    colorError: GYRE_COLORS.error,
    colorErrorBg: GYRE_COLORS.errorBg,
    colorErrorBorder: GYRE_COLORS.errorBorder,
    colorTextBase: GYRE_COLORS.ink,
    colorTextSecondary: GYRE_COLORS.inkSoft,
    colorTextTertiary: GYRE_COLORS.inkMuted,
    colorTextDescription: GYRE_COLORS.inkMuted,
    // Placeholders are the only hint some empty fields give (antd: 25 % of the ink, 1.6:1).
    colorTextPlaceholder: GYRE_COLORS.inkMuted,
    colorBgLayout: GYRE_COLORS.mist,
    colorBorderSecondary: GYRE_COLORS.line,
    fontFamily: "'IBM Plex Sans', system-ui, sans-serif",
    fontFamilyCode: "'IBM Plex Mono', ui-monospace, monospace",
    fontSize: 14,
    borderRadius: 6,
    wireframe: false,
  },
  components: {
    Layout: { headerBg: GYRE_COLORS.paper, headerHeight: 60, headerPadding: '0 32px' },
    Menu: { itemBg: 'transparent', horizontalItemSelectedColor: GYRE_COLORS.primary },
    Table: { headerBg: GYRE_COLORS.mist },
  },
};
