#!/usr/bin/python3
"""Reference values for analysis/ecm, from statsmodels OLS (Debian python3-statsmodels).

The error-correction regressors are built here independently with pandas
(diff/shift) from testdata/data/macrodata.csv; the equilibrium error is the
residual of a static OLS of the level of y on a constant and the x's.
Covariances: nonrobust, HC1, and HAC with maxlags=L and use_correction=True
(statsmodels then scales by nobs/(nobs-k), the N/(N-K) factor of ols.Cov).
Writes testdata/fixtures/ecm_macro.json. Run: /usr/bin/python3 ecm_macro.py
"""
import json, os
import numpy as np, pandas as pd, statsmodels
import statsmodels.api as sm

here = os.path.dirname(os.path.abspath(__file__))
d = pd.read_csv(os.path.join(here, "..", "data", "macrodata.csv"))
v = pd.DataFrame({"lc": np.log(d.realcons), "ly": np.log(d.realdpi),
                  "r": d.tbilrate, "infl": d.infl})

def build(yname, xnames, p, q, extra):
    z = sm.OLS(v[yname], sm.add_constant(v[xnames])).fit().resid
    cols = {"const": 1.0, "ect(-1)": z.shift(1)}
    dy = v[yname].diff()
    for i in range(1, p + 1):
        cols[f"d.{yname}(-{i})"] = dy.shift(i)
    for x in xnames:
        dx = v[x].diff()
        for j in range(q + 1):
            cols[f"d.{x}" if j == 0 else f"d.{x}(-{j})"] = dx.shift(j)
    for e in extra:
        cols[e] = v[e]
    X = pd.DataFrame(cols)
    df = pd.concat([dy.rename("dy"), X], axis=1).dropna()
    return df.dy, df.drop(columns="dy"), df.index[0], df.index[-1]

cases = [
    dict(name="cons_income", y="lc", x=["ly"], p=2, q=1, extra=[]),
    dict(name="cons_income_rate", y="lc", x=["ly", "r"], p=1, q=2, extra=["infl"]),
    dict(name="static_short_run", y="lc", x=["ly"], p=0, q=0, extra=[]),
]
out = {"library": "statsmodels", "version": statsmodels.__version__, "cases": []}
for c in cases:
    y, X, first, last = build(c["y"], c["x"], c["p"], c["q"], c["extra"])
    r = dict(c, names=list(X.columns), first=int(first), last=int(last), nobs=len(y), fits={})
    for cov, kw in [("ols", dict()), ("hc1", dict(cov_type="HC1")),
                    ("hac(4)", dict(cov_type="HAC", cov_kwds={"maxlags": 4, "use_correction": True}))]:
        res = sm.OLS(y.values, X.values).fit(**kw)
        r["fits"][cov] = {"coef": list(res.params), "se": list(res.bse)}
    out["cases"].append(r)

with open(os.path.join(here, "..", "fixtures", "ecm_macro.json"), "w") as fh:
    json.dump(out, fh, indent=1)
    fh.write("\n")
