#!/usr/bin/env python3
"""Reference vectors for Gyre's signal-core tests, computed with numpy/scipy.

Every input is generated here, deterministically (numpy default_rng with fixed
seeds), rounded to 13 significant digits so that the committed JSON is byte-stable;
outputs are computed from the rounded inputs and rounded the same way (the tests
compare with relative tolerances of 1e-9, far above that rounding).

    python3 backend/scripts/scipy_reference.py --out backend/test/fixtures/scipy

CI regenerates the fixtures and fails when they differ from the committed ones.
"""

import argparse
import json
import os
import sys
import warnings

import numpy as np
import scipy
import scipy.ndimage
import scipy.signal
import scipy.stats

from plateau_weight import plateau_weight

SIGNIFICANT_DIGITS = 13


def stable(values):
    """Floats rounded to 13 significant digits, as Python floats (written with repr)."""
    arr = np.asarray(values, dtype=np.float64).ravel()
    return [float(f"{v:.{SIGNIFICANT_DIGITS - 1}e}") for v in arr.tolist()]


def rounded(values):
    return np.asarray(stable(values), dtype=np.float64).reshape(np.shape(values))


def hilbert_case():
    rng = np.random.default_rng(20240301)
    fs, n = 250.0, 4096
    t = np.arange(n) / fs
    x = (
        20 * np.sin(2 * np.pi * 10.2 * t + 0.3)
        + 8 * np.sin(2 * np.pi * 3.1 * t)
        + 5 * np.sin(2 * np.pi * 31.0 * t + 1.0)
        + rng.standard_normal(n) * 4
    )
    x = rounded(x)
    analytic = scipy.signal.hilbert(x)
    spectrum = np.fft.rfft(x)
    band = plateau_weight(np.fft.rfftfreq(n, 1 / fs), 8.0, 13.0)
    band_passed = np.fft.irfft(spectrum * band, n)
    analytic_band = scipy.signal.hilbert(band_passed)
    return {
        "source": "scipy.signal.hilbert (scipy %s); band-pass by numpy.fft.rfft/irfft" % scipy.__version__,
        "sampleRateHz": fs,
        "bandHz": [8.0, 13.0],
        "transitionFraction": 0.15,
        "input": stable(x),
        "analyticRe": stable(analytic.real),
        "analyticIm": stable(analytic.imag),
        "bandPassed": stable(band_passed),
        "bandAnalyticIm": stable(analytic_band.imag),
    }


def unwrap_case():
    rng = np.random.default_rng(20240302)
    fs, n = 500.0, 3000
    t = np.arange(n) / fs
    freq = 10 + 1.5 * np.sin(2 * np.pi * 0.7 * t) + rng.standard_normal(n) * 0.5
    phase_true = 2 * np.pi * np.cumsum(freq) / fs
    amplitude = 1 + 0.5 * rng.random(n)
    re = rounded(amplitude * np.cos(phase_true))
    im = rounded(amplitude * np.sin(phase_true))
    wrapped = np.angle(re + 1j * im)
    unwrapped = np.unwrap(wrapped)
    frequency = np.diff(unwrapped) * fs / (2 * np.pi)
    return {
        "source": "numpy.angle, numpy.unwrap, numpy.diff (numpy %s)" % np.__version__,
        "sampleRateHz": fs,
        "re": stable(re),
        "im": stable(im),
        "wrappedPhase": stable(wrapped),
        "unwrappedPhase": stable(unwrapped),
        "frequencyHz": stable(frequency),
    }


def median_case():
    rng = np.random.default_rng(20240303)
    n = 1500
    # Values on a 0.01 Hz grid, so ties occur as they do in real frequency series.
    x = np.round(10 + np.cumsum(rng.standard_normal(n)) * 0.05 + rng.standard_normal(n) * 0.4, 2)
    x[700:720] = 10.0  # a flat run
    x[900] = 40.0  # a phase-slip spike
    x = rounded(x)
    windows = [5, 27, 49, 71, 93, 113, 135, 157, 179, 201]
    filtered = [scipy.ndimage.median_filter(x, size=w, mode="reflect") for w in windows]
    across = np.median(np.stack(filtered), axis=0)
    return {
        "source": "scipy.ndimage.median_filter(mode='reflect') and numpy.median(axis=0) (scipy %s)"
        % scipy.__version__,
        "input": stable(x),
        "windowsSamples": windows,
        "filtered": [stable(f) for f in filtered],
        "medianAcross": stable(across),
    }


def nan_median_case():
    """Running medians that leave NaN out (the amplitude gate's), NaN written as null."""
    rng = np.random.default_rng(20261202)
    n = 600
    x = np.round(10 + np.cumsum(rng.standard_normal(n)) * 0.05 + rng.standard_normal(n) * 0.4, 2)
    x = rounded(x)
    x[rng.random(n) < 0.3] = np.nan  # scattered gaps, some windows of an even count
    x[200:260] = np.nan  # a gap longer than the short windows: all-NaN windows
    x[0:3] = np.nan  # a gap at the mirrored edge
    windows = [1, 5, 27, 49, 71]
    with warnings.catch_warnings():
        warnings.simplefilter("ignore", RuntimeWarning)  # all-NaN windows give NaN, as wanted
        filtered = [scipy.ndimage.generic_filter(x, np.nanmedian, size=w, mode="reflect") for w in windows]
    nullable = lambda values: [None if np.isnan(v) else v for v in stable(values)]
    return {
        "source": "scipy.ndimage.generic_filter(numpy.nanmedian, mode='reflect') (scipy %s)" % scipy.__version__,
        "input": nullable(x),
        "windowsSamples": windows,
        "filtered": [nullable(f) for f in filtered],
    }


def welch_case(fs, seconds, seed):
    rng = np.random.default_rng(seed)
    n = int(fs * seconds)
    t = np.arange(n) / fs
    x = 15 * np.sin(2 * np.pi * 10.3 * t) + 30 + np.cumsum(rng.standard_normal(n)) * 0.3
    x += rng.standard_normal(n) * 5 + 2 * np.sin(2 * np.pi * 50 * t)
    x = rounded(x)
    nperseg = int(round(4 * fs))
    f, p = scipy.signal.welch(
        x, fs=fs, window="hann", nperseg=nperseg, noverlap=nperseg // 2,
        detrend="constant", scaling="density",
    )
    return {
        "source": "scipy.signal.welch(window='hann', nperseg=4 s, noverlap=50 %%, detrend='constant', "
        "scaling='density') (scipy %s)" % scipy.__version__,
        "sampleRateHz": fs,
        "segmentS": 4.0,
        "overlapFraction": 0.5,
        "input": stable(x),
        "frequencyHz": stable(f),
        "powerPerHz": stable(p),
    }


def rfft_cases():
    """numpy.fft.rfft at the lengths Welch's segments take (4 s at 250, 256, 312.5 and 500 Hz),
    a prime length and an even length whose half is prime (Gyre's Bluestein fallback), and an
    odd length with small factors."""
    rng = np.random.default_rng(20240307)
    cases = []
    for n in [1000, 2000, 1024, 1250, 1009, 1006, 375]:
        t = np.arange(n)
        x = rounded(rng.standard_normal(n) * 5 + 20 * np.sin(2 * np.pi * 10.3 * t / n) + 3)
        spectrum = np.fft.rfft(x)
        cases.append({
            "size": n,
            "input": stable(x),
            "re": stable(spectrum.real),
            "im": stable(spectrum.imag),
        })
    return {"source": "numpy.fft.rfft (numpy %s)" % np.__version__, "cases": cases}


def wilcoxon_cases():
    rng = np.random.default_rng(20240305)
    inputs = {
        "exact-n10": rng.standard_normal(10) - 0.5,
        "exact-n30": rng.standard_normal(30) * 0.3 - 0.1,
        "exact-n50": rng.standard_normal(50) * 0.2 + 0.05,
        "permutation-ties-n12": np.round(rng.standard_normal(12), 1) - 0.3,
        "permutation-zero-n9": np.concatenate([[0.0], rng.standard_normal(8) - 0.8]),
        "normal-ties-n40": np.round(rng.standard_normal(40) * 0.4 - 0.15, 1),
        "normal-n51": rng.standard_normal(51) * 0.3 - 0.05,
        "normal-zeros-n120": np.round(rng.standard_normal(120) * 0.5 - 0.1, 1),
    }
    cases = []
    for name, d in inputs.items():
        d = rounded(d)
        res = scipy.stats.wilcoxon(d)
        cases.append({
            "name": name,
            "differences": stable(d),
            "statistic": float(res.statistic),
            "pValue": stable([res.pvalue])[0],
        })
    return {"source": "scipy.stats.wilcoxon defaults (scipy %s)" % scipy.__version__, "cases": cases}


def write(out_dir, name, payload):
    path = os.path.join(out_dir, name)
    with open(path, "w", encoding="utf-8") as handle:
        json.dump(payload, handle, separators=(",", ":"))
        handle.write("\n")
    print(f"wrote {path}", file=sys.stderr)


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    default_out = os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "test", "fixtures", "scipy")
    parser.add_argument("--out", default=default_out, help="folder for the JSON fixtures")
    args = parser.parse_args()
    os.makedirs(args.out, exist_ok=True)
    write(args.out, "hilbert.json", hilbert_case())
    write(args.out, "unwrap.json", unwrap_case())
    write(args.out, "median-filter.json", median_case())
    write(args.out, "nan-median-filter.json", nan_median_case())
    write(args.out, "welch-250hz.json", welch_case(250.0, 30, 20240304))
    write(args.out, "welch-256hz.json", welch_case(256.0, 20, 20240306))
    write(args.out, "wilcoxon.json", wilcoxon_cases())
    write(args.out, "rfft.json", rfft_cases())


if __name__ == "__main__":
    main()
