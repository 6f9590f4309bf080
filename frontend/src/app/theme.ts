import type { ThemeConfig } from 'antd';
import { GYRE_COLORS } from '@gyre/shared/palette';

/** Gyre's colours live in `@gyre/shared/palette`, where the PDF reads them too. */
export { CHART_PALETTE, GYRE_COLORS } from '@gyre/shared/palette';

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
    // A switch that is off shows its white "Off" on antd's 25 % ink track (1.6:1); the muted
    // ink reads at 6.0:1 (WCAG 2.1 contrast ratio), its hover at 6.7:1.
    Switch: { colorTextQuaternary: GYRE_COLORS.inkMuted, colorTextTertiary: GYRE_COLORS.inkSoft },
  },
};
