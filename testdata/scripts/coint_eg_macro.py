#!/usr/bin/python3
"""Reference values for analysis/coint EngleGranger, from statsmodels
(Debian python3-statsmodels) coint, adfuller and mackinnoncrit.

y = log(realcons) on k = 1, 2, 3 of log(realdpi), log(realgdp), log(realinv)
from testdata/data/macrodata.csv, trends n, c, ct, ctt, with a fixed lag
(maxlag=p, autolag=None) and with autolag='aic' (maxlag=4).

statsmodels coint evaluates the MacKinnon (2010) surface at T = nobs - 1
(static-regression observations minus one) whatever the ADF lag; galley
uses T = the ADF regression's observations (nobs - 1 - p). Both are
recorded: 'crit_sm' is coint's own output, 'crit_at_T' is mackinnoncrit
evaluated at galley's T. They coincide when p = 0.
Writes testdata/fixtures/coint_eg_macro.json. Run: /usr/bin/python3 coint_eg_macro.py
"""
import json, os
import numpy as np, pandas as pd, statsmodels
import statsmodels.api as sm
from statsmodels.tsa.stattools import coint, adfuller
from statsmodels.tsa.adfvalues import mackinnoncrit
from statsmodels.tsa.tsatools import add_trend

here = os.path.dirname(os.path.abspath(__file__))
d = pd.read_csv(os.path.join(here, "..", "data", "macrodata.csv"))
y = np.log(d.realcons.values)
X = np.column_stack([np.log(d.realdpi), np.log(d.realgdp), np.log(d.realinv)])

def nan(v):
    return None if np.isnan(v) else float(v)

cases = []
for k in (1, 2, 3):
    for trend in ("n", "c", "ct", "ctt"):
        for lag in [dict(maxlag=0, autolag=None), dict(maxlag=2, autolag=None),
                    dict(maxlag=4, autolag="aic")]:
            stat, p, crit = coint(y, X[:, :k], trend=trend, **lag)
            xx = X[:, :k] if trend == "n" else add_trend(X[:, :k], trend=trend, prepend=True)
            res = sm.OLS(y, xx).fit()
            adf = adfuller(res.resid, regression="n", store=True, **lag)
            st = adf[-1]
            used, nobs = st.usedlag, st.nobs
            assert abs(adf[0] - stat) < 1e-9 * abs(stat)
            c = dict(k=k, trend=trend, maxlag=lag["maxlag"], autolag=lag["autolag"] or "none",
                     stat=float(stat), pvalue=float(p), usedlag=int(used), nobs=int(nobs),
                     crit_sm=[nan(v) for v in crit], static=list(res.params))
            if trend != "n":
                c["crit_at_T"] = list(mackinnoncrit(N=k + 1, regression=trend, nobs=nobs))
            cases.append(c)
out = {"library": "statsmodels", "version": statsmodels.__version__, "cases": cases}
with open(os.path.join(here, "..", "fixtures", "coint_eg_macro.json"), "w") as fh:
    json.dump(out, fh, indent=1)
    fh.write("\n")
for c in cases:
    print(c["k"], c["trend"], c["autolag"], c["usedlag"], c["nobs"], round(c["stat"], 4), round(c["pvalue"], 4))
