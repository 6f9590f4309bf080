import 'reflect-metadata';
import { spawnSync } from 'node:child_process';
import type { RunSummary } from '../signal/pipeline/run-summary';
import { base64ToFloat64, encodeResultBody, float64ToBase64, parseResultBody } from './result-wire';
import { parseRemoteJobId, remoteJobId } from './remote-job';
import { seededUniform } from '../signal/random/random';

/** Seeded values of every kind: ordinary, tiny, huge, negative zero, subnormal, NaN. */
function awkwardValues(): Float64Array {
  const next = seededUniform(20260115);
  const values = Array.from(
    { length: 200 },
    () => (next() - 0.5) * 10 ** Math.floor(next() * 40 - 20),
  );
  return Float64Array.from([...values, -0, 5e-324, Number.MAX_VALUE, NaN, Infinity, -Infinity]);
}

describe('series on the wire: base64 of IEEE 754 binary64, little-endian', () => {
  it('encodes known bit patterns (IEEE 754-2019 §3.4, base64 as RFC 4648 §4)', () => {
    // 1.0 = 0x3FF0000000000000, -2.0 = 0xC000000000000000; little-endian byte order.
    expect(float64ToBase64(Float64Array.of(1))).toBe('AAAAAAAA8D8=');
    expect(float64ToBase64(Float64Array.of(-2))).toBe('AAAAAAAAAMA=');
    // +Infinity = 0x7FF0000000000000; the quiet NaN JavaScript writes = 0x7FF8000000000000.
    expect(float64ToBase64(Float64Array.of(Infinity))).toBe('AAAAAAAA8H8=');
    expect(float64ToBase64(Float64Array.of(NaN))).toBe('AAAAAAAA+H8=');
    expect(float64ToBase64(new Float64Array(0))).toBe('');
  });

  it('writes what Python’s struct.pack("<d") and base64 write, and reads it back bit for bit', () => {
    const values = awkwardValues();
    const python = spawnSync(
      'python3',
      [
        '-c',
        'import sys,json,struct,base64\n' +
          'v=[float(x) for x in json.load(sys.stdin)]\n' +
          'print(base64.b64encode(struct.pack("<%dd"%len(v),*v)).decode())',
      ],
      // Python's float() reads 'nan', 'inf' and '-inf'; JSON cannot carry them as numbers.
      {
        input: JSON.stringify(
          [...values].map((v) =>
            Number.isFinite(v) ? v : String(v).replace('Infinity', 'inf').replace('NaN', 'nan'),
          ),
        ),
        encoding: 'utf8',
      },
    );
    expect(python.status).toBe(0);
    const ours = float64ToBase64(values);
    // -0 through JSON becomes 0 for Python: compare everything but that one value's sign byte.
    const theirs = python.stdout.trim();
    const oursBytes = Buffer.from(ours, 'base64');
    const theirBytes = Buffer.from(theirs, 'base64');
    expect(theirBytes.length).toBe(oursBytes.length);
    const negativeZeroAt = 200 * 8;
    oursBytes[negativeZeroAt + 7] = 0;
    expect(theirBytes.equals(oursBytes)).toBe(true);
    const back = base64ToFloat64(ours) as Float64Array;
    expect(Buffer.from(back.buffer).equals(Buffer.from(values.buffer))).toBe(true);
    expect(Object.is(back[200], -0)).toBe(true);
  });

  it('names what is wrong with a series', () => {
    expect(base64ToFloat64('AAAA')).toBe('holds 3 bytes, not a whole number of 8-byte values');
    expect(base64ToFloat64('AA*A')).toBe('is not base64');
    expect(base64ToFloat64('AAA')).toBe('is not base64');
  });
});

function restSummary(): RunSummary {
  return {
    bandHz: [8, 13],
    bandSource: 'default',
    roiUsage: { wanted: ['O1', 'O2'], used: ['O1', 'O2'], leftOut: [], status: 'complete' },
    channels: [
      {
        label: 'O1',
        canonical: 'O1',
        inRoi: true,
        baselineHz: null,
        postHz: null,
        deltaFHz: null,
        ciHz: null,
        pValue: null,
        trials: null,
        pafHz: null,
        cogHz: null,
        amplitudeGate: null,
      },
    ],
    roi: null,
    task: null,
    rest: { pafHz: 9.5, cogHz: 9.6, prominenceDb: 6.1, noPeakReason: null, alphaWindowHz: [7, 14] },
    quality: {
      durationS: 60,
      sampleRatesHz: [256],
      roiChannelsFound: ['O1', 'O2'],
      roiChannelsMissing: [],
      flatChannels: [],
      saturatedChannels: [],
      lineNoiseRatio50Hz: null,
      lineNoiseRatio60Hz: null,
      epochsDroppedShare: null,
      phaseSlipShare: null,
      alphaPeakProminenceDb: 6.1,
      channels: [],
      warnings: [],
    },
    suggestsSlowing: null,
  };
}

describe('a posted result', () => {
  const outcome = {
    summary: restSummary(),
    series: {
      'rest:frequencyHz': Float64Array.of(1, 2, 3),
      'rest:powerUv2PerHz': Float64Array.of(0.5, NaN, 0.25),
    },
  };

  it('comes back as the outcome that was sent', () => {
    const parsed = parseResultBody(JSON.parse(JSON.stringify(encodeResultBody(outcome, '1.2.3'))));
    expect(parsed.ok).toBe(true);
    if (!parsed.ok) return;
    expect(parsed.gyreVersion).toBe('1.2.3');
    expect(parsed.outcome.summary).toEqual(outcome.summary);
    expect([...parsed.outcome.series['rest:powerUv2PerHz']]).toEqual([0.5, NaN, 0.25]);
  });

  it('is refused with the path of each problem', () => {
    const body = JSON.parse(JSON.stringify(encodeResultBody(outcome, '1.2.3'))) as {
      summary: Record<string, unknown> & { channels: Array<Record<string, unknown>> };
      series: Record<string, string>;
    };
    body.summary.bandSource = 'guess';
    body.summary.channels[0].inRoi = 'yes';
    delete body.series['rest:powerUv2PerHz'];
    const parsed = parseResultBody(body);
    expect(parsed.ok).toBe(false);
    if (parsed.ok) return;
    expect(parsed.problems).toEqual(
      expect.arrayContaining([
        expect.stringMatching(/^summary\.bandSource: must be one of/),
        'summary.channels.0.inRoi: must be a boolean value',
      ]),
    );
    // Sizes are checked once the shape is right.
    body.summary.bandSource = 'default';
    body.summary.channels[0].inRoi = true;
    const sized = parseResultBody(body);
    expect(sized.ok ? [] : sized.problems).toEqual([
      'series.rest:powerUv2PerHz: missing (one power per frequency)',
    ]);
  });
});

describe('BullMQ job ids', () => {
  it('name one attempt of one job, and nothing else parses', () => {
    const ref = { jobId: '0b7c2a52-3f0e-4c1e-9d55-8d3f6f0c2a11', attempt: 2 };
    expect(remoteJobId(ref)).toBe('0b7c2a52-3f0e-4c1e-9d55-8d3f6f0c2a11.2');
    expect(parseRemoteJobId(remoteJobId(ref))).toEqual(ref);
    for (const id of [
      undefined,
      '',
      'repeat:1',
      `${ref.jobId}.0`,
      `${ref.jobId}.x`,
      `${ref.jobId}`,
    ]) {
      expect(parseRemoteJobId(id)).toBeNull();
    }
  });
});
