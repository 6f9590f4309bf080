#!/usr/bin/env python3
"""Reference values for Gyre's condition statistics, computed with numpy/scipy.

The difference of two conditions' mean Δf is tested with scipy.stats.permutation_test
(permutation_type='independent', alternative='two-sided') and given an interval by
scipy.stats.bootstrap (method='percentile', two independent samples). Inputs are generated
here (numpy default_rng, fixed seeds) and rounded to 13 significant digits, as in
scipy_reference.py, so the committed JSON is byte-stable:

    python3 backend/scripts/condition_stats_reference.py --out backend/test/fixtures/scipy

CI regenerates the fixtures and fails when they differ from the committed ones
(backend/scripts/check-fixtures.sh).
"""

import argparse
import os

import numpy as np
import scipy
import scipy.special
import scipy.stats

# The rounding and writing of the other fixtures (this folder is on sys.path when run).
from scipy_reference import rounded, stable, write

# Resamples of the Monte-Carlo references: their own error is then a tenth of the one of
# Gyre's 2000 (bootstrap) and 5000 (permutation) resamples the tests allow for.
REFERENCE_RESAMPLES = 200_000


def mean_difference(x, y, axis=-1):
    return np.mean(x, axis=axis) - np.mean(y, axis=axis)


def permutation_case(name, x, y, n_resamples, seed):
    """One case: scipy's statistic and two-sided p (exact when the splits are few enough)."""
    x, y = rounded(x), rounded(y)
    res = scipy.stats.permutation_test(
        (x, y),
        mean_difference,
        permutation_type="independent",
        alternative="two-sided",
        vectorized=True,
        n_resamples=n_resamples,
        rng=np.random.default_rng(seed),
    )
    exact = bool(np.isinf(n_resamples) or scipy.special.comb(len(x) + len(y), len(x)) <= n_resamples)
    return {
        "name": name,
        "first": stable(x),
        "second": stable(y),
        "statistic": stable([res.statistic])[0],
        "pValue": stable([res.pvalue])[0],
        "referenceExact": exact,
        "referenceResamples": None if exact else int(n_resamples),
    }


def permutation_cases():
    rng = np.random.default_rng(20240310)
    # Small samples: C(n, n1) <= 5000 splits, which scipy (and Gyre) enumerate exactly.
    exact_inputs = {
        "exact-6-7": (rng.normal(-0.5, 0.3, 6), rng.normal(0.0, 0.3, 7)),
        "exact-ties-5-5": (
            np.round(rng.normal(-0.2, 0.3, 5), 1),
            np.round(rng.normal(0.0, 0.3, 5), 1),
        ),
        "exact-8-6": (rng.normal(-0.1, 0.4, 8), rng.normal(0.0, 0.4, 6)),
        "exact-2-3": (np.array([-0.4, -0.1]), rng.normal(0.0, 0.2, 3)),
        "exact-identical-4-4": (np.array([0.1, -0.2, 0.3, 0.0]), np.array([0.0, 0.3, 0.1, -0.2])),
    }
    # Larger samples: Gyre draws 5000 random splits; the reference p is scipy's exact one
    # where enumeration is affordable (C(19, 9) = 92378), else 200000 random splits.
    monte_carlo_inputs = {
        "monte-carlo-10-9": (rng.normal(-0.3, 0.4, 10), rng.normal(0.0, 0.4, 9), np.inf),
        "monte-carlo-30-25": (
            rng.normal(-0.3, 0.5, 30),
            rng.normal(0.0, 0.5, 25),
            REFERENCE_RESAMPLES,
        ),
        "monte-carlo-40-40": (
            rng.normal(-0.5, 0.4, 40),
            rng.normal(0.0, 0.4, 40),
            REFERENCE_RESAMPLES,
        ),
    }
    cases = [permutation_case(name, x, y, 5000, 1) for name, (x, y) in exact_inputs.items()]
    cases += [
        permutation_case(name, x, y, resamples, 20240311)
        for name, (x, y, resamples) in monte_carlo_inputs.items()
    ]
    return {
        "source": "scipy.stats.permutation_test(permutation_type='independent', "
        "alternative='two-sided', statistic=mean(x) - mean(y)) (scipy %s)" % scipy.__version__,
        "cases": cases,
    }


def bootstrap_cases():
    rng = np.random.default_rng(20240312)
    inputs = {
        "15-12": (rng.normal(-0.5, 0.3, 15), rng.normal(0.0, 0.3, 12)),
        "30-30": (rng.normal(-0.2, 0.5, 30), rng.normal(0.1, 0.4, 30)),
        "skewed-20-25": (rng.exponential(0.5, 20) - 0.8, rng.exponential(0.3, 25) - 0.3),
        "small-4-6": (rng.normal(-0.3, 0.2, 4), rng.normal(0.0, 0.2, 6)),
    }
    cases = []
    for name, (x, y) in inputs.items():
        x, y = rounded(x), rounded(y)
        res = scipy.stats.bootstrap(
            (x, y),
            mean_difference,
            n_resamples=REFERENCE_RESAMPLES,
            vectorized=True,
            paired=False,
            confidence_level=0.95,
            method="percentile",
            rng=np.random.default_rng(20240313),
        )
        cases.append({
            "name": name,
            "first": stable(x),
            "second": stable(y),
            "ciHz": stable([res.confidence_interval.low, res.confidence_interval.high]),
            "standardError": stable([res.standard_error])[0],
            "referenceResamples": REFERENCE_RESAMPLES,
        })
    return {
        "source": "scipy.stats.bootstrap(method='percentile', paired=False, "
        "confidence_level=0.95, statistic=mean(x) - mean(y)) (scipy %s)" % scipy.__version__,
        "cases": cases,
    }


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--out", required=True, help="folder for the JSON fixtures")
    out = parser.parse_args().out
    os.makedirs(out, exist_ok=True)
    for name, cases in (
        ("condition-permutation.json", permutation_cases),
        ("condition-bootstrap.json", bootstrap_cases),
    ):
        write(out, name, cases())


if __name__ == "__main__":
    main()
