#!/usr/bin/env python3
"""The numpy/scipy side of `npm run bench:signal`: the same steps as Gyre's
frequency sliding on the same EDF file, single-threaded, with wall and CPU time per stage.

    python3 bench_scipy.py FILE.edf --band 8,13 --transition 0.15 --padding-s 3.3334 \
        --windows 5,27,... [--check-out FILE.f64]

Stages per channel: (1) mirror padding, scipy.fft.rfft, one multiplication by the
plateau weight and the analytic-signal factor, scipy.fft.ifft; (2) frequency from
numpy.angle(z[n+1]·conj z[n]); (3) scipy.ndimage.median_filter for each window and
numpy.median across them. Prints one JSON object on stdout: wall time
(time.perf_counter) and CPU time of the process (time.process_time) per stage.
"""

import argparse
import json
import resource
import time

import numpy as np
import scipy
import scipy.fft
import scipy.ndimage

from plateau_weight import plateau_weight


def read_edf(path):
    """Minimal EDF reader (Kemp et al. 1992): ordinary signals as float64 physical values."""
    with open(path, "rb") as handle:
        data = handle.read()
    ns = int(data[252:256].decode().strip())
    records = int(data[236:244].decode().strip())
    record_s = float(data[244:252].decode().strip())

    def field(offset, width):
        base = 256 + offset * ns
        return [data[base + i * width: base + (i + 1) * width].decode("latin-1").strip() for i in range(ns)]

    labels = field(0, 16)
    pmin = [float(v) for v in field(104, 8)]
    pmax = [float(v) for v in field(112, 8)]
    dmin = [float(v) for v in field(120, 8)]
    dmax = [float(v) for v in field(128, 8)]
    spr = [int(v) for v in field(216, 8)]
    header_bytes = 256 * (ns + 1)
    raw = np.frombuffer(data, dtype="<i2", offset=header_bytes).reshape(records, sum(spr))
    signals = []
    start = 0
    for i in range(ns):
        if labels[i] != "EDF Annotations":
            gain = (pmax[i] - pmin[i]) / (dmax[i] - dmin[i])
            # Converted when used, channel by channel, as Gyre's worker would hold them.
            signals.append((labels[i], spr[i] / record_s, raw[:, start:start + spr[i]], gain, dmin[i], pmin[i]))
        start += spr[i]
    return signals


def physical(signal):
    _label, _fs, digital, gain, dmin, pmin = signal
    return (digital.reshape(-1).astype(np.float64) - dmin) * gain + pmin


def main():
    parser = argparse.ArgumentParser()
    parser.add_argument("edf")
    parser.add_argument("--band", required=True)
    parser.add_argument("--transition", type=float, required=True)
    parser.add_argument("--padding-s", type=float, required=True)
    parser.add_argument("--windows", required=True)
    parser.add_argument("--check-out", default=None)
    args = parser.parse_args()
    low, high = (float(v) for v in args.band.split(","))
    windows = [int(v) for v in args.windows.split(",")]

    t0 = time.perf_counter()
    signals = read_edf(args.edf)
    read_s = time.perf_counter() - t0
    stage = {"bandPassAnalytic": 0.0, "frequency": 0.0, "median": 0.0}
    stage_cpu = dict(stage)
    filtered = np.empty((len(windows), 0))
    for index, signal in enumerate(signals):
        fs = signal[1]
        x = physical(signal)
        n = x.size
        t = time.perf_counter()
        c = time.process_time()
        pad = min(n - 1, int(np.ceil(args.padding_s * fs)))
        padded = np.concatenate([x[pad:0:-1], x, x[-2:-pad - 2:-1]])
        m = scipy.fft.next_fast_len(padded.size, real=True)
        spectrum = scipy.fft.rfft(padded, n=m)
        weight = plateau_weight(np.arange(spectrum.size) * fs / m, low, high, args.transition)
        weight[1:(m + 1) // 2] *= 2
        full = np.zeros(m, dtype=np.complex128)
        full[: spectrum.size] = spectrum * weight
        z = scipy.fft.ifft(full)[pad: pad + n]
        t1 = time.perf_counter()
        c1 = time.process_time()
        frequency = np.angle(z[1:] * np.conj(z[:-1])) * (fs / (2 * np.pi))
        t2 = time.perf_counter()
        c2 = time.process_time()
        if filtered.shape[1] != frequency.size:
            filtered = np.empty((len(windows), frequency.size))
        for i, w in enumerate(windows):
            scipy.ndimage.median_filter(frequency, size=w, mode="reflect", output=filtered[i])
        result = np.median(filtered, axis=0)
        t3 = time.perf_counter()
        c3 = time.process_time()
        stage["bandPassAnalytic"] += t1 - t
        stage["frequency"] += t2 - t1
        stage["median"] += t3 - t2
        stage_cpu["bandPassAnalytic"] += c1 - c
        stage_cpu["frequency"] += c2 - c1
        stage_cpu["median"] += c3 - c2
        if index == 0 and args.check_out:
            result.astype("<f8").tofile(args.check_out)
    peak_kb = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss
    print(json.dumps({
        "numpy": np.__version__,
        "scipy": scipy.__version__,
        "channels": len(signals),
        "readEdfS": read_s,
        "stagesS": stage,
        "stagesCpuS": stage_cpu,
        "peakRssMb": peak_kb / 1024,
    }))


if __name__ == "__main__":
    main()
