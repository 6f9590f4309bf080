import { render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { DEFAULT_AMPLITUDE_GATE_PERCENTILE_WHEN_ON } from '@gyre/shared';
import { describe, expect, it, vi } from 'vitest';
import { ApiError } from '../../../lib/api-client';
import { DEFAULT_SETTINGS_VALUES } from '../../../test/fixtures';
import { VERSION_1 } from '../testing/settings-fixtures';
import { SettingsForm } from './settings-form';

function renderForm(onSave = vi.fn(async () => undefined)) {
  render(<SettingsForm current={VERSION_1} onSave={onSave} />);
  return { onSave };
}

async function replace(label: string, text: string) {
  const field = screen.getByLabelText(label);
  await userEvent.clear(field);
  await userEvent.type(field, text);
}

const save = () => userEvent.click(screen.getByRole('button', { name: 'Save version 2' }));

describe('SettingsForm', { timeout: 60_000 }, () => {
  it('says next to the button that a new version re-runs nothing', () => {
    renderForm();
    expect(
      screen.getByText(
        /runs keep their numbers; visits whose results would change show a notice in Review/,
      ),
    ).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: /re-run/i })).not.toBeInTheDocument();
  });

  it('needs a reason of at least 10 characters', async () => {
    const { onSave } = renderForm();
    await save();
    expect(await screen.findByText('Say why the settings change.')).toBeInTheDocument();
    await userEvent.type(screen.getByLabelText('Reason for the change'), 'shorter');
    await save();
    expect(
      await screen.findByText('Write at least 10 characters, so that the trail says why.'),
    ).toBeInTheDocument();
    expect(onSave).not.toHaveBeenCalled();
  });

  it('refuses windows the computation cannot use, naming the window', async () => {
    const { onSave } = renderForm();
    await replace('Baseline end', '0.1');
    await replace('Post start', '-0.7');
    await replace('Suggest a flag at Δf ≤', '0.1');
    await userEvent.type(screen.getByLabelText('Reason for the change'), 'Trying other windows');
    await save();
    expect(
      await screen.findByText('The baseline must end at or before onset (0 s).'),
    ).toBeInTheDocument();
    expect(
      screen.getByText("The post window must start at or after the baseline's end (0.1 s)."),
    ).toBeInTheDocument();
    expect(screen.getByText('Use a negative change between −5 and 0 Hz.')).toBeInTheDocument();
    expect(onSave).not.toHaveBeenCalled();
  });

  it('asks for a band at least 1 Hz wide when the band is fixed', async () => {
    const { onSave } = renderForm();
    await userEvent.click(screen.getByLabelText('Fixed band'));
    await replace('Band low edge', '9');
    await replace('Band high edge', '9.5');
    await userEvent.type(screen.getByLabelText('Reason for the change'), 'Narrow band for a test');
    await save();
    expect(
      await screen.findByText(
        'The band must be at least 1 Hz wide (high edge above the low edge).',
      ),
    ).toBeInTheDocument();
    expect(onSave).not.toHaveBeenCalled();
  });

  it('sends every setting with the reason when the form is valid', async () => {
    const { onSave } = renderForm();
    await userEvent.click(screen.getByLabelText('Fixed band'));
    await replace('Band low edge', '8.5');
    await replace('Band high edge', '12.5');
    await replace('Post end', '1');
    await userEvent.type(
      screen.getByLabelText('Reason for the change'),
      'Narrower band after the pilot',
    );
    await save();
    await waitFor(() =>
      expect(onSave).toHaveBeenCalledWith({
        ...DEFAULT_SETTINGS_VALUES,
        bandHz: [8.5, 12.5],
        postWindowS: [0.2, 1],
        reason: 'Narrower band after the pilot',
      }),
    );
  });

  it('switching the amplitude gate on fills in the default percentile and sends the three depth settings', async () => {
    const { onSave } = renderForm();
    expect(screen.queryByLabelText('Envelope percentile')).not.toBeInTheDocument();
    await userEvent.click(screen.getByRole('switch', { name: 'Amplitude gate' }));
    expect(screen.getByLabelText('Envelope percentile')).toHaveValue(
      String(DEFAULT_AMPLITUDE_GATE_PERCENTILE_WHEN_ON),
    );
    await replace('Warn when the estimates differ by more than', '0.25');
    await userEvent.type(screen.getByLabelText('First condition compared'), ' Tone ');
    await userEvent.type(screen.getByLabelText('Second condition compared'), 'Word');
    await userEvent.type(screen.getByLabelText('Reason for the change'), 'Gate weak alpha out');
    await save();
    await waitFor(() =>
      expect(onSave).toHaveBeenCalledWith(
        expect.objectContaining({
          amplitudeGatePercentile: 25,
          cycleDisagreementHz: 0.25,
          compareConditions: ['Tone', 'Word'],
        }),
      ),
    );
  });

  it('refuses a percentile outside 1–90, a threshold above 2 Hz and one condition without the other', async () => {
    const { onSave } = renderForm();
    await userEvent.click(screen.getByRole('switch', { name: 'Amplitude gate' }));
    await replace('Envelope percentile', '95');
    await replace('Warn when the estimates differ by more than', '3');
    await userEvent.type(screen.getByLabelText('Second condition compared'), 'Word');
    await userEvent.type(screen.getByLabelText('Reason for the change'), 'Trying a strict gate');
    await save();
    expect(await screen.findByText('Use a percentile from 1 to 90.')).toBeInTheDocument();
    expect(screen.getByText('Use a difference above 0 and at most 2 Hz.')).toBeInTheDocument();
    expect(
      screen.getByText('Name the first condition too, or leave both empty (the first two found).'),
    ).toBeInTheDocument();
    expect(onSave).not.toHaveBeenCalled();
  });

  it('refuses the same condition twice (labels match case-insensitively)', async () => {
    const { onSave } = renderForm();
    await userEvent.type(screen.getByLabelText('First condition compared'), 'Tone');
    await userEvent.type(screen.getByLabelText('Second condition compared'), 'tone');
    await userEvent.type(screen.getByLabelText('Reason for the change'), 'Compare tone to tone');
    await save();
    expect(await screen.findByText('Name two different conditions.')).toBeInTheDocument();
    expect(onSave).not.toHaveBeenCalled();
  });

  it('sends the gate as off when it is switched off again', async () => {
    const { onSave } = renderForm();
    const gate = screen.getByRole('switch', { name: 'Amplitude gate' });
    await userEvent.click(gate);
    await userEvent.click(gate);
    await userEvent.type(screen.getByLabelText('Reason for the change'), 'Gate stays off now');
    await save();
    await waitFor(() =>
      expect(onSave).toHaveBeenCalledWith(
        expect.objectContaining({ amplitudeGatePercentile: null, compareConditions: null }),
      ),
    );
  });

  it('shows "Nothing changed" apart from errors when the server finds no difference', async () => {
    const onSave = vi.fn(async () => {
      throw new ApiError(
        409,
        'ANALYSIS_SETTINGS_UNCHANGED',
        'These are the settings of version 1 already.',
      );
    });
    renderForm(onSave);
    await userEvent.type(screen.getByLabelText('Reason for the change'), 'Same values again');
    await save();
    const alert = await screen.findByRole('alert');
    expect(alert).toHaveTextContent('Nothing changed');
    expect(alert).toHaveTextContent('These are the settings of version 1 already.');
    expect(alert).not.toHaveClass('ant-alert-error');
  });
});
