"""Gyre's plateau band-pass response (docs/method.md), written in numpy for the scipy-side scripts.

One definition for the fixture generator (scipy_reference.py) and both benchmarks'
scipy sides (bench_scipy.py, bench/scipy_pipeline.py).
"""

import numpy as np


def plateau_weight(f, low, high, transition=0.15):
    """1 inside [low, high], raised-cosine transition zones of `transition` times the band edges."""
    low_stop = low * (1 - transition)
    high_stop = high * (1 + transition)
    w = np.zeros_like(f)
    rising = (f > low_stop) & (f < low)
    w[rising] = 0.5 - 0.5 * np.cos(np.pi * (f[rising] - low_stop) / (low - low_stop))
    w[(f >= low) & (f <= high)] = 1.0
    falling = (f > high) & (f < high_stop)
    w[falling] = 0.5 + 0.5 * np.cos(np.pi * (f[falling] - high) / (high_stop - high))
    return w
