#!/usr/bin/python3
"""Reference values for galley's least-squares checks.

Library: statsmodels (Debian python3-statsmodels), OLS with classical,
HC1 and HAC (Bartlett, maxlags=L, use_correction=True) covariances, on the
public-domain US macro data that statsmodels ships (testdata/data/macrodata.csv).
Without a constant statsmodels' rsquared and rsquared_adj are the uncentred
ones (1 - ssr/uncentered_tss, adjusted with k_constant = 0); the fixture also
records both forms for every case (r2_centred = 1 - ssr/centered_tss,
r2_uncentred = 1 - ssr/uncentered_tss).
Run from the repository root: /usr/bin/python3 testdata/scripts/ols_macrodata.py
"""
import json
import numpy as np
import pandas as pd
import statsmodels
import statsmodels.api as sm
from statsmodels.stats.stattools import durbin_watson

d = pd.read_csv("testdata/data/macrodata.csv")
cases = []

def case(name, y, X, terms, hac_lags=(1, 4)):
    X = np.column_stack(X)
    m = sm.OLS(y, X)
    r = m.fit()
    out = {"name": name, "terms": terms, "nobs": int(r.nobs), "coef": r.params.tolist(),
           "se_ols": r.bse.tolist(), "r2": r.rsquared, "r2_adj": r.rsquared_adj,
           "k_constant": int(m.k_constant),
           "r2_centred": 1 - r.ssr / r.centered_tss, "r2_uncentred": 1 - r.ssr / r.uncentered_tss,
           "dw": float(durbin_watson(r.resid)), "loglik": r.llf,
           "se_hc1": m.fit(cov_type="HC1").bse.tolist(), "hac": {}}
    for L in hac_lags:
        rh = m.fit(cov_type="HAC", cov_kwds={"maxlags": L, "use_correction": True})
        out["hac"][str(L)] = rh.bse.tolist()
    cases.append(out)

lc, ly = np.log(d.realcons.values), np.log(d.realdpi.values)
li = np.log(d.realinv.values)
one = np.ones(len(d))
case("logcons_on_logdpi", lc, [one, ly], ["const", "log(realdpi)"])
case("logcons_on_logdpi_loginv", lc, [one, ly, li], ["const", "log(realdpi)", "log(realinv)"])
case("infl_on_tbil_unemp", d.infl.values, [one, d.tbilrate.values, d.unemp.values], ["const", "tbilrate", "unemp"], hac_lags=(0, 2, 8))
# no constant: growth of consumption on growth of income
dlc, dly = np.diff(lc), np.diff(ly)
case("dlogcons_on_dlogdpi_noconst", dlc, [dly], ["dlog(realdpi)"])

json.dump({"source": "statsmodels " + statsmodels.__version__ + " OLS on testdata/data/macrodata.csv",
           "cases": cases}, open("testdata/fixtures/ols_macrodata.json", "w"), indent=1)
