import { DEFAULT_DIP_SHAPE, dipWeight, frequencyTrack, phaseFromFrequency } from './alpha-rhythm';

describe('dipWeight', () => {
  it('is 0 in the baseline window, 1 over the post window and raised-cosine between (closed form)', () => {
    for (const t of [-1, -0.5, -0.25, -0.001, 0]) expect(dipWeight(t)).toBe(0);
    for (const t of [0.2, 0.35, 0.5, 0.8]) expect(dipWeight(t)).toBe(1);
    // 0.5·(1 − cos(π·u)) at u = ½ and ¼ of the rise; 0.5·(1 + cos(π·u)) at ½ of the fall.
    expect(dipWeight(0.1)).toBeCloseTo(0.5, 12);
    expect(dipWeight(0.05)).toBeCloseTo(0.5 * (1 - Math.cos(Math.PI / 4)), 12);
    expect(dipWeight(1.0)).toBeCloseTo(0.5, 12);
    for (const t of [1.2, 1.5, 3]) expect(dipWeight(t)).toBe(0);
  });

  it('is continuous with a continuous slope (numerical derivative around each join)', () => {
    const h = 1e-6;
    for (const join of [0, 0.2, 0.8, 1.2]) {
      const left = (dipWeight(join) - dipWeight(join - h)) / h;
      const right = (dipWeight(join + h) - dipWeight(join)) / h;
      expect(Math.abs(dipWeight(join + h) - dipWeight(join - h))).toBeLessThan(1e-4);
      expect(Math.abs(right - left)).toBeLessThan(1e-3);
    }
  });
});

describe('frequencyTrack and phaseFromFrequency', () => {
  const sampleRateHz = 250;

  it('gives φ[n] = φ0 + 2π·f·n/fs for a constant frequency (closed form)', () => {
    const track = frequencyTrack({ sampleRateHz, sampleCount: 5000, baseHz: 10.3 });
    const phase = phaseFromFrequency(track, { sampleRateHz, startPhaseRad: 0.7 });
    for (const n of [0, 1, 777, 4999]) {
      expect(phase[n]).toBeCloseTo(0.7 + (2 * Math.PI * 10.3 * n) / sampleRateHz, 9);
    }
  });

  it('round-trips: (φ[n+1] − φ[n])·fs/(2π) is the designed frequency (Boashash 1992 estimator)', () => {
    const onsetsS = [2, 6.5];
    const track = frequencyTrack({
      sampleRateHz,
      sampleCount: 2500,
      baseHz: 10,
      onsetsS,
      deltaFHz: -0.7,
    });
    const phase = phaseFromFrequency(track, { sampleRateHz, startPhaseRad: 0 });
    let worst = 0;
    for (let n = 0; n < track.length; n++) {
      const estimate = ((phase[n + 1] - phase[n]) * sampleRateHz) / (2 * Math.PI);
      worst = Math.max(worst, Math.abs(estimate - track[n]));
    }
    expect(worst).toBeLessThan(1e-9);
  });

  it('has exactly the base frequency in the baseline window and base + Δf over the post window', () => {
    const onsetsS = [3, 7];
    const deltaFHz = -0.55;
    const track = frequencyTrack({
      sampleRateHz,
      sampleCount: 2750,
      baseHz: 9.8,
      onsetsS,
      deltaFHz,
    });
    for (const onsetS of onsetsS) {
      const mean = (fromS: number, toS: number): number => {
        let sum = 0;
        let count = 0;
        for (let n = 0; n < track.length; n++) {
          const t = (n + 0.5) / sampleRateHz - onsetS; // each value sits between n and n+1
          if (t >= fromS && t < toS) {
            sum += track[n];
            count++;
          }
        }
        return sum / count;
      };
      // Windows of docs/method.md §3.
      expect(mean(-0.5, 0)).toBeCloseTo(9.8, 12);
      expect(mean(0.2, 0.8)).toBeCloseTo(9.8 + deltaFHz, 12);
      expect(mean(DEFAULT_DIP_SHAPE.fallEndS, 2)).toBeCloseTo(9.8, 12);
    }
  });
});
