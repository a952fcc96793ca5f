#!/usr/bin/python3
"""Reference values for analysis/johansen from statsmodels (Debian
python3-statsmodels). Run from the repository root:

    /usr/bin/python3 testdata/scripts/johansen_statsmodels.py

Writes testdata/fixtures/johansen_statsmodels.json with
  * coint_johansen eigenvalues, trace and maximum-eigenvalue statistics and
    critical values (det_order -1, 0, 1) on denmark.csv (LRM, LRY, IBO, IDE)
    and macrodata.csv (log realgdp, realcons, realinv), with 1 and 2 lagged
    differences;
  * VAR.select_order information criteria on denmark.csv (trend n, c, ct,
    maxlags 5 in levels);
  * the critical-value tables c_sjt and c_sja (n = 1..12; 90/95/99 pct);
  * VECM estimates of rank 1 (alpha, beta and their standard errors) for the
    deterministic specifications n, co, ci, colo, coli.
"""
import json
import numpy as np
import pandas as pd
import statsmodels
from statsmodels.tsa.vector_ar.vecm import coint_johansen, VECM
from statsmodels.tsa.api import VAR

den = pd.read_csv("testdata/data/denmark.csv")[["LRM", "LRY", "IBO", "IDE"]]
mac = pd.read_csv("testdata/data/macrodata.csv")
mac = np.log(mac[["realgdp", "realcons", "realinv"]])

out = {"library": "statsmodels", "version": statsmodels.__version__,
       "coint_johansen": [], "select_order": [], "vecm": []}

for name, d in (("denmark", den), ("macrodata", mac)):
    for det in (-1, 0, 1):
        for kd in (1, 2):
            r = coint_johansen(d.values, det, kd)
            out["coint_johansen"].append({
                "data": name, "columns": list(d.columns), "det_order": det,
                "k_ar_diff": kd, "eig": r.eig.tolist(), "trace": r.lr1.tolist(),
                "maxeig": r.lr2.tolist(), "cvt": r.cvt.tolist(),
                "cvm": r.cvm.tolist()})

for trend in ("n", "c", "ct"):
    sel = VAR(den.values).select_order(maxlags=5, trend=trend)
    ics = {k: [float(x) for x in v] for k, v in sel.ics.items()}
    out["select_order"].append({"data": "denmark", "trend": trend, "maxlags": 5,
                                "ics": ics,
                                "selected": {k: int(v) for k, v in sel.selected_orders.items()}})

for det in ("n", "co", "ci", "colo", "coli"):
    for kd in (1, 2):
        f = VECM(den.values, k_ar_diff=kd, coint_rank=1, deterministic=det).fit()
        out["vecm"].append({"data": "denmark", "deterministic": det, "k_ar_diff": kd,
                            "rank": 1, "alpha": f.alpha.tolist(),
                            "stderr_alpha": f.stderr_alpha.tolist(),
                            "beta": f.beta.tolist(), "stderr_beta": f.stderr_beta.tolist(),
                            "sigma_u": f.sigma_u.tolist()})

from statsmodels.tsa.coint_tables import c_sjt, c_sja
out["tables"] = [{"det_order": det, "n": n, "trace": c_sjt(n, det).tolist(),
                  "maxeig": c_sja(n, det).tolist()}
                 for det in (-1, 0, 1) for n in range(1, 13)]

with open("testdata/fixtures/johansen_statsmodels.json", "w") as fh:
    json.dump(out, fh, indent=1)
print("statsmodels", statsmodels.__version__)
