import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { linearScale, logScale, niceLinearScale } from './plot-scales';
import { ReportFonts } from './report-fonts';

const M = '\u2212';

// Ticks come from shared/src/chart-ticks.ts (d3's 1-2-5 nice numbers); the expected values
// below are hand-counted from that rule.
describe('plot scales', () => {
  it('gives the onset curve a time axis from −1.0 to +2.0 s, −1.0 labelled (hand-counted)', () => {
    const x = niceLinearScale(-1, 2, [100, 400], { count: 6, minDecimals: 1, signed: true });
    expect(x.domain).toEqual([-1, 2]);
    expect(x.ticks.map((t) => t.label)).toEqual([
      `${M}1.0`,
      `${M}0.5`,
      '0.0',
      '+0.5',
      '+1.0',
      '+1.5',
      '+2.0',
    ]);
    expect(x.toPt(-1)).toBe(100);
    expect(x.toPt(2)).toBe(400);
  });

  it('never repeats a frequency label (issue 15: 10.1, 10.0, 9.9, 9.9, 9.8)', () => {
    const y = niceLinearScale(9.8, 10.1, [500, 100], { count: 5 });
    const labels = y.ticks.map((t) => t.label);
    expect(new Set(labels).size).toBe(labels.length);
    expect(labels).toEqual(['9.80', '9.85', '9.90', '9.95', '10.00', '10.05', '10.10']);
  });

  it('maps linearly and logarithmically onto the page', () => {
    const x = linearScale([0, 10], [100, 300], []);
    expect(x.toPt(5)).toBe(200);
    const y = logScale(0.3, 40, [500, 100]);
    expect(y.domain).toEqual([0.1, 100]);
    expect(y.toPt(1)).toBeCloseTo(500 - (400 * 1) / 3, 9); // one decade of three
    // Three decades, 7 ticks at most: decades only, in plain decimals.
    expect(y.ticks.map((t) => t.label)).toEqual(['0.1', '1', '10', '100']);
  });
});

/** The part of fontkit (pdfkit's font engine, shipped without types) this check uses. */
interface FontkitFont {
  hasGlyphForCodePoint(codePoint: number): boolean;
}
const fontkit = jest.requireActual<{ create(bytes: Buffer): FontkitFont }>('fontkit');

describe('report fonts and the number format', () => {
  // Glyph coverage read from the shipped files with fontkit (the library pdfkit embeds with).
  const fontsDir = join(__dirname, '..', '..', '..', 'fonts');
  for (const weight of [400, 500, 600]) {
    it(`IBM Plex Sans Latin ${weight} has the minus sign U+2212 and the no-break space U+00A0`, () => {
      const font = fontkit.create(
        readFileSync(join(fontsDir, `ibm-plex-sans-latin-${weight}-normal.woff`)),
      );
      expect(font.hasGlyphForCodePoint(0x2212)).toBe(true);
      expect(font.hasGlyphForCodePoint(0x00a0)).toBe(true);
    });
  }

  it('sets the minus sign and the unit space in the Latin subset, not the fallback box', () => {
    const fonts = ReportFonts.load();
    expect(fonts.runs(`${M}0.50\u00A0Hz`, 'regular')).toEqual([
      { fontName: 'ibm-plex-sans-latin-400', text: `${M}0.50\u00A0Hz` },
    ]);
  });
});

describe('report font runs', () => {
  const fonts = ReportFonts.load();

  it('sets each character in a subset that covers it', () => {
    // Ranges: @fontsource/ibm-plex-sans 5.3.0 unicode-range (Latin, Latin Extended, Greek).
    expect(fonts.runs('Δf = −0.3 Hz, Łódź', 'regular')).toEqual([
      { fontName: 'ibm-plex-sans-greek-400', text: 'Δ' },
      { fontName: 'ibm-plex-sans-latin-400', text: 'f = −0.3 Hz, ' },
      { fontName: 'ibm-plex-sans-latin-ext-400', text: 'Ł' },
      { fontName: 'ibm-plex-sans-latin-400', text: 'ód' },
      { fontName: 'ibm-plex-sans-latin-ext-400', text: 'ź' },
    ]);
  });

  it('keeps spaces out of the Mono file, whose blank glyphs break pdfkit', () => {
    expect(fonts.runs('ab cd', 'mono').map((r) => r.fontName)).toEqual([
      'ibm-plex-mono-latin-400',
      'ibm-plex-sans-latin-400',
      'ibm-plex-mono-latin-400',
    ]);
  });

  it('names the missing file when a font is not there', () => {
    expect(() => ReportFonts.load('/nonexistent-fonts')).toThrow(
      /Report font missing: expected \/nonexistent-fonts\/ibm-plex-sans-latin-400-normal\.woff/,
    );
  });
});
