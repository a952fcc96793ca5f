#!/usr/bin/env python3
"""Time the computations of galley's bench/cmd/galleybench in statsmodels.

Reads the CSV files galleybench -data DIR wrote (the same numbers, 17
significant digits) and prints, per workload, its name, the best and the
median wall-clock time in seconds over RUNS runs, tab-separated:

    python3 bench/statsmodels_bench.py DIR [RUNS]

The workloads match bench/workload.go:
  adf_aic12_T100000       adfuller(y, maxlag=12, regression="c", autolag="AIC")
  engle_granger_N3_T1000  coint(y, [x1, x2], trend="c", maxlag=12, autolag="aic")
  johansen_K6_T10000      coint_johansen(Y, det_order=0, k_ar_diff=2)
  ecm_T1000               OLS of dy_t on 1, ect_{t-1}, dy_{t-1}, dx_t, dx_{t-1}
                          (columns built with numpy, as ecm.Estimate builds them)
The library and its version are printed on stderr.
"""
import sys
import time

import numpy as np
import statsmodels
import statsmodels.api as sm
from statsmodels.tsa.stattools import adfuller, coint
from statsmodels.tsa.vector_ar.vecm import coint_johansen


def load(path):
    return np.loadtxt(path, delimiter=",", skiprows=1)


def ecm(y, x, ect):
    dy, dx = np.diff(y), np.diff(x)
    # observations t = 2..T-1 (0-based) so that dy_{t-1} and dx_{t-1} exist
    t = np.arange(2, len(y))
    X = np.column_stack([np.ones(len(t)), ect[t - 1], dy[t - 2], dx[t - 1], dx[t - 2]])
    return sm.OLS(dy[t - 1], X).fit()


def best_median(n, f):
    ts = []
    for _ in range(n):
        t0 = time.perf_counter()
        f()
        ts.append(time.perf_counter() - t0)
    ts.sort()
    return ts[0], ts[len(ts) // 2]


def main():
    d = sys.argv[1]
    runs = int(sys.argv[2]) if len(sys.argv) > 2 else 10
    print("statsmodels %s, numpy %s, python %s" % (statsmodels.__version__, np.__version__, sys.version.split()[0]), file=sys.stderr)
    adf = load(d + "/adf.csv")
    eg = load(d + "/eg.csv")
    joh = load(d + "/johansen.csv")
    e = load(d + "/ecm.csv")
    work = [
        ("adf_aic12_T100000", lambda: adfuller(adf, maxlag=12, regression="c", autolag="AIC")),
        ("engle_granger_N3_T1000", lambda: coint(eg[:, 0], eg[:, 1:], trend="c", maxlag=12, autolag="aic")),
        ("johansen_K6_T10000", lambda: coint_johansen(joh, det_order=0, k_ar_diff=2)),
        ("ecm_T1000", lambda: ecm(e[:, 0], e[:, 1], e[:, 2])),
    ]
    # Print the statistics once so that a reader can see the same test ran.
    r = adfuller(adf, maxlag=12, regression="c", autolag="AIC")
    print("adfuller: stat %.6f p %.4f lags %d nobs %d" % (r[0], r[1], r[2], r[3]), file=sys.stderr)
    c = coint(eg[:, 0], eg[:, 1:], trend="c", maxlag=12, autolag="aic")
    print("coint: stat %.6f p %.4g" % (c[0], c[1]), file=sys.stderr)
    j = coint_johansen(joh, det_order=0, k_ar_diff=2)
    print("coint_johansen: trace %s" % np.array2string(j.lr1, precision=3), file=sys.stderr)
    for name, f in work:
        b, m = best_median(runs, f)
        print("%s\t%.6f\t%.6f" % (name, b, m))


if __name__ == "__main__":
    main()
