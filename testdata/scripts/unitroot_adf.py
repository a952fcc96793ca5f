#!/usr/bin/python3
"""Fixture for analysis/unitroot ADF: statsmodels (Debian python3-statsmodels)
adfuller, used only as a reference library, on open datasets.

Writes ../fixtures/unitroot_adf.json: for each series and case, adfuller with
fixed lags (autolag=None) and with autolag AIC, BIC and t-stat from a given
maxlag; records the statistic, p-value, lag used, number of observations
in the final regression, critical values and the best criterion value.
"""
import json, os
import numpy as np
import pandas as pd
import statsmodels
from statsmodels.tsa.stattools import adfuller

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
    for case in ["n", "c", "ct", "ctt"]:
        for lags in [0, 1, 4]:
            r = adfuller(y, maxlag=lags, regression=case, autolag=None)
            rows.append({"series": name, "case": case, "select": "fixed", "maxlag": lags,
                         "stat": r[0], "p": r[1], "lags": int(r[2]), "nobs": int(r[3]),
                         "crit": [r[4]["1%"], r[4]["5%"], r[4]["10%"]]})
        for sel, ms in [("aic", [4, 8, 12]), ("bic", [4, 8, 12]), ("t-stat", [4, 8, 12])]:
            for maxlag in ms:
                if name == "denmark_LRM" and maxlag > 8:
                    continue
                r = adfuller(y, maxlag=maxlag, regression=case, autolag=sel.upper() if sel != "t-stat" else sel)
                rows.append({"series": name, "case": case, "select": sel, "maxlag": maxlag,
                             "stat": r[0], "p": r[1], "lags": int(r[2]), "nobs": int(r[3]),
                             "crit": [r[4]["1%"], r[4]["5%"], r[4]["10%"]],
                             "icbest": float(r[5])})
out = {"library": "statsmodels " + statsmodels.__version__,
       "function": "statsmodels.tsa.stattools.adfuller",
       "series": "macrodata.csv (log realgdp, log realcons, tbilrate, infl), denmark.csv (LRM)",
       "rows": rows}
with open(os.path.join(here, "..", "fixtures", "unitroot_adf.json"), "w") as f:
    json.dump(out, f, indent=0)
print("wrote unitroot_adf.json with", out["library"], len(rows), "rows")
