#!/usr/bin/python3
"""Peer benchmark for the analysis engine: the same figures with numpy and scipy.

Usage: /usr/bin/python3 tests/bench/analysis_peer.py DATA.f64 GROUPS REPEATS
DATA.f64 holds float64 readings (mm); GROUPS splits them into equal groups assessed one by one.
Prints one JSON line: best wall time (ms) over REPEATS and the figures of the first group.
Written idiomatically (np.percentile, scipy.stats.anderson/kstest/nct), as an engineer would.
"""
import json
import sys
import time

import numpy as np
from scipy import optimize, stats

P, GAMMA, C_MIN, C_NOM, DELTA_PLUS, ALLOWED = 0.05, 0.95, 35.0, 45.0, 15.0, 0.05


def variables_upper_bound(mean, sd, n, limit):
    t = np.sqrt(n) * (mean - limit) / sd
    f = lambda d: stats.nct.cdf(t, n - 1, d) - GAMMA
    spread = np.sqrt(1 + t * t / (2 * (n - 1)))
    lo, hi = t - 10 * spread - 10, t + 10 * spread + 10
    return float(stats.norm.cdf(-optimize.brentq(f, lo, hi) / np.sqrt(n)))


def assess(x):
    n = x.size
    mean, sd = x.mean(), x.std(ddof=1)
    lx = np.log(x)
    lmean, lsd = lx.mean(), lx.std(ddof=1)
    pct = np.percentile(x, [5, 10, 25, 50, 75, 90, 95])
    ad_n = stats.anderson(x, 'norm').statistic
    ad_l = stats.anderson(lx, 'norm').statistic
    ks_n = stats.kstest(x, 'norm', args=(mean, sd)).statistic
    ks_l = stats.kstest(lx, 'norm', args=(lmean, lsd)).statistic
    z = stats.norm.ppf(1 - P)
    kn = stats.t.ppf(1 - P, n - 1) * np.sqrt(1 + 1 / n)
    k = stats.nct.ppf(GAMMA, n - 1, z * np.sqrt(n)) / np.sqrt(n)
    count = int(np.count_nonzero(x < C_MIN))
    cp_upper = 1.0 if count == n else float(stats.beta.ppf(GAMMA, count + 1, n - count))
    a2 = (1 - GAMMA) / 2
    cp_lo = 0.0 if count == 0 else float(stats.beta.ppf(a2, count, n - count + 1))
    cp_hi = 1.0 if count == n else float(stats.beta.ppf(1 - a2, count + 1, n - count))
    upper = float(np.percentile(x, 100 * (1 - P)))
    figures = {
        'n': n, 'mean': mean, 'sd': sd, 'cov': sd / mean, 'min': x.min(), 'max': x.max(),
        'median': float(np.median(x)), 'skewness': float(stats.skew(x, bias=False)),
        'p5': pct[0], 'p10': pct[1],
        'adNormal': ad_n, 'adLognormal': ad_l, 'ksNormal': ks_n, 'ksLognormal': ks_l,
        'normalP5': mean - z * sd, 'lognormalP5': float(np.exp(lmean - z * lsd)),
        'predictionNormal': mean - kn * sd, 'toleranceNormal': mean - k * sd,
        'predictionLognormal': float(np.exp(lmean - kn * lsd)),
        'toleranceLognormal': float(np.exp(lmean - k * lsd)),
        'countBelow': count, 'cpUpper': cp_upper, 'cpLower2': cp_lo, 'cpUpper2': cp_hi,
        'fractionNormal': float(stats.norm.cdf(C_MIN, mean, sd)),
        'fractionLognormal': float(stats.norm.cdf(np.log(C_MIN), lmean, lsd)),
        'variablesNormal': variables_upper_bound(mean, sd, n, C_MIN),
        'variablesLognormal': variables_upper_bound(lmean, lsd, n, np.log(C_MIN)),
        'ruleEvery': bool(x.min() >= C_MIN), 'ruleCharacteristic': bool(mean - kn * sd >= C_MIN),
        'ruleFraction': cp_upper <= ALLOWED, 'ruleExcess': upper <= C_NOM + DELTA_PLUS,
    }
    return {key: (float(v) if isinstance(v, np.floating) else v) for key, v in figures.items()}


def main():
    data = np.fromfile(sys.argv[1], dtype=np.float64)
    groups, repeats = int(sys.argv[2]), int(sys.argv[3])
    parts = np.split(data, groups)
    best, first = float('inf'), None
    for _ in range(repeats):
        start = time.perf_counter()
        results = [assess(part) for part in parts]
        best = min(best, (time.perf_counter() - start) * 1000)
        first = results[0]
    print(json.dumps({'ms': best, 'figures': first}))


if __name__ == '__main__':
    main()
