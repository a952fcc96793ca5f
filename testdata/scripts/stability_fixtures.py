#!/usr/bin/python3
"""Reference values for analysis/acf and analysis/stability.

Run with Debian's python3 (python3-statsmodels) from the repository root:

    /usr/bin/python3 testdata/scripts/stability_fixtures.py

Writes testdata/fixtures/stability_acf.json and
testdata/fixtures/stability_recursive.json from the open dataset
testdata/data/macrodata.csv (US quarterly macro data, 1959Q1-2009Q3).
"""
import json
import sys

import numpy as np
import pandas as pd
import statsmodels
from statsmodels.regression.recursive_ls import RecursiveLS
from statsmodels.tsa.stattools import acf, pacf

data = pd.read_csv("testdata/data/macrodata.csv")
meta = {
    "library": "statsmodels",
    "version": statsmodels.__version__,
    "numpy": np.__version__,
    "python": sys.version.split()[0],
    "data": "testdata/data/macrodata.csv",
}

# --- autocorrelations -------------------------------------------------
series = {
    "infl": data["infl"].to_numpy(),
    "dlog_realgdp": np.diff(np.log(data["realgdp"].to_numpy())) * 100,
    "unemp": data["unemp"].to_numpy(),
}
nlags = 20
acf_out = {"meta": dict(meta, calls="acf(x, nlags=20, adjusted=False, fft=False); "
                        "pacf(x, nlags=20, method=...)"), "series": []}
for name, x in series.items():
    acf_out["series"].append({
        "name": name,
        "x": x.tolist(),
        "nlags": nlags,
        "acf": acf(x, nlags=nlags, adjusted=False, fft=False).tolist(),
        "pacf_ywm": pacf(x, nlags=nlags, method="ywm").tolist(),
        "pacf_ldb": pacf(x, nlags=nlags, method="ldb").tolist(),
    })
with open("testdata/fixtures/stability_acf.json", "w") as f:
    json.dump(acf_out, f, indent=1)

# --- recursive least squares -------------------------------------------
y = np.log(data["realcons"].to_numpy())
X = np.column_stack([np.ones(len(y)), np.log(data["realdpi"].to_numpy()),
                     data["tbilrate"].to_numpy()])
res = RecursiveLS(y, X).fit()
k = X.shape[1]
T = len(y)
coef = res.recursive_coefficients
lo5, hi5 = res._cusum_significance_bounds(0.05, points=np.arange(k, T + 1))
lo1, hi1 = res._cusum_significance_bounds(0.01, points=np.arange(k, T + 1))
sq = {}
for a in (0.10, 0.05, 0.01):
    lo, hi = res._cusum_squares_significance_bounds(a, points=np.arange(k, T + 1))
    sq[str(a)] = {"lower": lo.tolist(), "upper": hi.tolist()}
rec = {
    "meta": dict(meta, model="RecursiveLS(log realcons ~ 1 + log realdpi + tbilrate).fit()"),
    "y": y.tolist(),
    "X": X.tolist(),
    "k": k,
    "resid_recursive": res.resid_recursive[k:].tolist(),
    "cusum": res.cusum.tolist(),
    "cusum_squares": res.cusum_squares.tolist(),
    "scale": float(res.scale),
    "coef_filtered": coef.filtered.T.tolist(),
    "coef_filtered_var": [np.diag(coef.filtered_cov[:, :, t]).tolist() for t in range(T)],
    "cusum_bounds_points": list(range(k, T + 1)),
    "cusum_bounds_0.05": {"lower": lo5.tolist(), "upper": hi5.tolist()},
    "cusum_bounds_0.01": {"lower": lo1.tolist(), "upper": hi1.tolist()},
    "cusum_squares_bounds": sq,
}
with open("testdata/fixtures/stability_recursive.json", "w") as f:
    json.dump(rec, f, indent=1)

# --- CUSUM-of-squares critical values (Edgerton-Wells approximation) ----
# statsmodels' bound depends only on the number of recursive residuals
# m = nobs - k; its half-width at the first point is the constant c0.
crit = {"meta": dict(meta, calls="RecursiveLS(y[:T], X[:T]).fit()."
                     "_cusum_squares_significance_bounds(alpha, points=[k]) upper"),
        "k": k, "rows": []}
for Tsub in (24, 33, 53, 83, 103, 143, 203):
    r = RecursiveLS(y[:Tsub], X[:Tsub]).fit()
    row = {"m": Tsub - k}
    for a in (0.10, 0.05, 0.01):
        lo, hi = r._cusum_squares_significance_bounds(a, points=np.array([k]))
        row[str(a)] = float(hi[0])
    crit["rows"].append(row)
with open("testdata/fixtures/stability_cusumsq_crit.json", "w") as f:
    json.dump(crit, f, indent=1)
