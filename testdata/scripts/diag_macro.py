#!/usr/bin/python3
"""Reference values for analysis/diag, from statsmodels (Debian python3-statsmodels).

Two regressions on testdata/data/macrodata.csv:
  growth: dlog(realcons) on const, dlog(realdpi), tbilrate   (1959Q2-2009Q3)
  levels: log(realinv)   on const, log(realgdp), tbilrate    (1959Q1-2009Q3)
Writes testdata/fixtures/diag_macro.json. Run: /usr/bin/python3 diag_macro.py
"""
import json, os
import numpy as np, pandas as pd, scipy, statsmodels
import statsmodels.api as sm
from statsmodels.stats.diagnostic import (acorr_breusch_godfrey, acorr_ljungbox,
                                          het_arch, het_breuschpagan, linear_reset)
from statsmodels.stats.stattools import jarque_bera, durbin_watson

here = os.path.dirname(os.path.abspath(__file__))
d = pd.read_csv(os.path.join(here, "..", "data", "macrodata.csv"))

def models():
    g = pd.DataFrame({"y": np.log(d.realcons).diff(), "x1": np.log(d.realdpi).diff(),
                      "x2": d.tbilrate}).dropna()
    yield "growth", g.y.values, sm.add_constant(g[["x1", "x2"]].values, prepend=True)
    yield "levels", np.log(d.realinv).values, sm.add_constant(
        np.column_stack([np.log(d.realgdp), d.tbilrate]), prepend=True)

out = {"library": "statsmodels", "version": statsmodels.__version__,
       "scipy": scipy.__version__, "models": {}}
for name, y, X in models():
    res = sm.OLS(y, X).fit()
    m = {"nobs": int(res.nobs)}
    for r in (1, 4):
        lm, p, _, _ = acorr_breusch_godfrey(res, nlags=r)
        m[f"bg{r}"] = [lm, p]
        lm, p, _, _ = het_arch(res.resid, nlags=r)
        m[f"arch{r}"] = [lm, p]
    for r in (4, 8):
        lb = acorr_ljungbox(res.resid, lags=[r], return_df=True)
        m[f"lb{r}"] = [float(lb.lb_stat.iloc[0]), float(lb.lb_pvalue.iloc[0])]
    jb, p, _, _ = jarque_bera(res.resid)
    m["jb"] = [jb, p]
    lm, p, _, _ = het_breuschpagan(res.resid, X, robust=True)
    m["bp_koenker"] = [lm, p]
    lm, p, _, _ = het_breuschpagan(res.resid, X, robust=False)
    m["bp_original"] = [lm, p]
    for h in (2, 3):
        w = linear_reset(res, power=h, test_type="fitted", use_f=True)
        m[f"reset{h}"] = [float(w.statistic), float(w.pvalue), int(w.df_num), int(w.df_denom)]
    m["dw"] = durbin_watson(res.resid)
    out["models"][name] = m

with open(os.path.join(here, "..", "fixtures", "diag_macro.json"), "w") as fh:
    json.dump(out, fh, indent=1, default=float)
    fh.write("\n")
