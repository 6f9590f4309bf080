import { describe, expect, it } from 'vitest';
import { settingChangeText, settingValueText } from './settings-words';

describe('settings in words', () => {
  it('gives each kind of value its unit', () => {
    expect(settingValueText('postWindowS', [0.2, 0.8])).toBe('0.20 to 0.80 s');
    expect(settingValueText('bandHz', [8, 12.5])).toBe('8.00 to 12.50 Hz');
    expect(settingValueText('rejectionThresholdUv', 150)).toBe('150 µV');
    expect(settingValueText('flagThresholdHz', -0.25)).toBe('Δf ≤ −0.25 Hz');
    expect(settingValueText('morletCycles', 7)).toBe('7 cycles');
  });

  it('names the automatic band and "every onset" instead of showing null', () => {
    expect(settingValueText('bandHz', null)).toBe("visit's IAF ± 2 Hz (8–13 Hz without one)");
    expect(settingValueText('onsetLabel', null)).toBe('every onset');
    expect(settingValueText('onsetLabel', 'S  1')).toBe('“S  1”');
  });

  it('reads a change as before → after', () => {
    expect(
      settingChangeText({ field: 'roi', before: ['O1', 'O2', 'Pz'], after: ['O1', 'Pz'] }),
    ).toBe('Region of interest: O1, O2, Pz → O1, Pz');
    expect(settingChangeText({ field: 'method', before: 'filter', after: 'morlet' })).toBe(
      'Narrow-band method: zero-phase band-pass → Morlet wavelet',
    );
  });

  it('says the depth settings in words: the gate off or its percentile, Hz, the compared pair', () => {
    expect(settingValueText('amplitudeGatePercentile', null)).toBe('off');
    expect(settingValueText('amplitudeGatePercentile', 25)).toBe(
      "samples under percentile 25 of each channel's envelope left out",
    );
    // Unit after a no-break space (shared/src/number-format.ts).
    expect(settingValueText('cycleDisagreementHz', 0.1)).toBe('0.10\u00A0Hz');
    expect(settingValueText('compareConditions', null)).toBe('the first two found');
    expect(settingValueText('compareConditions', ['Tone', 'Word'])).toBe('“Tone” − “Word”');
    expect(settingChangeText({ field: 'amplitudeGatePercentile', before: null, after: 25 })).toBe(
      "Amplitude gate: off → samples under percentile 25 of each channel's envelope left out",
    );
  });
});
