#!/usr/bin/env python3
"""The numpy/scipy side of `npm run bench`: Gyre's analysis of a task recording, written
the way a numpy/scipy user would write it, on the same EDF+ file.

    python3 bench/scipy_pipeline.py FILE.edf --params JSON [--processes 1|2]

`--params` carries Gyre's defaults as the benchmark reads them from Gyre's code (band,
transition zones, edge padding, median windows, epoch and statistics windows, Welch
segment, region of interest, ...), so both sides compute with the same numbers.

Steps, per channel: read the EDF+ with numpy (header, records, physical scaling; the
annotation signal's TALs for the stimulus onsets); flat and saturation checks; Welch
spectrum (scipy.signal.welch) and line-noise ratios; band-pass analytic signal by one
FFT pair with Gyre's plateau weights (scipy.fft); instantaneous frequency from
numpy.angle(z[n+1] conj z[n]); ten running medians (scipy.ndimage.median_filter,
mode 'reflect') and the median across them; epochs around the onsets with Gyre's edge
and amplitude rules; baseline and post means per trial; bootstrap interval of the mean
delta-f (numpy, seeded, percentile) and scipy.stats.wilcoxon; the onset curve. Then the
region-of-interest average with the same statistics and its mean spectrum's alpha peak.

With `--processes 2` the channels are split in halves and two forked processes each read
and compute their own half; the parent reads the header and the onsets and combines the
region of interest. Prints one JSON object on stdout: wall and CPU time per step and in
total, peak memory, the versions, and the numbers for the agreement check.

CPU time is resource.getrusage of the process itself plus its waited-for children, from
the moment the work starts (interpreter start and imports are left out, as Gyre's server
start is). Peak memory is ru_maxrss: of the process itself with one process; with two,
the sum of the two children's peaks (each counts the pages it shares with the parent, so
the sum overstates a little), the parent's own peak reported apart.
"""

import os

# One thread per process: "single-process" means one core, as in Gyre's worker threads.
for _name in ("OMP_NUM_THREADS", "OPENBLAS_NUM_THREADS", "MKL_NUM_THREADS"):
    os.environ.setdefault(_name, "1")

import argparse  # noqa: E402
import json  # noqa: E402
import multiprocessing  # noqa: E402
import re  # noqa: E402
import resource  # noqa: E402
import sys  # noqa: E402
import time  # noqa: E402

import numpy as np  # noqa: E402
import scipy  # noqa: E402
import scipy.fft  # noqa: E402
import scipy.ndimage  # noqa: E402
import scipy.signal  # noqa: E402
import scipy.stats  # noqa: E402

# Gyre's plateau response: one definition with the fixture generator, in backend/scripts.
sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "backend", "scripts"))
from plateau_weight import plateau_weight  # noqa: E402


class Steps:
    """Wall and CPU seconds accumulated per named step."""

    def __init__(self):
        self.wall = {}
        self.cpu = {}

    def run(self, name, fn, *args):
        w0, c0 = time.perf_counter(), time.process_time()
        out = fn(*args)
        self.wall[name] = self.wall.get(name, 0.0) + time.perf_counter() - w0
        self.cpu[name] = self.cpu.get(name, 0.0) + time.process_time() - c0
        return out

    def add(self, other):
        for name, value in other["wallS"].items():
            self.wall[name] = self.wall.get(name, 0.0) + value
        for name, value in other["cpuS"].items():
            self.cpu[name] = self.cpu.get(name, 0.0) + value


def js_round(v):
    """Math.round of JavaScript (half up), which Gyre uses for sample indices."""
    return np.floor(np.asarray(v, dtype=np.float64) + 0.5).astype(np.int64)


# --- EDF / EDF+ (Kemp et al. 1992; Kemp & Olivan 2003) ------------------------------------


def read_header(path):
    with open(path, "rb") as handle:
        fixed = handle.read(256)
        ns = int(fixed[252:256].decode("ascii").strip())
        rest = handle.read(256 * ns)
    reserved = fixed[192:236].decode("ascii").strip()
    if reserved.startswith("EDF+D"):
        sys.exit("scipy_pipeline.py: an EDF+D file (with gaps) is not handled; the benchmark writes EDF+C")

    def field(offset, width):
        base = offset * ns
        return [rest[base + i * width: base + (i + 1) * width].decode("latin-1").strip() for i in range(ns)]

    spr = [int(v) for v in field(216, 8)]
    signals = []
    start = 0
    for i, (label, unit, pmin, pmax, dmin, dmax) in enumerate(
        zip(field(0, 16), field(96, 8), field(104, 8), field(112, 8), field(120, 8), field(128, 8))
    ):
        signals.append({
            "index": i, "label": label, "unit": unit, "spr": spr[i], "start": start,
            "pmin": float(pmin), "pmax": float(pmax), "dmin": float(dmin), "dmax": float(dmax),
        })
        start += spr[i]
    records = int(fixed[236:244].decode("ascii").strip())
    record_s = float(fixed[244:252].decode("ascii").strip())
    return {
        "headerBytes": int(fixed[184:192].decode("ascii").strip()),
        "records": records, "recordS": record_s, "durationS": records * record_s,
        "recordSamples": start, "signals": signals,
    }


def record_view(path, header):
    """All data records as a (records, samples per record) int16 view, mapped from the file."""
    return np.memmap(path, dtype="<i2", mode="r", offset=header["headerBytes"],
                     shape=(header["records"], header["recordSamples"]))


def physical(records, signal):
    """One signal's physical values, float64 (Kemp et al. 1992's formula)."""
    digital = np.asarray(records[:, signal["start"]: signal["start"] + signal["spr"]]).reshape(-1)
    gain = (signal["pmax"] - signal["pmin"]) / (signal["dmax"] - signal["dmin"])
    return (digital.astype(np.float64) - signal["dmin"]) * gain + signal["pmin"]


def annotations(records, header):
    """(onset s, duration s or None, text) of every TAL text in the annotation signals."""
    found = []
    for signal in header["signals"]:
        if signal["label"] != "EDF Annotations":
            continue
        block = np.ascontiguousarray(records[:, signal["start"]: signal["start"] + signal["spr"]])
        for record in block:
            for tal in record.tobytes().split(b"\x00"):
                if not tal:
                    continue
                parts = tal.split(b"\x14")
                onset, _, duration = parts[0].partition(b"\x15")
                for text in parts[1:]:
                    if text:
                        found.append((float(onset), float(duration) if duration else None,
                                      text.decode("utf-8")))
    return found


# --- Onsets and trials (docs/method.md §3) -------------------------------------------------


def onsets_and_screen(notes, header, p):
    artefact = re.compile(p["artefactPattern"], re.IGNORECASE)
    onsets = sorted(t for t, d, text in notes
                    if text.strip() and not artefact.search(text) and (d or 0) < p["maxStimulusDurationS"])
    spans = [(t, t + max(0.0, d or 0.0)) for t, d, text in notes if artefact.search(text)]
    e0, e1 = p["epochWindowS"]
    guard, end_s = p["edgeGuardS"], header["durationS"]
    reasons = []
    for t in onsets:
        start, stop = t + e0, t + e1
        if not (start >= guard and stop <= end_s - guard):
            reasons.append("edge")
        elif any(a <= stop and b >= start for a, b in spans):
            reasons.append("artefact")
        else:
            reasons.append(None)
    return np.asarray(onsets, dtype=np.float64), reasons


def point_range(p, fs, window):
    e0 = p["epochWindowS"][0]
    return (max(0, int(np.ceil((window[0] - e0) * fs - 1e-9))), int(np.ceil((window[1] - e0) * fs - 1e-9)))


def point_count(p, fs):
    e0, e1 = p["epochWindowS"]
    return int(np.floor((e1 - e0) * fs + 1e-9)) + 1


# --- Per channel ---------------------------------------------------------------------------


def quality(x, signal, p):
    sd = float(np.std(x))
    half_step = abs(signal["pmax"] - signal["pmin"]) / abs(signal["dmax"] - signal["dmin"]) / 2
    low = min(signal["pmin"], signal["pmax"]) + half_step
    high = max(signal["pmin"], signal["pmax"]) - half_step
    at = np.where(x <= low, -1, np.where(x >= high, 1, 0)).astype(np.int8)
    change = np.flatnonzero(np.diff(at)) + 1
    starts = np.concatenate(([0], change))
    lengths = np.diff(np.concatenate((starts, [x.size])))
    in_runs = lengths[(at[starts] != 0) & (lengths >= p["saturationMinRunSamples"])].sum()
    share = float(in_runs) / x.size
    return {"sd": sd, "flat": sd < p["flatBelowUv"], "saturatedShare": share,
            "saturated": share > p["saturatedAboveShare"]}


def spectrum(x, fs, p):
    nperseg = int(round(p["welchSegmentS"] * fs))
    if x.size < nperseg:
        return None
    return scipy.signal.welch(x, fs=fs, window="hann", nperseg=nperseg,
                              noverlap=int(np.floor(nperseg * p["welchOverlapFraction"])),
                              detrend="constant", scaling="density")


def line_noise(spec, line_hz):
    f, pxx = spec
    if line_hz + 6 > f[-1]:
        return None
    d = np.abs(f - line_hz)
    line, side = pxx[d <= 1], pxx[(d >= 2) & (d <= 6)]
    if line.size == 0 or side.size == 0 or not side.sum() > 0:
        return None
    return float(line.mean() / side.mean())


def band_pass_analytic(x, fs, p):
    """Mirror-padded, one rfft, Gyre's plateau weight doubled for 0 < k < M/2, one ifft."""
    n = x.size
    pad = min(n - 1, int(np.ceil(p["edgePaddingS"] * fs)))
    padded = np.concatenate([x[pad:0:-1], x, x[-2:-pad - 2:-1]])
    m = scipy.fft.next_fast_len(padded.size, real=True)
    spec = scipy.fft.rfft(padded, n=m)
    low, high = p["bandHz"]
    weight = plateau_weight(np.arange(spec.size) * fs / m, low, high, p["transitionFraction"])
    weight[1:(m + 1) // 2] *= 2
    full = np.zeros(m, dtype=np.complex128)
    full[: spec.size] = spec * weight
    return scipy.fft.ifft(full)[pad: pad + n]


def instantaneous_frequency(z, fs):
    return np.angle(z[1:] * np.conj(z[:-1])) * (fs / (2 * np.pi))


def median_of_medians(raw, windows, scratch):
    for i, w in enumerate(windows):
        scipy.ndimage.median_filter(raw, size=w, mode="reflect", output=scratch[i])
    return np.median(scratch, axis=0)


def amplitude_drops(x, fs, onsets, reasons, p, limit):
    """Per trial: 'amplitude' when the raw, mean-removed epoch exceeds +-limit."""
    e0, e1 = p["epochWindowS"]
    out = list(reasons)
    candidates = [i for i, r in enumerate(reasons) if r is None]
    if not candidates:
        return out
    first = np.maximum(0, js_round((onsets[candidates] + e0) * fs))
    last = np.minimum(x.size - 1, js_round((onsets[candidates] + e1) * fs))
    width = int((last - first).max()) + 1
    idx = first[:, None] + np.arange(width)[None, :]
    valid = idx <= last[:, None]
    seg = np.where(valid, x[np.minimum(idx, x.size - 1)], 0.0)
    mean = seg.sum(axis=1) / valid.sum(axis=1)
    exceeds = (np.abs(seg - mean[:, None]) > limit) & valid
    for k, trial in enumerate(candidates):
        if exceeds[k].any():
            out[trial] = "amplitude"
    return out


def cut_epochs(freq, fs, onsets, p):
    points = point_count(p, fs)
    j0 = js_round((onsets + p["epochWindowS"][0] - 0.5 / fs) * fs)
    j = j0[:, None] + np.arange(points)[None, :]
    inside = (j >= 0) & (j < freq.size)
    return np.where(inside, freq[np.clip(j, 0, freq.size - 1)], np.nan)


def bootstrap_interval(delta, p):
    rng = np.random.default_rng(p["bootstrapSeed"])
    idx = rng.integers(0, delta.size, size=(p["bootstrapResamples"], delta.size))
    means = delta[idx].mean(axis=1)
    return [float(v) for v in np.quantile(means, [0.025, 0.975])]


def summarise(epochs, kept, reasons, fs, p):
    """Baseline, post, delta-f, bootstrap CI, Wilcoxon p and the onset curve (docs/method.md §3)."""
    b0, b1 = point_range(p, fs, p["baselineWindowS"])
    q0, q1 = point_range(p, fs, p["postWindowS"])
    rows = epochs[kept]
    out = {"trialsKept": len(kept), "trialsDropped": len(reasons) - len(kept),
           "baselineHz": None, "postHz": None, "deltaFHz": None, "ciHz": None, "pValue": None,
           "suggestsSlowing": False}
    if len(kept) == 0:
        return out
    with np.errstate(invalid="ignore"):
        base = np.nanmean(rows[:, b0:b1], axis=1)
        post = np.nanmean(rows[:, q0:q1], axis=1)
    delta = post - base
    ci = bootstrap_interval(delta, p)
    p_value = None
    if np.any(delta != 0):
        p_value = float(scipy.stats.wilcoxon(delta, zero_method="wilcox", correction=False).pvalue)
    d = float(delta.mean())
    out.update(baselineHz=float(base.mean()), postHz=float(post.mean()), deltaFHz=d, ciHz=ci,
               pValue=p_value, suggestsSlowing=d <= p["flagThresholdHz"] and ci[1] < 0)
    # Onset curve: consecutive points averaged down to at most maxCurvePoints, mean +- 1.96 SEM.
    points = rows.shape[1]
    factor = max(1, int(np.ceil(points / p["maxCurvePoints"])))
    starts = np.arange(0, points, factor)
    counts = np.diff(np.concatenate((starts, [points])))
    binned = np.add.reduceat(rows, starts, axis=1) / counts
    mean = binned.mean(axis=0)
    sem = binned.std(axis=0, ddof=1) / np.sqrt(binned.shape[0]) if binned.shape[0] > 1 else np.nan
    out["curve"] = {"points": int(mean.size), "lowerFirstHz": float((mean - 1.96 * sem)[0])}
    return out


def analyse_channel(x, signal, fs, onsets, reasons, p, windows, scratch, steps):
    q = steps.run("quality", quality, x, signal, p)
    spec = steps.run("welch", spectrum, x, fs, p)
    result = {"label": signal["label"], "flat": q["flat"], "saturated": q["saturated"],
              "lineNoiseRatio50Hz": line_noise(spec, 50) if spec else None,
              "lineNoiseRatio60Hz": line_noise(spec, 60) if spec else None}
    z = steps.run("bandPassAnalytic", band_pass_analytic, x, fs, p)
    raw = steps.run("frequency", instantaneous_frequency, z, fs)
    del z
    freq = steps.run("median", median_of_medians, raw, windows, scratch)
    low, high = p["bandHz"]
    result["phaseSlipShare"] = float(np.mean((raw < low) | (raw > high)))
    limit = p["rejectionThresholdUv"] / (1e3 if signal["unit"] == "mV" else 1.0)

    def epochs_and_statistics():
        trial_reasons = amplitude_drops(x, fs, onsets, reasons, p, limit)
        kept = [i for i, r in enumerate(trial_reasons) if r is None]
        epochs = cut_epochs(freq, fs, onsets, p)
        return epochs, kept, summarise(epochs, kept, trial_reasons, fs, p)

    epochs, kept, stats = steps.run("epochsStatistics", epochs_and_statistics)
    result.update(stats)
    return result, epochs, kept, spec


def canonical(label):
    """A plain 10-10 name from labels such as 'O1', 'EEG O1-REF' (enough for generated files)."""
    name = label.strip()
    if name.upper().startswith("EEG "):
        name = name[4:]
    return name.split("-")[0].strip().upper()


def analyse_channels(path, header, chosen, onsets, reasons, p):
    """Reads and analyses the signals `chosen` (indices); returns the per-channel results and
    the region-of-interest sums of this part."""
    steps = Steps()
    roi_names = {n.upper() for n in p["roi"]}
    records = steps.run("readEdf", record_view, path, header)
    windows = None
    scratch = None
    results = []
    roi = {"sum": None, "count": np.zeros(len(onsets), dtype=np.int64), "spectra": [], "channels": []}
    for index in chosen:
        signal = header["signals"][index]
        fs = signal["spr"] / header["recordS"]
        x = steps.run("readEdf", physical, records, signal)
        if windows is None:
            windows = p["medianWindows"]
            scratch = np.empty((len(windows), x.size - 1))
        result, epochs, kept, spec = analyse_channel(x, signal, fs, onsets, reasons, p, windows, scratch, steps)
        in_roi = canonical(signal["label"]) in roi_names and not result["flat"] and not result["saturated"]
        result["inRoi"] = in_roi
        if in_roi:
            if roi["sum"] is None:
                roi["sum"] = np.zeros_like(epochs)
            roi["sum"][kept] += epochs[kept]
            roi["count"][kept] += 1
            if spec is not None:
                roi["spectra"].append(spec)
            roi["channels"].append(signal["label"])
        results.append(result)
    return {"channels": results, "roi": roi, "wallS": steps.wall, "cpuS": steps.cpu,
            "peakRssMb": resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024}


def alpha_peak_prominence(freqs, power, p):
    """Height of the highest 7-13 Hz bin over a log-log line fitted to 2-40 Hz without 6-14 Hz."""
    fit_high = min(40.0, 0.8 * freqs[-1])
    use = (freqs >= 2) & (freqs <= fit_high) & ~((freqs >= 6) & (freqs <= 14)) & (power > 0)
    slope, intercept = np.polyfit(np.log10(freqs[use]), np.log10(power[use]), 1)
    search = (freqs >= p["alphaSearchHz"][0]) & (freqs <= p["alphaSearchHz"][1])
    best = np.flatnonzero(search)[np.argmax(power[search])]
    return float(10 * (np.log10(power[best]) - (intercept + slope * np.log10(freqs[best]))))


def combine_roi(parts, onsets, reasons, fs, p, steps):
    def run():
        sums = [part["roi"]["sum"] for part in parts if part["roi"]["sum"] is not None]
        count = sum(part["roi"]["count"] for part in parts)
        spectra = [s for part in parts for s in part["roi"]["spectra"]]
        channels = [c for part in parts for c in part["roi"]["channels"]]
        if not sums:
            return {"channels": channels, "deltaFHz": None}
        total = np.sum(sums, axis=0)
        roi_reasons = [r if r is not None else (None if count[i] > 0 else "amplitude") for i, r in enumerate(reasons)]
        kept = [i for i, r in enumerate(roi_reasons) if r is None]
        total[kept] /= count[kept][:, None]
        out = summarise(total, kept, roi_reasons, fs, p)
        out["channels"] = channels
        if spectra:
            mean_power = np.mean([s[1] for s in spectra], axis=0)
            out["alphaPeakProminenceDb"] = alpha_peak_prominence(spectra[0][0], mean_power, p)
        return out

    return steps.run("roi", run)


def part_worker(job):
    path, header, chosen, onsets, reasons, p = job
    return analyse_channels(path, header, chosen, onsets, reasons, p)


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("edf")
    parser.add_argument("--params", required=True, help="Gyre's settings as JSON (see npm run bench)")
    parser.add_argument("--processes", type=int, choices=(1, 2), default=1)
    args = parser.parse_args()
    p = json.loads(args.params)

    usage0 = [resource.getrusage(who) for who in (resource.RUSAGE_SELF, resource.RUSAGE_CHILDREN)]
    wall0 = time.perf_counter()
    steps = Steps()
    header = steps.run("readEdf", read_header, args.edf)
    records = steps.run("readEdf", record_view, args.edf, header)
    notes = steps.run("readEdf", annotations, records, header)
    del records
    onsets, reasons = onsets_and_screen(notes, header, p)
    chosen = [s["index"] for s in header["signals"] if s["label"] != "EDF Annotations"]
    fs = header["signals"][chosen[0]]["spr"] / header["recordS"]
    if args.processes == 1:
        parts = [analyse_channels(args.edf, header, chosen, onsets, reasons, p)]
        steps.add(parts[0])
        peak = {"processMb": resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024}
    else:
        half = (len(chosen) + 1) // 2
        jobs = [(args.edf, header, chosen[:half], onsets, reasons, p),
                (args.edf, header, chosen[half:], onsets, reasons, p)]
        # Forked after numpy and scipy are imported: the children do not import them again.
        with multiprocessing.get_context("fork").Pool(2) as pool:
            parts = pool.map(part_worker, jobs, chunksize=1)
            pool.close()
            pool.join()
        peak = {"childrenMb": [part["peakRssMb"] for part in parts],
                "parentMb": resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024}
        peak["processMb"] = sum(peak["childrenMb"])
    roi = combine_roi(parts, onsets, reasons, fs, p, steps)
    wall = time.perf_counter() - wall0
    usage1 = [resource.getrusage(who) for who in (resource.RUSAGE_SELF, resource.RUSAGE_CHILDREN)]
    cpu = sum((u1.ru_utime + u1.ru_stime) - (u0.ru_utime + u0.ru_stime) for u0, u1 in zip(usage0, usage1))
    channels = [c for part in parts for c in part["channels"]]
    child_steps = Steps()
    for part in parts:
        child_steps.add(part)
    print(json.dumps({
        "python": sys.version.split()[0], "numpy": np.__version__, "scipy": scipy.__version__,
        "processes": args.processes, "channels": len(channels), "onsets": len(onsets),
        "wallS": wall, "cpuS": cpu,
        # One process: wall and CPU per step. Two: the parent's own steps, and the children's
        # steps summed over both children (so their wall adds up to more than the total).
        "stepWallS": steps.wall if args.processes == 1 else {"parent": steps.wall, "children": child_steps.wall},
        "stepCpuS": steps.cpu if args.processes == 1 else {"parent": steps.cpu, "children": child_steps.cpu},
        "peakRssMb": peak,
        "roi": roi,
        "channelResults": [{k: c[k] for k in ("label", "inRoi", "deltaFHz", "pValue", "trialsKept")}
                           for c in channels],
    }))


if __name__ == "__main__":
    main()
