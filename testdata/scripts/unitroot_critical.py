#!/usr/bin/python3
"""Fixture for analysis/critical: MacKinnon critical values and p-values
evaluated by statsmodels (Debian python3-statsmodels), used only as a
reference library.

Writes ../fixtures/critical_mackinnon.json:
  tau:   mackinnoncrit(N, case, T) for N = 1..12, every case, T in a grid
         (T = 0 means nobs = inf, the asymptotic value);
  p:     mackinnonp(stat, case, N) for N = 1..6 on a grid of statistics.
"""
import json, math, os
import numpy as np
import statsmodels
from statsmodels.tsa.adfvalues import mackinnoncrit, mackinnonp

here = os.path.dirname(os.path.abspath(__file__))
tau = []
for case in ["n", "c", "ct", "ctt"]:
    for n in range(1, 13):
        if case == "n" and n > 1:
            continue
        for t in [0, 20, 25, 50, 100, 250, 500, 1000]:
            cv = mackinnoncrit(N=n, regression=case, nobs=(np.inf if t == 0 else t))
            tau.append({"n": n, "case": case, "t": t, "cv": [float(v) for v in cv]})
p = []
stats = [-30.0, -20.0, -12.5, -8.0, -6.0, -5.0, -4.5, -4.0, -3.6, -3.3, -3.0,
         -2.7, -2.4, -2.0, -1.7, -1.5, -1.2, -1.0, -0.5, 0.0, 0.5, 0.8, 1.0,
         1.3, 2.0, 3.0, 4.0]
for case in ["n", "c", "ct", "ctt"]:
    for n in range(1, 7):
        for s in stats:
            p.append({"n": n, "case": case, "stat": s,
                      "p": float(mackinnonp(s, regression=case, N=n))})
out = {"library": "statsmodels " + statsmodels.__version__,
       "functions": "statsmodels.tsa.adfvalues.mackinnoncrit, mackinnonp",
       "tau": tau, "p": p}
with open(os.path.join(here, "..", "fixtures", "critical_mackinnon.json"), "w") as f:
    json.dump(out, f, indent=1)
print("wrote critical_mackinnon.json with", out["library"])
