import type { ThemeConfig } from 'antd';

/** Gyre's look (docs/architecture.md): slate-teal primary, amber for flags and warnings. */
export const GYRE_COLORS = {
  primary: '#24525A',
  amber: '#C77C02',
  ink: '#1D2B2F',
  mist: '#F4F7F7',
  paper: '#FFFFFF',
  line: '#DCE5E6',
} as const;

/** One palette for every chart, so a series keeps its colour from screen to screen. */
export const CHART_PALETTE = ['#24525A', '#C77C02', '#5B8C85', '#8E5572', '#3E6FA3', '#9AA63B'];

export const gyreTheme: ThemeConfig = {
  token: {
    colorPrimary: GYRE_COLORS.primary,
    colorInfo: GYRE_COLORS.primary,
    // antd derives a mid grey from the dark primary for info notices; a light teal tint reads.
    colorInfoBg: '#EAF2F3',
    colorInfoBorder: '#BCD2D5',
    colorWarning: GYRE_COLORS.amber,
    colorTextBase: GYRE_COLORS.ink,
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
