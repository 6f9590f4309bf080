import type {
  ChannelStatsView,
  ConditionDifferenceView,
  CycleEstimateView,
  TaskResultsView,
} from '@gyre/shared';
import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { SWRConfig } from 'swr';
import { describe, expect, it, vi } from 'vitest';
import { AppProvider } from '../../../app/provider';
import { TASK_RESULTS } from '../testing/review-fixtures';
import { gatedShareOf } from './amplitude-gate';
import { ChannelTable } from './channel-table';
import { conditionOverlaysOf } from './conditions-overlay';
import { ConditionsTable } from './conditions-table';
import { CycleEstimate, disagreementText, formatHzLike, thresholdWords } from './cycle-estimate';
import { OnsetCurveChart } from './onset-curve-chart';
import { conditionStroke, onsetCurveSpec } from './onset-curve-spec';

vi.mock(
  '../../../components/charts/g2-plot',
  () => import('../../../components/charts/testing/fake-g2-plot'),
);

// Generated test data in the shapes of shared/src/analysis-depth.ts.
const MINUS = '\u2212';
const NBSP = '\u00A0';
const TASK = TASK_RESULTS.task!;
const RUN = TASK_RESULTS.run;
const curveOf = (name: string, hz: number) => ({
  name,
  meanHz: TASK.timeS.map(() => hz),
  ciLowHz: TASK.timeS.map(() => hz - 0.2),
  ciHighHz: TASK.timeS.map(() => hz + 0.2),
});
const DIFFERENCE: ConditionDifferenceView = {
  first: 'Tone',
  second: 'Word',
  chosenBy: 'first-two',
  differenceHz: -0.4,
  ciHz: [-0.65, -0.15],
  pValue: 0.0042,
  permutations: 5000,
  seed: 20190815,
};
const WITH_CONDITIONS: TaskResultsView = {
  ...TASK,
  conditions: [
    {
      label: 'Tone',
      trialsKept: 18,
      trialsTotal: 20,
      baselineHz: 10.1,
      postHz: 9.6,
      deltaFHz: -0.5,
      ciHz: [-0.7, -0.3],
      pValue: 0.0004,
    },
    {
      label: 'Word',
      trialsKept: 19,
      trialsTotal: 20,
      baselineHz: 10.1,
      postHz: 10,
      deltaFHz: -0.1,
      ciHz: [-0.3, 0.1],
      pValue: 0.4,
    },
  ],
  conditionCurves: [curveOf('Tone', 9.6), curveOf('Word', 10)],
  conditionDifference: DIFFERENCE,
};
const CYCLES: CycleEstimateView = {
  baselineHz: 10.05,
  postHz: 9.7,
  deltaFHz: -0.21,
  ciHz: [-0.4, -0.02],
  trialsUsed: 3,
  trialsTotal: 3,
  burstCycleShare: 0.625,
  disagreementHz: 0.15,
  disagrees: true,
};

function renderIn(node: React.ReactNode) {
  return render(
    <AppProvider>
      <SWRConfig value={{ provider: () => new Map(), dedupingInterval: 0 }}>{node}</SWRConfig>
    </AppProvider>,
  );
}

describe('the Conditions card', { timeout: 30_000 }, () => {
  it('lists each condition with trials, Δf, CI and Wilcoxon p (true minus, unit after a no-break space)', () => {
    renderIn(<ConditionsTable task={WITH_CONDITIONS} />);
    const table = screen.getByRole('table');
    const tone = within(table).getByText('Tone').closest('tr')!;
    expect(tone).toHaveTextContent(`18 of 20`);
    expect(tone.textContent).toContain(`${MINUS}0.50${NBSP}Hz`);
    expect(tone.textContent).toContain(`${MINUS}0.70 to ${MINUS}0.30${NBSP}Hz`);
    expect(tone.textContent).toContain(`<${NBSP}0.001`);
    expect(within(table).getByText('Word').closest('tr')).toHaveTextContent('0.400');
  });

  it('ends with the difference row "A − B", its CI and permutation p, and says what it is', () => {
    renderIn(<ConditionsTable task={WITH_CONDITIONS} />);
    const row = screen.getByText('Difference Tone − Word').closest('tr')!;
    expect(row.textContent).toContain(`${MINUS}0.40${NBSP}Hz`);
    expect(row.textContent).toContain(`${MINUS}0.65 to ${MINUS}0.15${NBSP}Hz`);
    expect(row).toHaveTextContent('0.004(permutation)');
    const note = screen.getByText(/The last row is a difference, not a condition/);
    expect(note).toHaveTextContent('the first two conditions found in the onsets');
    expect(note).toHaveTextContent('5000 label shuffles, fixed seed 20190815');
  });

  it('names the settings when they chose the pair, and shows nothing without labelled onsets', () => {
    const { unmount } = renderIn(
      <ConditionsTable
        task={{ ...WITH_CONDITIONS, conditionDifference: { ...DIFFERENCE, chosenBy: 'settings' } }}
      />,
    );
    expect(screen.getByText(/named in the study's analysis settings/)).toBeInTheDocument();
    unmount();
    renderIn(<ConditionsTable task={TASK} />);
    expect(screen.queryByLabelText('Conditions')).not.toBeInTheDocument();
  });
});

describe('the cycle-by-cycle cross-check', { timeout: 30_000 }, () => {
  it("shows both estimates side by side and warns, naming the difference and the run's threshold", () => {
    renderIn(<CycleEstimate run={RUN} cycles={CYCLES} studyThresholdHz={0.1} />);
    const estimates = screen.getByRole('table', { name: 'Δf by both estimates' });
    const phase = within(estimates).getByText('Phase-based').closest('tr')!;
    expect(phase.textContent).toContain(`${MINUS}0.31${NBSP}Hz`);
    expect(phase.textContent).toContain(`${MINUS}0.45 to ${MINUS}0.18${NBSP}Hz`);
    expect(phase).toHaveTextContent('3 of 4');
    const cycles = within(estimates).getByText('Cycle-by-cycle').closest('tr')!;
    expect(cycles.textContent).toContain(`${MINUS}0.21${NBSP}Hz`);
    expect(cycles.textContent).toContain(`${MINUS}0.40 to ${MINUS}0.02${NBSP}Hz`);
    expect(cycles).toHaveTextContent('3 of 3');
    const alert = screen.getByRole('alert');
    expect(alert.textContent).toContain(
      `differ by 0.15${NBSP}Hz, more than this run's threshold of 0.10${NBSP}Hz`,
    );
    const card = screen.getByLabelText('Cycle-by-cycle cross-check');
    // 0.625 of the cycles in bursts.
    expect(card.textContent).toContain(`62.5${NBSP}%`);
    expect(card.textContent).toContain(
      `0.10${NBSP}Hz, from the settings this run was computed with`,
    );
    expect(card.textContent).not.toContain('now say');
  });

  it("judges by the run's own threshold and names the study's when it changed since", () => {
    // The run was computed with 0.1 Hz and disagreed (0.15 Hz); the study now says 0.2 Hz.
    renderIn(<CycleEstimate run={RUN} cycles={CYCLES} studyThresholdHz={0.2} />);
    expect(screen.getByRole('alert').textContent).toContain(
      `more than this run's threshold of 0.10${NBSP}Hz`,
    );
    expect(screen.getByLabelText('Cycle-by-cycle cross-check').textContent).toContain(
      `the study's settings now say 0.20${NBSP}Hz (a re-run would use that)`,
    );
    expect(thresholdWords(0.1, null)).toBe(
      `0.10${NBSP}Hz, from the settings this run was computed with`,
    );
  });

  it('shows no warning when the estimates agree, and nothing for runs without the estimate', () => {
    const { unmount } = renderIn(
      <CycleEstimate
        run={RUN}
        cycles={{ ...CYCLES, disagreementHz: 0.05, disagrees: false }}
        studyThresholdHz={0.1}
      />,
    );
    expect(screen.getByLabelText('Cycle-by-cycle cross-check')).toBeInTheDocument();
    expect(screen.queryByRole('alert')).not.toBeInTheDocument();
    unmount();
    renderIn(<CycleEstimate run={RUN} cycles={null} studyThresholdHz={0.1} />);
    expect(screen.queryByLabelText('Cycle-by-cycle cross-check')).not.toBeInTheDocument();
  });

  it('prints a 0.005 Hz threshold and the difference beside it to three decimals', () => {
    // 0.0056 Hz is above 0.005 Hz; at two decimals both would read 0.01 Hz.
    expect(disagreementText({ ...CYCLES, disagreementHz: 0.0056 }, 0.005)).toContain(
      `differ by 0.006${NBSP}Hz, more than this run's threshold of 0.005${NBSP}Hz.`,
    );
    expect(formatHzLike(0.15, 0.1)).toBe(`0.15${NBSP}Hz`);
  });

  it('keeps a run that agreed under its own 0.20 Hz quiet after the study lowered it to 0.10 Hz', () => {
    const run = { ...RUN, depthSettings: { ...RUN.depthSettings, cycleDisagreementHz: 0.2 } };
    renderIn(
      <CycleEstimate run={run} cycles={{ ...CYCLES, disagrees: false }} studyThresholdHz={0.1} />,
    );
    expect(screen.queryByRole('alert')).not.toBeInTheDocument();
    expect(screen.getByLabelText('Cycle-by-cycle cross-check').textContent).toContain(
      `0.20${NBSP}Hz, from the settings this run was computed with; the study's settings now say 0.10${NBSP}Hz`,
    );
    expect(disagreementText(CYCLES, 0.2)).toContain(`this run's threshold of 0.20${NBSP}Hz.`);
  });
});

describe('the amplitude gate in the channel table', { timeout: 30_000 }, () => {
  const gated: ChannelStatsView[] = TASK_RESULTS.channels.map((c, i) => ({
    ...c,
    amplitudeGate: { percentile: 25, excludedSamples: 250 + i * 10, totalSamples: 1000 },
  }));

  it('says the percentile and gives each channel its share left out', () => {
    renderIn(<ChannelTable channels={gated} roiUsage={RUN.roiUsage} />);
    expect(screen.getByTestId('amplitude-gate-note')).toHaveTextContent(
      'under percentile 25 of each channel',
    );
    expect(screen.getByRole('columnheader', { name: /Left out by the gate/ })).toBeInTheDocument();
    // 260 of 1000 samples of O2 = 26.0 %.
    expect(screen.getByText('O2').closest('tr')?.textContent).toContain(`26.0${NBSP}%`);
    expect(gatedShareOf(gated[0])).toBe(0.25);
  });

  it('has no gate column or note while the gate is off', () => {
    renderIn(<ChannelTable channels={TASK_RESULTS.channels} roiUsage={RUN.roiUsage} />);
    expect(screen.queryByTestId('amplitude-gate-note')).not.toBeInTheDocument();
    expect(screen.queryByRole('columnheader', { name: /Left out by the gate/ })).toBeNull();
  });
});

describe('conditions over the onset curve', { timeout: 30_000 }, () => {
  it('colours each condition from the chart palette, distinct from the mean and the windows', () => {
    const overlays = conditionOverlaysOf(WITH_CONDITIONS);
    expect(overlays.map((o) => o.name)).toEqual(['Tone', 'Word']);
    expect(overlays[0].colour).not.toBe(overlays[1].colour);
    expect(overlays[0].colour).toBe(conditionStroke(0).colour);
    // The fourth condition takes the first colour again, dashed.
    expect(conditionStroke(3)).toEqual({ colour: conditionStroke(0).colour, dashed: true });
    expect(conditionStroke(1).dashed).toBe(false);
    const spec = onsetCurveSpec({
      points: [],
      baselineWindowS: [-0.5, 0],
      postWindowS: [0.2, 0.8],
      seriesName: 'Mean',
      overlays,
    });
    const lines = spec.children.filter((m) => m.type === 'line');
    expect(lines.map((m) => (m.style as { stroke: string }).stroke).slice(1)).toEqual(
      overlays.map((o) => o.colour),
    );
  });

  it('draws the conditions when the toggle is switched on, with a legend by label', async () => {
    renderIn(
      <OnsetCurveChart
        recordingId="rec-task"
        runId="run-task"
        task={WITH_CONDITIONS}
        roiLabel="ROI"
      />,
    );
    const marks = async () => (await screen.findByTestId('g2-plot')).getAttribute('data-marks');
    expect(await marks()).toBe('rangeX area line lineX');
    expect(screen.queryByText('Tone')).not.toBeInTheDocument();
    await userEvent.click(screen.getByRole('switch', { name: "Show the conditions' curves" }));
    expect(await marks()).toBe('rangeX area line line line lineX');
    expect(screen.getByText('Tone')).toBeInTheDocument();
    expect(screen.getByText('Word')).toBeInTheDocument();
  });

  it('offers no toggle for a run without condition curves', async () => {
    renderIn(
      <OnsetCurveChart recordingId="rec-task" runId="run-task" task={TASK} roiLabel="ROI" />,
    );
    await screen.findByTestId('g2-plot');
    expect(screen.queryByRole('switch')).not.toBeInTheDocument();
  });
});
