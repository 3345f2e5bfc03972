#!/usr/bin/python3
"""Reference values for the completeness tests, computed with astropy.stats.

Run with Debian's Python (astropy 5.2.1, numpy 1.24; astropy's Wilson interval needs scipy for
erfinv: apt-get install python3-scipy), from the repository root:

    /usr/bin/python3 tests/reference/make_completeness_reference.py

It writes tests/fixtures/reference/wilson.json:
  intervals  astropy.stats.binom_conf_interval(k, n, confidence_level, interval='wilson') for a set of
             (k, n) at 95 % (z = 1.959964) and at 1 sigma (z = 1), with the z astropy derived from the
             confidence level (sqrt(2) * erfinv(level)).
  binned     an invented, seeded set of planted controls (injected SNR, recovered or not) and
             astropy.stats.binned_binom_proportion's answer for it on Dipdeck's SNR edges (95 %,
             Wilson): per non-empty bin its centre, half-width, count, rate and interval.
             binned_binom_proportion bins like numpy.histogram: [a, b) except the last bin, [a, b].
             The values stay below the last edge, so that difference never matters.

The data are seeded: running it again gives the same file. Note that binom_conf_interval's default
confidence level is 0.68269 (1 sigma), so the 95 % values need confidence_level=0.95.
"""

import json
import math
import os

import astropy
import numpy as np
from astropy.stats import binned_binom_proportion, binom_conf_interval
from scipy.special import erfinv

OUT = os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "fixtures", "reference", "wilson.json")

LEVELS = {"95": 0.95, "1sigma": math.erf(1 / math.sqrt(2))}
CASES = [
    (8, 10), (0, 10), (10, 10), (0, 1), (1, 1), (1, 2), (1, 3), (1, 4), (5, 6), (6, 9),
    (3, 7), (5, 20), (47, 50), (123, 456), (999, 1000),
]

# Dipdeck's SNR bin edges without the open last one (server/science/completeness.ts SNR_EDGES).
SNR_EDGES = [0, 5, 7.1, 10, 15, 20, 30, 50]
SEED = 20261207


def interval_cases():
    out = {}
    for name, level in LEVELS.items():
        z = float(np.sqrt(2.0) * erfinv(level))
        rows = []
        for k, n in CASES:
            low, high = binom_conf_interval(k, n, confidence_level=level, interval="wilson")
            rows.append({"successes": k, "trials": n, "low": float(low), "high": float(high)})
        out[name] = {"confidenceLevel": level, "z": z, "cases": rows}
    return out


def binned_case():
    rng = np.random.RandomState(SEED)
    snr = np.round(rng.uniform(3.0, 45.0, size=120), 3)
    # A recovery curve that rises through SNR 7-20, as volunteers' eyes might give.
    recovered = rng.uniform(size=snr.size) < 1 / (1 + np.exp(-(snr - 12.0) / 4.0))
    ctr, halfwidth, p, perr = binned_binom_proportion(
        snr, recovered, bins=np.array(SNR_EDGES, dtype=float), confidence_level=0.95, interval="wilson"
    )
    counts, _ = np.histogram(snr, bins=np.array(SNR_EDGES, dtype=float))
    bins = []
    filled = [c for c in counts if c > 0]
    assert len(filled) == len(ctr)
    for i in range(len(ctr)):
        bins.append(
            {
                "low": float(ctr[i] - halfwidth[i]),
                "high": float(ctr[i] + halfwidth[i]),
                "trials": int(filled[i]),
                "rate": float(p[i]),
                "wilsonLow": float(p[i] - perr[0][i]),
                "wilsonHigh": float(p[i] + perr[1][i]),
            }
        )
    return {
        "seed": SEED,
        "edges": SNR_EDGES,
        "expectedSnr": [float(v) for v in snr],
        "recovered": [bool(v) for v in recovered],
        "bins": bins,
    }


reference = {
    "made_by": "tests/reference/make_completeness_reference.py",
    "source": f"astropy {astropy.__version__} astropy.stats.binom_conf_interval and binned_binom_proportion "
    f"(interval='wilson'), numpy {np.__version__}",
    "intervals": interval_cases(),
    "binned": binned_case(),
}

with open(OUT, "w") as handle:
    json.dump(reference, handle, indent=2)
    handle.write("\n")
print(json.dumps(reference["intervals"]["95"]["cases"][0]))
