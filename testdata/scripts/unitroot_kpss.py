#!/usr/bin/python3
"""Fixture for analysis/unitroot KPSS: statsmodels (Debian python3-statsmodels)
kpss, used only as a reference library, with fixed bandwidths on open data.

Writes ../fixtures/unitroot_kpss.json: statistic, p-value (interpolated in
the KPSS 1992 table, clipped at its ends), lags and critical values.
"""
import json, os, warnings
import numpy as np
import pandas as pd
import statsmodels
from statsmodels.tsa.stattools import kpss

here = os.path.dirname(os.path.abspath(__file__))
data = os.path.join(here, "..", "data")
macro = pd.read_csv(os.path.join(data, "macrodata.csv"))
den = pd.read_csv(os.path.join(data, "denmark.csv"))
series = {
    "log_realgdp": np.log(macro["realgdp"].values),
    "log_realcons": np.log(macro["realcons"].values),
    "tbilrate": macro["tbilrate"].values,
    "infl": macro["infl"].values,
    "denmark_LRM": den["LRM"].values,
}
rows = []
for name, y in series.items():
    for case in ["c", "ct"]:
        for lags in [0, 2, 4, 8, 14]:
            with warnings.catch_warnings(record=True) as w:
                warnings.simplefilter("always")
                r = kpss(y, regression=case, nlags=lags)
            clipped = any("outside of the range" in str(x.message) for x in w)
            rows.append({"series": name, "case": case, "lags": int(r[2]), "stat": float(r[0]),
                         "p": float(r[1]), "clipped": clipped,
                         "crit": [r[3]["10%"], r[3]["5%"], r[3]["2.5%"], r[3]["1%"]]})
out = {"library": "statsmodels " + statsmodels.__version__,
       "function": "statsmodels.tsa.stattools.kpss", "rows": rows}
with open(os.path.join(here, "..", "fixtures", "unitroot_kpss.json"), "w") as f:
    json.dump(out, f, indent=0)
print("wrote unitroot_kpss.json with", out["library"], len(rows), "rows",
      sum(r["clipped"] for r in rows), "clipped")
