import { readScipyFixture, relativeError } from '../testing/scipy-fixtures';
import {
  frequencyFromPhase,
  frequencyTimeS,
  phaseDifferenceFrequency,
  unwrapPhase,
  wrappedPhase,
} from './instantaneous-frequency';

interface UnwrapFixture {
  sampleRateHz: number;
  re: number[];
  im: number[];
  wrappedPhase: number[];
  unwrappedPhase: number[];
  frequencyHz: number[];
}

const fixture = readScipyFixture<UnwrapFixture>('unwrap.json');

describe('phase and frequency against numpy', () => {
  const z = { re: Float64Array.from(fixture.re), im: Float64Array.from(fixture.im) };
  const fs = fixture.sampleRateHz;

  it('wraps the phase like numpy.angle', () => {
    expect(relativeError(wrappedPhase(z), fixture.wrappedPhase)).toBeLessThan(1e-12);
  });

  it('unwraps like numpy.unwrap (relative 1e-9)', () => {
    const unwrapped = unwrapPhase(Float64Array.from(fixture.wrappedPhase));
    expect(relativeError(unwrapped, fixture.unwrappedPhase)).toBeLessThan(1e-9);
  });

  it('differentiates like numpy.diff·fs/2π (relative 1e-9)', () => {
    const f = frequencyFromPhase(Float64Array.from(fixture.unwrappedPhase), fs);
    expect(f.length).toBe(fixture.frequencyHz.length);
    expect(relativeError(f, fixture.frequencyHz)).toBeLessThan(1e-9);
  });

  it('gives the same frequency without unwrapping: arg(z[n+1]·conj z[n]) (Boashash 1992)', () => {
    const f = phaseDifferenceFrequency(z, { sampleRateHz: fs });
    expect(f.length).toBe(fixture.re.length - 1);
    expect(relativeError(f, fixture.frequencyHz)).toBeLessThan(1e-9);
  });

  it('gives the same values in place, over the real part it reads', () => {
    const expected = phaseDifferenceFrequency(z, { sampleRateHz: fs });
    const own = { re: z.re.slice(), im: z.im.slice() };
    const f = phaseDifferenceFrequency(
      own,
      { sampleRateHz: fs },
      own.re.subarray(0, own.re.length - 1),
    );
    expect(f.buffer).toBe(own.re.buffer);
    expect(Array.from(f)).toEqual(Array.from(expected));
    expect(relativeError(f, fixture.frequencyHz)).toBeLessThan(1e-9);
  });

  it('puts each frequency value at the midpoint between its two samples', () => {
    expect(frequencyTimeS(0, 500)).toBeCloseTo(0.001, 12);
    expect(frequencyTimeS(499, 500)).toBeCloseTo(0.999, 12);
  });

  it('keeps a jump of exactly +π, as numpy.unwrap does', () => {
    // numpy.unwrap([0, π]) == [0, π]; numpy.unwrap([0, −π]) == [0, −π] (numpy docs, discont=π).
    expect(Array.from(unwrapPhase(Float64Array.from([0, Math.PI])))).toEqual([0, Math.PI]);
    expect(Array.from(unwrapPhase(Float64Array.from([0, 3.5, 7])))).toEqual([
      0,
      3.5 - 2 * Math.PI,
      7 - 4 * Math.PI,
    ]);
  });
});
