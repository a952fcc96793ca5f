#!/usr/bin/python3
"""Asymptotic mean, variance and Gamma-approximated quantiles of the trace
statistic for cointegrating rank with broken constants restricted to the
cointegrating relations, model H_c(r) of Johansen, Mosconi and Nielsen
(2000), "Cointegration analysis in the presence of structural breaks in
the deterministic trend", Econometrics Journal 3, 216-249, Table 4
(response surfaces for the log mean and log variance in p - r and the
break fractions a <= b). Run from the repository root:

    /usr/bin/python3 testdata/scripts/simulate_johansen_jmn.py

Writes testdata/fixtures/simulate_johansen_jmn.json.

The coefficients of Table 4 are as transcribed by Giles and Godwin
(University of Victoria Econometrics Working Paper EWP1110, 2011) in their
public R code for these tests; they were not checked against a copy of the
journal's table. The Gamma quantiles use scipy (Debian python3-scipy).

q is the number of sub-samples (q - 1 breaks), v the break fractions;
q = 1 (no break) is the restricted-constant case rc without dummies, so
those rows can be checked against galley's case rc tables. One break at
v has a = 0, b = min(v, 1 - v).

galley's case rc with `shift:` one date is this model with q = 2: the
constant and the step span the two sub-sample indicators E_1, E_2 in the
relations, and the impulses at the break date and the k - 1 periods after
it (k the VAR order in levels) are JMN's dummies D_{2,t-i}, i = 1..k.
"""
import json
import math

import numpy
import scipy
from scipy.stats import gamma


def hc(pr, a, b, q):
    lm = (2.80 + 0.501*pr + 1.43*a + 0.399*b - 0.0309*pr**2 - 0.0600*a*pr
          - 5.72*a**2 - 1.12*a*b - 1.70*b**2 + 0.000974*pr**3
          + 0.168*a**2*pr + 6.34*a**3 + 1.89*a*b**2 + 1.85*b**3
          - 2.19/pr - 0.438*a/pr + 1.79*b/pr + 6.03*a**2/pr + 3.08*a*b/pr
          - 1.97*b**2/pr - 8.08*a**3/pr - 5.79*a*b**2/pr + 0.717/pr**2
          - 1.29*b/pr**2 - 1.52*a**2/pr**2 + 2.87*b**2/pr**2
          - 2.03*b**3/pr**2)
    lv = (3.78 + 0.346*pr + 0.859*a - 0.0106*pr**2 - 0.0339*a*pr
          - 2.35*a**2 + 3.95*a**3 - 0.282*b**3 - 2.73/pr + 0.874*a/pr
          + 2.36*b/pr - 2.88*a**2/pr - 4.44*b**2/pr + 4.31*b**3/pr
          + 1.02/pr**2 - 0.807*b/pr**2)
    mean = math.exp(lm) - (3 - q)*pr
    var = math.exp(lv) - 2*(3 - q)*pr
    return mean, var


out = {"library": "scipy", "version": scipy.__version__,
       "numpy": numpy.__version__,
       "source": "Johansen, Mosconi and Nielsen (2000) Table 4, model H_c(r), "
                 "coefficients as in Giles and Godwin (2011)",
       "levels": [0.10, 0.05, 0.01],
       "rows": []}
for q, v in ((1, None), (2, 0.5), (2, 0.3)):
    a = 0.0
    b = 0.0 if v is None else min(v, 1 - v)
    for pr in range(1, 7):
        m, s2 = hc(pr, a, b, q)
        theta, k = s2/m, m*m/s2
        out["rows"].append({"q": q, "v": v, "a": a, "b": b, "dim": pr,
                            "mean": m, "var": s2,
                            "quantiles": [float(gamma.ppf(1 - l, k, scale=theta))
                                          for l in out["levels"]]})

with open("testdata/fixtures/simulate_johansen_jmn.json", "w") as fh:
    json.dump(out, fh, indent=1)
