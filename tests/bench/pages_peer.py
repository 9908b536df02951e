"""Peer of bench:pages: per-group figures from the same merged counts with numpy.

Reads [{values, counts}] (one entry a group), computes for every group n, mean, SD (divisor
n - 1), percentiles P5/P50/P95 of type 7 (numpy's default 'linear' method, here from the
cumulative counts with searchsorted) and the share below c_min = 35 mm, five times after one
warm-up, and prints {"runsMs": [...], "numpy": version} as JSON.
"""
import json
import sys
import time

import numpy as np

C_MIN = 35.0


def figures(values, counts):
    n = counts.sum()
    mean = (values * counts).sum() / n
    sd = np.sqrt((counts * (values - mean) ** 2).sum() / (n - 1))
    cumulative = np.cumsum(counts)
    h = (n - 1) * np.array([0.05, 0.5, 0.95])  # type 7, 0-based
    lo = np.floor(h)
    a = values[np.searchsorted(cumulative, lo + 1)]
    b = values[np.searchsorted(cumulative, np.minimum(lo + 2, n))]
    percentiles = a + (h - lo) * (b - a)
    below = counts[values < C_MIN].sum() / n
    return n, mean, sd, percentiles, below


def main():
    with open(sys.argv[1]) as f:
        groups = [(np.array(g["values"]), np.array(g["counts"])) for g in json.load(f)]
    runs = []
    for run in range(6):
        t0 = time.perf_counter()
        for values, counts in groups:
            figures(values, counts)
        if run > 0:
            runs.append((time.perf_counter() - t0) * 1000)
    print(json.dumps({"runsMs": runs, "numpy": np.__version__}))


if __name__ == "__main__":
    main()
