import { linearScale, logScale, niceLinearDomain, niceStep, tickLabel } from './plot-scales';
import { ReportFonts } from './report-fonts';

// Axis ticks at 1, 2 or 5 × 10^k are common practice for charts; the expected values
// below are worked out by hand from that rule.
describe('plot scales', () => {
  it('picks a 1-2-5 step near span / count', () => {
    expect(niceStep(29, 6)).toBe(5); // 4.83 → 5
    expect(niceStep(0.8, 5)).toBeCloseTo(0.2, 12); // 0.16 → 0.2
    expect(niceStep(3, 6)).toBe(0.5); // 0.5 → 0.5
    expect(niceStep(1000, 4)).toBe(500); // 250 → 500
  });

  it('widens a domain to whole steps and lists its ticks', () => {
    expect(niceLinearDomain(9.68, 10.22, 5)).toEqual({
      domain: [9.6, 10.4],
      ticks: [9.6, 9.8, 10, 10.2, 10.4],
      step: 0.2,
    });
    // A single value still gets an axis: 10 ± 0.5 widened to steps of 0.2.
    expect(niceLinearDomain(10, 10, 5).domain).toEqual([9.4, 10.6]);
  });

  it('maps linearly and logarithmically onto the page', () => {
    const x = linearScale([0, 10], [100, 300], []);
    expect(x.toPt(5)).toBe(200);
    const y = logScale(0.3, 40, [500, 100]);
    expect(y.domain).toEqual([0.1, 100]);
    expect(y.toPt(1)).toBeCloseTo(500 - (400 * 1) / 3, 9); // one decade of three
    expect(y.ticks).toEqual([0.1, 1, 10, 100]);
  });

  it('writes tick labels with the typographic minus', () => {
    expect(tickLabel(-0.5)).toBe('\u22120.5');
    expect(tickLabel(0.001)).toBe('1e\u22123');
    expect(tickLabel(10)).toBe('10');
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
