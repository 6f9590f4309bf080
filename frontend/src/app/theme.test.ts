import { theme } from 'antd';
import { FastColor } from '@ant-design/fast-color';
import axe from 'axe-core';
import { describe, expect, it } from 'vitest';
import { GYRE_COLORS, gyreTheme } from './theme';

interface AxeColor {
  parseString: (value: string) => AxeColor;
}
interface AxeColorCommons {
  Color: new () => AxeColor;
  getContrast: (background: AxeColor, foreground: AxeColor) => number;
}

/** axe-core's own contrast computation (WCAG 2.1 "contrast ratio", alpha blended onto the background). */
const axeColor = (axe as unknown as { commons: { color: AxeColorCommons } }).commons.color;
function contrast(foreground: string, background: string): number {
  const fg = new axeColor.Color().parseString(foreground);
  const bg = new axeColor.Color().parseString(background);
  return axeColor.getContrast(bg, fg);
}

/** The tint antd gives a tag of a custom colour (tag/hooks/useColor.js: HSL lightness 0.95). */
function tintOf(color: string): string {
  const hsl = new FastColor(color).toHsl();
  return new FastColor({ ...hsl, l: 0.95 }).toHexString();
}

describe("the theme's text colours", () => {
  it('measures contrast as WCAG does', () => {
    // WCAG 2.1 definitions: black on white is 21:1; #767676 on white is the familiar 4.54:1.
    expect(contrast('#000000', '#FFFFFF')).toBeCloseTo(21, 5);
    expect(contrast('#767676', '#FFFFFF')).toBeCloseTo(4.54, 2);
  });

  it('keeps body, secondary and description text at ≥ 4.5:1 on every surface (WCAG 1.4.3 AA)', () => {
    // The tokens antd derives from Gyre's seed, as its components use them.
    const token = theme.getDesignToken(gyreTheme);
    const surfaces = {
      paper: token.colorBgContainer,
      layout: token.colorBgLayout,
      'info notice': token.colorInfoBg,
      'table header': GYRE_COLORS.mist,
      'sign-in backdrop': '#E3ECEC',
    };
    const texts = {
      body: token.colorText,
      heading: token.colorTextHeading,
      secondary: token.colorTextSecondary,
      description: token.colorTextDescription,
      tertiary: token.colorTextTertiary,
      link: token.colorLink,
      primary: token.colorPrimary,
    };
    const below: string[] = [];
    for (const [textName, text] of Object.entries(texts)) {
      for (const [surfaceName, surface] of Object.entries(surfaces)) {
        const ratio = contrast(text, surface);
        if (ratio < 4.5) below.push(`${textName} on ${surfaceName}: ${ratio.toFixed(2)}:1`);
      }
    }
    expect(below).toEqual([]);
    // Status tags write their colour on its own tint; danger buttons write white on it.
    const pairs: [string, string, string][] = [
      ['success tag', token.colorSuccess, token.colorSuccessBg],
      ['error tag', token.colorError, token.colorErrorBg],
      ['info tag', token.colorInfo, token.colorInfoBg],
      ['danger text', token.colorError, token.colorBgContainer],
      ['danger button', token.colorTextLightSolid, token.colorError],
      ['primary button', token.colorTextLightSolid, token.colorPrimary],
      ['placeholder', token.colorTextPlaceholder, token.colorBgContainer],
      // antd draws a tag of a custom colour in that colour on its tint of 95 % lightness.
      ['amber tag', GYRE_COLORS.amberText, tintOf(GYRE_COLORS.amberText)],
      ['primary tag', GYRE_COLORS.primary, tintOf(GYRE_COLORS.primary)],
    ];
    expect(
      pairs
        .map(([name, fg, bg]) => [name, contrast(fg, bg)] as const)
        .filter(([, ratio]) => ratio < 4.5),
    ).toEqual([]);
    // antd's default description grey (45 % of the ink) would fail on white: the override matters.
    expect(contrast('rgba(29, 43, 47, 0.45)', '#FFFFFF')).toBeLessThan(4.5);
  });
});
