import { CHART_COLORS, GYRE_COLORS } from './palette';
import type { RoiUsageView } from './recordings';
import {
  type ScalpChannelValues,
  scalpColourOf,
  scalpMapOf,
  type ScalpMapSource,
  scalpMarkLines,
} from './scalp-map';
import { SCALP_POSITIONS_10_10 } from './scalp-positions';

function channel(label: string, values: Partial<ScalpChannelValues> = {}): ScalpChannelValues {
  return { label, canonical: null, pafHz: null, cogHz: null, deltaFHz: null, ...values };
}

const usage: RoiUsageView = {
  wanted: ['O1', 'O2', 'Pz'],
  used: ['O1'],
  leftOut: [
    { label: 'O2', reason: 'flat' },
    { label: 'Pz', reason: 'missing' },
  ],
  status: 'partial',
};

/** A resting run as Review gets it, built by hand (the computation fills pafHz/cogHz). */
const rest: ScalpMapSource = {
  channels: [
    channel('EEG O1-REF', { canonical: 'O1', pafHz: 9.8, cogHz: 9.9 }),
    channel('EEG O2-REF', { canonical: 'O2' }),
    channel('EEG T3-REF', { pafHz: 10.2, cogHz: 10.0 }),
    channel('EEG P4-REF', { canonical: 'P4' }),
    channel('EEG Cz-REF', { canonical: 'Cz', pafHz: 10.0 }),
    channel('Cz', { pafHz: 12 }),
    channel('EEG X5-REF', { pafHz: 9.0 }),
    channel('ECG'),
    channel('EEG F3-REF', { canonical: 'F3', pafHz: 10.1 }),
  ],
  roiUsage: usage,
  quality: { flatChannels: ['EEG O2-REF'], saturatedChannels: ['EEG F3-REF'] },
};

describe('scalpMapOf', () => {
  const map = scalpMapOf(rest, 'paf');
  const byName = new Map(map.channels.map((c) => [c.name, c]));

  it('places each channel at its 10-10 position, old names by the label rules (T3 → T7)', () => {
    expect(byName.get('T7')?.point).toEqual(SCALP_POSITIONS_10_10.T7);
    expect(byName.get('T7')?.valueHz).toBe(10.2);
    expect(byName.get('O1')).toMatchObject({ mark: 'value', valueHz: 9.8, omission: null });
    // The first of two labels naming one electrode counts: Cz at 10.0, not 12.
    expect(byName.get('Cz')?.valueHz).toBe(10);
    expect(map.channels.filter((c) => c.name === 'Cz')).toHaveLength(1);
  });

  it('tells left out, missing and no value apart', () => {
    expect(byName.get('O2')).toMatchObject({ mark: 'left-out', omission: 'flat' });
    expect(byName.get('F3')).toMatchObject({ mark: 'left-out', omission: 'saturated' });
    expect(byName.get('Pz')).toMatchObject({ mark: 'missing', omission: 'missing', label: 'Pz' });
    expect(byName.get('P4')).toMatchObject({ mark: 'no-value', omission: null, valueHz: null });
  });

  it('names channels with a value but no position, and drops non-EEG channels without one', () => {
    expect(map.unplaced).toEqual(['EEG X5-REF']);
    expect(map.channels.map((c) => c.label)).not.toContain('ECG');
  });

  it('colours PAF on a sequential scale over the coloured channels only (the saturated F3 is not)', () => {
    // Values 9.8, 10.2, 10.0: d3 nice ticks at 0.1 Hz (steps of 1, 2, 5 × 10^k, d3-array).
    expect(map.scale).toMatchObject({ diverging: false, domainHz: [9.8, 10.2] });
    expect(map.scale?.ticks.map((t) => t.label)).toEqual(['9.8', '9.9', '10.0', '10.1', '10.2']);
  });

  it('centres the Δf scale on 0 and labels it with the true minus and +', () => {
    const task: ScalpMapSource = {
      ...rest,
      channels: [
        channel('O1', { canonical: 'O1', deltaFHz: -0.3 }),
        channel('P4', { canonical: 'P4', deltaFHz: 0.1 }),
      ],
    };
    const scale = scalpMapOf(task, 'deltaF').scale;
    expect(scale?.diverging).toBe(true);
    expect(scale?.domainHz[0]).toBe(-(scale?.domainHz[1] ?? 0));
    expect(scale?.domainHz[1]).toBeGreaterThanOrEqual(0.3);
    const labels = scale?.ticks.map((t) => t.label) ?? [];
    expect(labels).toContain('0.0');
    expect(labels[0].startsWith('\u2212')).toBe(true); // U+2212 MINUS SIGN
    expect(labels[labels.length - 1].startsWith('+')).toBe(true);
  });

  it('has no scale when no drawn channel has a value', () => {
    expect(scalpMapOf(rest, 'deltaF').scale).toBeNull();
  });
});

describe('scalpMarkLines', () => {
  it('names the channels it could not colour, by mark, in the caller’s words', () => {
    const words = (reason: string) => `because ${reason}`;
    expect(scalpMarkLines(scalpMapOf(rest, 'paf'), words)).toEqual({
      lines: [
        { mark: 'left-out', text: 'Left out: O2 (because flat), F3 (because saturated)' },
        { mark: 'missing', text: 'Asked for, not in the file: Pz' },
        { mark: 'no-value', text: 'No value: P4' },
      ],
      unplaced: 'No 10-10 position, not drawn: EEG X5-REF',
    });
  });
});

describe('scalpColourOf', () => {
  const scale = { domainHz: [8, 12] as [number, number], diverging: false };

  it('gives the end stops at the ends and clamps beyond them', () => {
    expect(scalpColourOf(8, scale, ['#000000', '#ffffff'])).toBe('#000000');
    expect(scalpColourOf(12, scale, ['#000000', '#ffffff'])).toBe('#ffffff');
    expect(scalpColourOf(30, scale, ['#000000', '#ffffff'])).toBe('#ffffff');
    expect(scalpColourOf(-1, scale, ['#000000', '#ffffff'])).toBe('#000000');
  });

  it('interpolates linearly in RGB (closed form: halfway = mean of the channels, rounded)', () => {
    // (0x00 + 0xff) / 2 = 127.5 → 128 = 0x80; (0x20 + 0x60) / 2 = 0x40.
    expect(scalpColourOf(10, scale, ['#000020', '#ff0060'])).toBe('#800040');
    // A quarter of the way: 0xff / 4 = 63.75 → 64 = 0x40.
    expect(scalpColourOf(9, scale, ['#000000', '#ff0000'])).toBe('#400000');
  });

  it('puts the middle stop of three at the middle of the domain (0 for a symmetric Δf scale)', () => {
    const delta = { domainHz: [-0.4, 0.4] as [number, number], diverging: true };
    // Default stops of a diverging scale: blue, white, amber (shared/src/palette.ts).
    expect(scalpColourOf(0, delta)).toBe('#ffffff');
    expect(scalpColourOf(-0.4, delta)).toBe(CHART_COLORS.blue.toLowerCase());
    expect(scalpColourOf(0.4, delta)).toBe(GYRE_COLORS.amber.toLowerCase());
    expect(scalpColourOf(8, scale)).toBe(GYRE_COLORS.primary.toLowerCase());
  });
});
