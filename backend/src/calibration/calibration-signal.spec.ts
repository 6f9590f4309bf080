import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { readEdf } from '../signal/edf';
import { DEFAULT_ANALYSIS_SETTINGS } from '../signal/pipeline/analysis-settings';
import {
  calibrationOnsetsS,
  calibrationRestFile,
  calibrationTaskFile,
  calibrationTruth,
  DEFAULT_CALIBRATION_SIGNAL as SIGNAL,
} from './calibration-signal';

describe('the calibration signal', () => {
  it('knows 10.0 Hz and −0.5 Hz for the default windows (the dip holds over all of +0.2…+0.8 s)', () => {
    const truth = calibrationTruth(SIGNAL, DEFAULT_ANALYSIS_SETTINGS);
    expect(truth.pafHz).toBe(10);
    expect(truth.baselineHz).toBeCloseTo(10, 12);
    expect(truth.deltaFHz).toBeCloseTo(-0.5, 12);
    expect(truth.trialsKept).toBe(29);
  });

  it('follows the settings: a post window +0.1…+0.9 s takes in half of each raised-cosine ramp', () => {
    // Closed form: the mean of 0.5 − 0.5·cos(πu/0.2) over u ∈ [0.1, 0.2] is 0.5 + 1/π; the
    // ramp out is its mirror, so the mean dip over 0.8 s is (0.6 + 0.2·(0.5 + 1/π)) / 0.8.
    const truth = calibrationTruth(SIGNAL, {
      baselineWindowS: [-0.5, 0],
      postWindowS: [0.1, 0.9],
    });
    expect(truth.deltaFHz).toBeCloseTo((-0.5 * (0.6 + 0.2 * (0.5 + 1 / Math.PI))) / 0.8, 6);
  });

  it('is the same bytes every time (fixed seeds), with one annotated onset every 4 s', () => {
    const task = calibrationTaskFile(SIGNAL, 'stimulus');
    expect(calibrationTaskFile(SIGNAL, 'stimulus').checksumSha256).toBe(task.checksumSha256);
    expect(calibrationRestFile(SIGNAL).checksumSha256).toBe(
      calibrationRestFile(SIGNAL).checksumSha256,
    );
    const read = readEdf(task.bytes);
    expect(read.header.format).toBe('EDF+C');
    expect(read.signals.map((s) => s.label)).toEqual(SIGNAL.channelLabels);
    const onsets = read.annotations.filter((a) => a.text === 'stimulus').map((a) => a.onsetS);
    expect(onsets).toEqual(calibrationOnsetsS(SIGNAL));
    expect(onsets[1] - onsets[0]).toBe(4);
  });

  it("puts the resting peak in scipy's Welch bin at 10.0 Hz (file decoded by numpy per the EDF specification)", () => {
    const dir = mkdtempSync(join(tmpdir(), 'gyre-calibration-'));
    try {
      const file = join(dir, 'rest.edf');
      writeFileSync(file, calibrationRestFile(SIGNAL).bytes);
      // EDF (Kemp et al. 1992): 256-byte header, 256 bytes per signal, then records of
      // little-endian int16 samples; physical = pmin + (d − dmin)·(pmax − pmin)/(dmax − dmin).
      const script = `
import json, sys
import numpy as np
from scipy.signal import welch
raw = open(sys.argv[1], 'rb').read()
ns = int(raw[252:256]); hb = int(raw[184:192]); nrec = int(raw[236:244])
def field(offset, width):
    base = 256 + offset * ns
    return [raw[base + i * width: base + (i + 1) * width].decode().strip() for i in range(ns)]
labels = field(0, 16)
pmin = [float(v) for v in field(104, 8)]; pmax = [float(v) for v in field(112, 8)]
dmin = [float(v) for v in field(120, 8)]; dmax = [float(v) for v in field(128, 8)]
spr = [int(v) for v in field(216, 8)]
rec = np.frombuffer(raw[hb:], dtype='<i2').reshape(nrec, sum(spr))
k = labels.index('Oz'); start = sum(spr[:k])
d = rec[:, start:start + spr[k]].reshape(-1).astype(float)
x = pmin[k] + (d - dmin[k]) * (pmax[k] - pmin[k]) / (dmax[k] - dmin[k])
f, p = welch(x, fs=spr[k], window='hann', nperseg=4 * spr[k], noverlap=2 * spr[k], detrend='constant', scaling='density')
band = (f >= 7) & (f <= 13)
print(json.dumps({'peakHz': float(f[band][np.argmax(p[band])]), 'binHz': float(f[1] - f[0])}))
`;
      const out = JSON.parse(execFileSync('python3', ['-c', script, file]).toString()) as {
        peakHz: number;
        binHz: number;
      };
      expect(out.binHz).toBe(0.25);
      expect(out.peakHz).toBe(10);
      // The PAF tolerance is half of that bin (docs/method.md, "Calibration run").
      expect(SIGNAL.tolerances.pafHz).toBe(out.binHz / 2);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
