"""Peer of bench:summaries: the same per-group figures from the same cover counts, by numpy.

Input: the file the benchmark writes, one record a member: int32 group, int32 entries, then the
member's stored counts (int32 grid step k of 0.1 mm, uint32 readings), little-endian. Per group:
n, mean, sample SD, and the type 7 percentiles P5/P50/P95 (numpy's default 'linear' method) of the
covers, from a dense array of counts by step. Prints JSON: median and min time of `runs` runs
(reading the file included) and the figures.
"""
import json
import sys
import time

import numpy as np


def figures(path):
    raw = np.fromfile(path, dtype="<i4")
    groups = {}
    at = 0
    heads = []
    while at < raw.size:
        g, entries = int(raw[at]), int(raw[at + 1])
        heads.append((g, at + 2, entries))
        at += 2 + 2 * entries
    # One concatenation per group, then one bincount: the vectorised form of the merge.
    by_group = {}
    for g, start, entries in heads:
        by_group.setdefault(g, []).append(raw[start : start + 2 * entries])
    out = []
    for g, parts in sorted(by_group.items()):
        pairs = np.concatenate(parts).reshape(-1, 2)
        k = pairs[:, 0]
        c = pairs[:, 1].view("<u4").astype(np.int64)
        dense = np.bincount(k, weights=c).astype(np.int64)
        steps = np.nonzero(dense)[0]
        counts = dense[steps]
        n = int(counts.sum())
        s1 = int((counts * steps).sum())
        s2 = int((counts * steps * steps).sum())
        mean = s1 / n / 10
        sd = ((n * s2 - s1 * s1) / (n * (n - 1))) ** 0.5 / 10
        cum = np.cumsum(counts)
        pct = []
        for p in (0.05, 0.5, 0.95):
            h = (n - 1) * p  # 0-based position, type 7
            lo = int(np.floor(h))
            a = steps[np.searchsorted(cum, lo + 1)] / 10
            b = steps[np.searchsorted(cum, min(lo + 2, n))] / 10
            pct.append(a + (h - lo) * (b - a))
        out.append({"g": g, "n": n, "mean": mean, "sd": sd, "p5": pct[0], "p50": pct[1], "p95": pct[2]})
    return out


def main():
    path, runs = sys.argv[1], int(sys.argv[2])
    times = []
    for _ in range(runs):
        t0 = time.perf_counter()
        out = figures(path)
        times.append((time.perf_counter() - t0) * 1000)
    times.sort()
    print(json.dumps({"medianMs": times[len(times) // 2], "minMs": times[0], "groups": out}))


if __name__ == "__main__":
    main()
