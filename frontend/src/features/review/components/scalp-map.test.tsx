import type { ChannelStatsView, RecordingResultsView } from '@gyre/shared';
import { SCALP_POSITIONS_10_10, scalpColourOf } from '@gyre/shared';
import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { GYRE_COLORS } from '../../../app/theme';
import { PARTIAL_ROI, REST_RESULTS, TASK_RESULTS } from '../testing/review-fixtures';
import { ScalpMapPanel } from './scalp-map';

function restChannel(label: string, pafHz: number | null, cogHz: number | null): ChannelStatsView {
  return { ...TASK_RESULTS.channels[0], label, canonical: null, pafHz, cogHz, deltaFHz: null };
}

/** A resting run by hand (the computation fills each channel's PAF/CoG; until then they are null). */
const REST: RecordingResultsView = {
  ...REST_RESULTS,
  run: { ...REST_RESULTS.run, roiUsage: PARTIAL_ROI },
  channels: [
    restChannel('EEG O1-REF', 9.8, 9.9),
    restChannel('EEG O2-REF', null, null),
    restChannel('EEG T3-REF', 10.2, 10.05),
    restChannel('EEG Fz-REF', null, null),
    restChannel('EEG Pz-REF', 10.0, 10.0),
  ],
  quality: { ...REST_RESULTS.quality, flatChannels: ['EEG O2-REF'] },
};

const TASK: RecordingResultsView = {
  ...TASK_RESULTS,
  run: {
    ...TASK_RESULTS.run,
    roiUsage: {
      ...PARTIAL_ROI,
      wanted: ['O1', 'O2', 'Pz', 'POz'],
      leftOut: [...PARTIAL_ROI.leftOut, { label: 'POz', reason: 'missing' }],
    },
  },
};

const dotOf = (name: string) => {
  const dot = document.querySelector(`[data-channel="${name}"]`);
  if (dot === null) throw new Error(`no dot for ${name}`);
  return dot;
};

/** Disc position (ring radius 1) back from the dot's SVG translate (100 units per 1, y down). */
const positionOf = (name: string) => {
  const m = /translate\((\S+) (\S+)\)/.exec(dotOf(name).getAttribute('transform') ?? '');
  return [Number(m?.[1]) / 100, 0 - Number(m?.[2]) / 100];
};

describe('ScalpMapPanel', () => {
  it('draws each channel at its 10-10 position, the old T3 at T7 (shared/src/scalp-positions.ts)', () => {
    render(<ScalpMapPanel rest={REST} task={undefined} />);
    expect(positionOf('O1')).toEqual([...SCALP_POSITIONS_10_10.O1]);
    expect(positionOf('T7')).toEqual([-1, 0]);
    expect(positionOf('Pz')).toEqual([0, -0.5]);
  });

  it('is one labelled image with every value in a table', () => {
    render(<ScalpMapPanel rest={REST} task={undefined} />);
    const image = screen.getByRole('img', { name: /Scalp map of Peak alpha frequency/ });
    expect(image).toHaveAttribute('tabindex', '0');
    const table = screen.getByRole('table', { name: /Peak alpha frequency \(PAF\) per channel/ });
    const row = within(table).getByRole('row', { name: /^O1 / });
    // number-format: 2 decimals, a no-break space before the unit.
    expect(row.textContent).toContain('9.80\u00a0Hz');
    expect(within(table).getByRole('row', { name: /^O2 / })).toHaveTextContent('left out: flat');
    expect(within(table).getByRole('row', { name: /^Fz / })).toHaveTextContent('no value');
  });

  it('colours values on the scale, greys a channel without one and crosses a left-out one', () => {
    render(<ScalpMapPanel rest={REST} task={undefined} />);
    const o1 = dotOf('O1').querySelector('circle');
    // The scale's domain is d3's nice extent of 9.8–10.2 Hz: O1 (9.8) sits at its low end,
    // the first stop of the sequential scale (the primary teal).
    expect(o1).toHaveAttribute('fill', GYRE_COLORS.primary.toLowerCase());
    expect(dotOf('Fz').querySelector('circle')).toHaveAttribute('fill', GYRE_COLORS.line);
    expect(dotOf('Fz')).toHaveAttribute('data-mark', 'no-value');
    expect(dotOf('O2')).toHaveAttribute('data-mark', 'left-out');
    expect(dotOf('O2').querySelector('path')).not.toBeNull();
    expect(screen.getByTestId('scalp-marks')).toHaveTextContent('Left out: O2 (flat)');
    expect(screen.getByTestId('scalp-marks')).toHaveTextContent('No value: Fz');
  });

  it('labels the colour bar in Hz with its ticks', () => {
    render(<ScalpMapPanel rest={REST} task={undefined} />);
    const ticks = screen.getAllByTestId('scalp-colour-tick').map((t) => t.textContent);
    expect(ticks).toEqual(['9.8', '9.9', '10.0', '10.1', '10.2']);
    expect(screen.getByText('Peak alpha frequency (PAF), Hz')).toBeInTheDocument();
  });

  it('switches between PAF, CoG and Δf', async () => {
    const user = userEvent.setup();
    render(<ScalpMapPanel rest={REST} task={TASK} />);
    await user.click(screen.getByText('CoG'));
    const cog = screen.getByRole('table', { name: /Centre of gravity/ });
    expect(within(cog).getByRole('row', { name: /^T7 / }).textContent).toContain('10.05\u00a0Hz');
    await user.click(screen.getByText('Δf'));
    const delta = screen.getByRole('table', { name: /Δf/ });
    // Signed with the true minus (U+2212).
    expect(within(delta).getByRole('row', { name: /^O1 / }).textContent).toContain(
      '\u22120.36\u00a0Hz',
    );
    // A region channel not in the file: dashed, named apart from "no value".
    expect(dotOf('POz')).toHaveAttribute('data-mark', 'missing');
    expect(screen.getByTestId('scalp-marks')).toHaveTextContent('Asked for, not in the file: POz');
    // Δf on a diverging scale centred on 0: Fz (+0.05) is near the white middle stop.
    const fz = dotOf('Fz').querySelector('circle')?.getAttribute('fill');
    expect(fz).toBe(scalpColourOf(0.05, { domainHz: [-0.4, 0.4], diverging: true }));
    const ticks = screen.getAllByTestId('scalp-colour-tick').map((t) => t.textContent);
    expect(ticks[0]).toBe('\u22120.4');
    expect(ticks[ticks.length - 1]).toBe('+0.4');
  });

  it('reads a channel on hover and with the arrow keys', async () => {
    const user = userEvent.setup();
    render(<ScalpMapPanel rest={REST} task={undefined} />);
    await user.hover(dotOf('T7'));
    expect(screen.getByTestId('scalp-reading').textContent).toContain('T7: 10.20\u00a0Hz');
    screen.getByRole('img').focus();
    await user.keyboard('{ArrowRight}');
    expect(screen.getByTestId('scalp-reading')).toHaveTextContent(/^(Fz|Pz): /);
  });

  it('says so when there is nothing to map', () => {
    render(<ScalpMapPanel rest={undefined} task={undefined} />);
    expect(screen.getByText('No computed results to map yet.')).toBeInTheDocument();
  });
});
