"""Reference measurements of generated demo recordings with numpy/scipy (Debian
python3-numpy, python3-scipy), independent of Gyre's own reader and signal code.

Reads one JSON request on stdin and writes one JSON answer on stdout. The EDF/EDF+
parsing follows the specifications directly: Kemp et al. 1992 (header, records,
physical = (digital - dmin) * (pmax - pmin) / (dmax - dmin) + pmin) and Kemp & Olivan
2003 (TALs in the 'EDF Annotations' signal).
"""
import json
import sys

import numpy as np
from scipy import signal


def read_edf(path):
    data = open(path, 'rb').read()
    ns = int(data[252:256])
    record_count = int(data[236:244])
    record_s = float(data[244:252])
    fields = {}
    pos = 256
    for name, width in [('label', 16), ('transducer', 80), ('dimension', 8),
                        ('pmin', 8), ('pmax', 8), ('dmin', 8), ('dmax', 8),
                        ('prefiltering', 80), ('spr', 8), ('reserved', 32)]:
        fields[name] = [data[pos + i * width: pos + (i + 1) * width].decode('ascii').strip()
                        for i in range(ns)]
        pos += width * ns
    spr = [int(s) for s in fields['spr']]
    header_bytes = int(data[184:192])
    if len(data) != header_bytes + 2 * record_count * sum(spr):
        raise ValueError('file size does not match the header')
    body = np.frombuffer(data[header_bytes:], dtype='<i2')
    records = body.reshape(record_count, sum(spr))
    signals, annotations, start = {}, [], 0
    for i in range(ns):
        block = records[:, start:start + spr[i]]
        start += spr[i]
        if fields['label'][i] == 'EDF Annotations':
            for r in range(record_count):
                annotations.extend(parse_tals(block[r].tobytes()))
            continue
        pmin, pmax = float(fields['pmin'][i]), float(fields['pmax'][i])
        dmin, dmax = float(fields['dmin'][i]), float(fields['dmax'][i])
        digital = block.reshape(-1).astype(np.float64)
        signals[fields['label'][i]] = (digital - dmin) * (pmax - pmin) / (dmax - dmin) + pmin
    return {
        'version': data[0:8].decode('ascii').strip(),
        'patient': data[8:88].decode('ascii').strip(),
        'recording': data[88:168].decode('ascii').strip(),
        'start_date': data[168:176].decode('ascii'),
        'start_time': data[176:184].decode('ascii'),
        'reserved': data[192:236].decode('ascii').strip(),
        'record_count': record_count,
        'record_s': record_s,
        'sample_rate_hz': spr[0] / record_s,
        'signals': signals,
        'annotations': annotations,
    }


def parse_tals(raw):
    """TALs of one record; the first (time-keeping, empty text) is left out."""
    out = []
    for tal in raw.split(b'\x00'):
        if not tal:
            continue
        parts = tal.split(b'\x14')
        onset_duration = parts[0].split(b'\x15')
        texts = [t.decode('utf-8') for t in parts[1:] if t]
        for text in texts:
            out.append({'onset_s': float(onset_duration[0]),
                        'duration_s': float(onset_duration[1]) if len(onset_duration) > 1 else None,
                        'text': text})
    return out


def electrode(label):
    return label.replace('EEG ', '').replace('-REF', '')


def welch(x, fs):
    # Welch 1967 with 4 s Hann windows and 50 % overlap, as docs/method.md section 4.
    return signal.welch(x, fs=fs, window='hann', nperseg=int(4 * fs), noverlap=int(2 * fs))


def peak_hz(f, p, band):
    sel = np.where((f >= band[0]) & (f <= band[1]))[0]
    i = sel[np.argmax(p[sel])]
    a, b, c = p[i - 1], p[i], p[i + 1]
    return float(f[i] + 0.5 * (a - c) / (a - 2 * b + c) * (f[1] - f[0]))


def op_edf_summary(req):
    edf = read_edf(req['edf'])
    return {k: v for k, v in edf.items() if k != 'signals'} | {
        'labels': list(edf['signals'].keys()),
        'max_abs_uv': {k: float(np.max(np.abs(v))) for k, v in edf['signals'].items()},
    }


def op_spectra(req):
    edf = read_edf(req['edf'])
    fs = edf['sample_rate_hz']
    out = {'channels': {}}
    roi_spectra = []
    for label, x in edf['signals'].items():
        f, p = welch(x, fs)
        alpha = (f >= 7) & (f <= 13)
        line = np.argmin(np.abs(f - 50))
        neighbours = np.r_[p[line - 8:line - 3], p[line + 4:line + 9]]
        out['channels'][electrode(label)] = {
            'peak_hz': peak_hz(f, p, (7, 13)),
            'alpha_power': float(np.sum(p[alpha]) * (f[1] - f[0])),
            'line_ratio': float(p[line] / np.median(neighbours)),
        }
        if electrode(label) in req['roi']:
            roi_spectra.append(p)
    mean = np.mean(roi_spectra, axis=0)
    out['roi_paf_hz'] = peak_hz(f, mean, (7, 13))
    low = (f >= 2) & (f <= 5)
    high = (f >= 20) & (f <= 40)
    out['low_over_high_power'] = float(np.mean(mean[low]) / np.mean(mean[high]))
    return out


def instantaneous_frequency(x, fs, band):
    # Zero-phase band-pass (scipy.signal.sosfiltfilt, Butterworth), analytic signal
    # (scipy.signal.hilbert), f[n] = arg(z[n+1] conj z[n]) fs / 2 pi (Boashash 1992),
    # then the median of 10 running medians, 10 to 400 ms (Cohen 2014).
    sos = signal.butter(3, band, btype='bandpass', fs=fs, output='sos')
    z = signal.hilbert(signal.sosfiltfilt(sos, x - np.mean(x)))
    f = np.angle(z[1:] * np.conj(z[:-1])) * fs / (2 * np.pi)
    filtered = []
    for ms in np.linspace(10, 400, 10):
        k = int(round(ms / 1000 * fs))
        filtered.append(signal.medfilt(f, k if k % 2 else k + 1))
    return np.median(np.array(filtered), axis=0)


def op_onset_delta_f(req):
    edf = read_edf(req['edf'])
    fs = edf['sample_rate_hz']
    tracks = [instantaneous_frequency(x, fs, req['band'])
              for label, x in edf['signals'].items() if electrode(label) in req['roi']]
    mean = np.mean(tracks, axis=0)
    t = (np.arange(mean.size) + 0.5) / fs  # each value lies between samples n and n+1
    deltas = []
    for onset in req['onsets_s']:
        base = mean[(t >= onset - 0.5) & (t < onset)].mean()
        post = mean[(t >= onset + 0.2) & (t < onset + 0.8)].mean()
        deltas.append(post - base)
    return {'mean_delta_f_hz': float(np.mean(deltas)),
            'sem_hz': float(np.std(deltas, ddof=1) / np.sqrt(len(deltas)))}


def op_hilbert_track(req):
    # Raw instantaneous frequency of one noise-free channel (scipy.signal.hilbert),
    # compared with the designed track away from the ends.
    edf = read_edf(req['edf'])
    fs = edf['sample_rate_hz']
    x = next(v for k, v in edf['signals'].items() if electrode(k) == req['channel'])
    z = signal.hilbert(x)
    f = np.angle(z[1:] * np.conj(z[:-1])) * fs / (2 * np.pi)
    design = np.fromfile(req['design'], dtype='<f8')
    edge = int(req['edge_s'] * fs)
    err = (f - design)[edge:-edge]
    return {'max_abs_error_hz': float(np.max(np.abs(err))),
            'rms_error_hz': float(np.sqrt(np.mean(err ** 2)))}


def op_window_max(req):
    # Largest deviation from the window mean of one channel in each [start, end) window, in uV.
    edf = read_edf(req['edf'])
    fs = edf['sample_rate_hz']
    x = next(v for k, v in edf['signals'].items() if electrode(k) == req['channel'])
    out = []
    for start, end in req['windows_s']:
        w = x[max(0, int(start * fs)):int(end * fs)]
        out.append(float(np.max(np.abs(w - np.mean(w)))) if w.size else 0.0)
    return {'max_abs_uv': out}


OPS = {
    'window_max': op_window_max,
    'edf_summary': op_edf_summary,
    'spectra': op_spectra,
    'onset_delta_f': op_onset_delta_f,
    'hilbert_track': op_hilbert_track,
}

if __name__ == '__main__':
    request = json.load(sys.stdin)
    json.dump(OPS[request['op']](request), sys.stdout)
