#!/usr/bin/python3
"""Peer benchmark for the chloride profile fit: scipy.optimize.curve_fit on the same profiles.

Usage: /usr/bin/python3 tests/bench/durability_peer.py PROFILES.json REPEATS
PROFILES.json: [{"age": years, "ci": content, "x": [mid-depths mm, outermost left out], "y": [...]}].
Prints one JSON line: best wall and CPU time (ms) over REPEATS for two ways of calling curve_fit, and the
fitted (Cs, Da) of every profile from the first way (null where scipy raised).
  idiomatic: curve_fit(model, x, y, p0=(max y, 20)) — finite-difference Jacobian, as an engineer
             would write it;
  jacobian:  the same with the analytic Jacobian (jac=), the fastest honest use of curve_fit.
"""
import json
import sys
import time

import numpy as np
from scipy.optimize import curve_fit
from scipy.special import erfc

SQRT_PI = np.sqrt(np.pi)


def fit_all(profiles, with_jacobian):
    out = []
    for p in profiles:
        age, ci = p['age'], p['ci']
        x, y = np.asarray(p['x']), np.asarray(p['y'])

        def model(x, cs, da):
            return ci + (cs - ci) * erfc(x / (2 * np.sqrt(da * age)))

        def jac(x, cs, da):
            w = x / (2 * np.sqrt(da * age))
            return np.column_stack((erfc(w), (cs - ci) * w * np.exp(-w * w) / (SQRT_PI * da)))

        try:
            with np.errstate(invalid='ignore'):  # the search may try Da < 0 on its way
                popt, pcov = curve_fit(model, x, y, p0=(y.max(), 20.0),
                                       jac=jac if with_jacobian else None)
            out.append([float(popt[0]), float(popt[1])])
        except RuntimeError:
            out.append(None)
    return out


def best_of(repeats, run):
    """Best wall time and best CPU time of this process (ms) over the repeats."""
    best, best_cpu, result = float('inf'), float('inf'), None
    for _ in range(repeats):
        start, start_cpu = time.perf_counter(), time.process_time()
        result = run()
        best = min(best, (time.perf_counter() - start) * 1000)
        best_cpu = min(best_cpu, (time.process_time() - start_cpu) * 1000)
    return best, best_cpu, result


def main():
    with open(sys.argv[1]) as f:
        profiles = json.load(f)
    repeats = int(sys.argv[2])
    ms, cpu, fits = best_of(repeats, lambda: fit_all(profiles, False))
    ms_jac, cpu_jac, _ = best_of(repeats, lambda: fit_all(profiles, True))
    print(json.dumps({'ms': ms, 'cpuMs': cpu, 'msJacobian': ms_jac, 'cpuMsJacobian': cpu_jac,
                      'fits': fits}))


if __name__ == '__main__':
    main()
