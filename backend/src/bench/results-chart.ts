// Hand-written SVG: a few dozen rectangles and labels need no charting package, and the chart is written from Node without a browser.
/**
 * bench/results.svg from the figures of one `npm run bench`: one panel per recording length,
 * in each the wall and CPU seconds of Gyre (upload to result), scipy in one process and scipy
 * in two processes, every bar labelled with its value.
 */

export interface ChartBar {
  wallS: number;
  cpuS: number;
}

export interface ChartCase {
  title: string;
  gyre: ChartBar;
  scipy1: ChartBar;
  scipy2: ChartBar;
}

const WIDTH = 820;
const PANEL_HEIGHT = 260;
const TOP = 92;
const BOTTOM = 64;
const LEFT = 48;
const GAP = 40;
const COLOURS = {
  gyre: { wall: '#0f6e6a', cpu: '#7cc7c0' },
  scipy: { wall: '#4b5563', cpu: '#c2c8d0' },
  text: '#1f2933',
  grid: '#e4e7eb',
};

function escapeXml(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}

/** Round axis maxima per power of ten, fine enough that no panel is mostly empty. */
const AXIS_STEPS = [1, 1.2, 1.5, 2, 2.5, 3, 4, 5, 6, 8, 10];

/** The least round axis maximum (see `AXIS_STEPS`) at or above `value`. */
export function niceMaximum(value: number): number {
  if (!(value > 0)) return 1;
  const power = 10 ** Math.floor(Math.log10(value));
  for (const step of AXIS_STEPS) if (step * power >= value) return step * power;
  return 10 * power;
}

function text(
  x: number,
  y: number,
  content: string,
  options: { size?: number; anchor?: 'start' | 'middle' | 'end'; weight?: number } = {},
): string {
  return `<text x="${x.toFixed(1)}" y="${y.toFixed(1)}" font-size="${options.size ?? 12}" text-anchor="${options.anchor ?? 'middle'}"${options.weight ? ` font-weight="${options.weight}"` : ''} fill="${COLOURS.text}">${escapeXml(content)}</text>`;
}

function panel(c: ChartCase, x0: number, width: number): string[] {
  const parts: string[] = [];
  // A little headroom so that the tallest bar's label stays below the panel's title.
  const yMax = niceMaximum(
    1.08 * Math.max(...[c.gyre, c.scipy1, c.scipy2].flatMap((b) => [b.wallS, b.cpuS])),
  );
  const y = (v: number): number => TOP + PANEL_HEIGHT - (v / yMax) * PANEL_HEIGHT;
  parts.push(text(x0 + width / 2, TOP - 18, c.title, { size: 13, weight: 600 }));
  for (let i = 0; i <= 4; i++) {
    const v = (yMax * i) / 4;
    parts.push(
      `<line x1="${x0}" x2="${x0 + width}" y1="${y(v).toFixed(1)}" y2="${y(v).toFixed(1)}" stroke="${COLOURS.grid}"/>`,
      text(x0 - 6, y(v) + 4, `${Number(v.toPrecision(3))}`, { size: 11, anchor: 'end' }),
    );
  }
  const groups: [string, ChartBar, 'gyre' | 'scipy'][] = [
    ['Gyre', c.gyre, 'gyre'],
    ['scipy, 1 process', c.scipy1, 'scipy'],
    ['scipy, 2 processes', c.scipy2, 'scipy'],
  ];
  const groupWidth = width / groups.length;
  const barWidth = Math.min(40, groupWidth / 3);
  groups.forEach(([label, bar, side], g) => {
    const centre = x0 + groupWidth * (g + 0.5);
    (['wall', 'cpu'] as const).forEach((metric, k) => {
      const value = metric === 'wall' ? bar.wallS : bar.cpuS;
      const left = centre - barWidth + k * barWidth + 1;
      parts.push(
        `<rect x="${left.toFixed(1)}" y="${y(value).toFixed(1)}" width="${(barWidth - 2).toFixed(1)}" height="${(TOP + PANEL_HEIGHT - y(value)).toFixed(1)}" fill="${COLOURS[side][metric]}"/>`,
        text(left + barWidth / 2 - 1, y(value) - 4, value.toFixed(1), { size: 11 }),
      );
    });
    parts.push(text(centre, TOP + PANEL_HEIGHT + 18, label, { size: 12 }));
  });
  parts.push(
    `<line x1="${x0}" x2="${x0 + width}" y1="${TOP + PANEL_HEIGHT}" y2="${TOP + PANEL_HEIGHT}" stroke="${COLOURS.text}"/>`,
  );
  return parts;
}

/** The chart as an SVG document; `footer` names the machine, load and date. */
export function resultsChartSvg(cases: readonly ChartCase[], footer: string): string {
  const height = TOP + PANEL_HEIGHT + BOTTOM;
  const panelWidth = (WIDTH - LEFT - 16 - GAP * (cases.length - 1)) / Math.max(1, cases.length);
  const parts = [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${WIDTH}" height="${height}" viewBox="0 0 ${WIDTH} ${height}" font-family="IBM Plex Sans, Helvetica, Arial, sans-serif">`,
    `<rect width="${WIDTH}" height="${height}" fill="#ffffff"/>`,
    text(
      LEFT - 40,
      20,
      'npm run bench: seconds from upload to result (Gyre) and for the same computation (scipy)',
      {
        size: 13,
        anchor: 'start',
        weight: 600,
      },
    ),
  ];
  const legend: [string, string][] = [
    ['Gyre wall', COLOURS.gyre.wall],
    ['Gyre CPU (server, all threads)', COLOURS.gyre.cpu],
    ['scipy wall', COLOURS.scipy.wall],
    ['scipy CPU', COLOURS.scipy.cpu],
  ];
  let lx = LEFT - 40;
  for (const [label, colour] of legend) {
    parts.push(
      `<rect x="${lx}" y="34" width="10" height="10" fill="${colour}"/>`,
      text(lx + 14, 43, label, { size: 11, anchor: 'start' }),
    );
    // About 6.5 px per character at 11 px, plus the swatch and a gap.
    lx += 36 + label.length * 6.5;
  }
  cases.forEach((c, i) => parts.push(...panel(c, LEFT + i * (panelWidth + GAP), panelWidth)));
  parts.push(text(LEFT - 40, height - 12, footer, { size: 10, anchor: 'start' }), '</svg>');
  return `${parts.join('\n')}\n`;
}
