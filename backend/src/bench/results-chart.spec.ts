import { niceMaximum, resultsChartSvg } from './results-chart';

describe('results chart', () => {
  it('rounds the axis up to the next round step of its power of ten', () => {
    expect(niceMaximum(8.8)).toBe(10);
    expect(niceMaximum(10)).toBe(10);
    expect(niceMaximum(180)).toBe(200);
    expect(niceMaximum(31)).toBe(40);
    expect(niceMaximum(53.7)).toBe(60);
    expect(niceMaximum(331)).toBe(400);
    expect(niceMaximum(0.42)).toBe(0.5);
  });

  it('draws bar heights in proportion to the seconds, labelled with them', () => {
    const svg = resultsChartSvg(
      [
        {
          title: '64 ch × 60 min',
          gyre: { wallS: 40, cpuS: 60 },
          scipy1: { wallS: 160, cpuS: 158 },
          scipy2: { wallS: 90, cpuS: 170 },
        },
      ],
      'footer & <notes>',
    );
    const heights = [
      ...svg.matchAll(/<rect x="[\d.]+" y="[\d.]+" width="[\d.]+" height="([\d.]+)"/g),
    ]
      .map((m) => Number(m[1]))
      .filter((h) => h > 10);
    // Six bars of 40, 60, 160, 158, 90 and 170 s on one axis: heights in the same ratios.
    expect(heights).toHaveLength(6);
    const unit = heights[0] / 40;
    [40, 60, 160, 158, 90, 170].forEach((v, i) => expect(heights[i] / unit).toBeCloseTo(v, 0));
    expect(svg).toContain('>40.0<');
    expect(svg).toContain('footer &amp; &lt;notes&gt;');
  });
});
