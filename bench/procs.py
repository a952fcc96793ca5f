#!/usr/bin/env python3
"""One statsmodels test as a whole script, the counterpart of one galley
build of a bench/cmd/procbench project (bench/procs.go):

    /usr/bin/python3 bench/procs.py adf DATA.csv
        pandas.read_csv, then adfuller(y, maxlag=12, regression="c", autolag="AIC")
    /usr/bin/python3 bench/procs.py johansen DATA.csv
        pandas.read_csv, then coint_johansen(Y, det_order=0, k_ar_diff=2)

The timing is of the whole process (start, imports, reading the file,
the test), as a user running the script pays it. The statistic is
printed so that a reader can check that the same test ran.
"""
import sys

import pandas as pd
from statsmodels.tsa.stattools import adfuller
from statsmodels.tsa.vector_ar.vecm import coint_johansen


def main():
    kind, path = sys.argv[1], sys.argv[2]
    d = pd.read_csv(path)
    if kind == "adf":
        r = adfuller(d["y"].to_numpy(), maxlag=12, regression="c", autolag="AIC")
        print("adf stat %.6f lags %d" % (r[0], r[2]))
    elif kind == "johansen":
        j = coint_johansen(d.to_numpy(), det_order=0, k_ar_diff=2)
        print("johansen trace %.3f" % j.lr1[0])
    else:
        sys.exit("unknown workload " + kind)


if __name__ == "__main__":
    main()
