#!/usr/bin/python3
"""Reference values for analysis/longrun on testdata/data/macrodata.csv.

DOLS: statsmodels OLS (Debian python3-statsmodels) on leads and lags of the
differenced regressors built here with pandas; HAC covariance with
maxlags=L and use_correction=True (the N/(N-K) factor of ols.HAC); lead/lag
selection by statsmodels' own aic/bic on the common sample, then refit on
the chosen model's own sample; Wald tests by statsmodels wald_test
(chi-square form).

FMOLS: an independent numpy implementation written here from the published
formulas (Phillips and Hansen 1990; kernels and AR(1) plug-in bandwidth of
Andrews 1991), vectorised, with only the first-stage static regression done
by statsmodels OLS.

Writes testdata/fixtures/longrun_macro.json. Run: /usr/bin/python3 longrun_macro.py
"""
import json, os
import numpy as np, pandas as pd, statsmodels
import statsmodels.api as sm
from scipy import stats

here = os.path.dirname(os.path.abspath(__file__))
d = pd.read_csv(os.path.join(here, "..", "data", "macrodata.csv"))
v = {"lc": np.log(d.realcons.values), "ly": np.log(d.realdpi.values),
     "li": np.log(d.realinv.values)}
T = len(d)

def det_cols(case, idx):
    t = idx + 1.0
    return [np.ones_like(t), t, t * t][: {"n": 0, "c": 1, "ct": 2, "ctt": 3}[case]]

def dols_design(y, xs, case, p, q, first, last):
    idx = np.arange(first, last + 1)
    cols = det_cols(case, idx) + [x[idx] for x in xs]
    for x in xs:
        dx = pd.Series(x).diff().values
        for j in range(-p, q + 1):
            cols.append(dx[idx + j])
    return y[idx], np.column_stack(cols)

def dols(c):
    y, xs = v[c["y"]], [v[x] for x in c["x"]]
    cov = dict(cov_type="HAC", cov_kwds={"maxlags": c["hac"], "use_correction": True})
    if c["select"] == "fixed":
        p, q = c["lags"], c["leads"]
    else:
        best = None
        for a in range(c["maxlags"] + 1):
            for b in range(c["maxleads"] + 1):
                yy, X = dols_design(y, xs, c["det"], a, b, c["maxlags"] + 1, T - 1 - c["maxleads"])
                r = sm.OLS(yy, X).fit()
                ic = r.aic if c["select"] == "aic" else r.bic
                if best is None or ic < best[0]:
                    best = (ic, a, b)
        _, p, q = best
    yy, X = dols_design(y, xs, c["det"], p, q, p + 1, T - 1 - q)
    r = sm.OLS(yy, X).fit(**cov)
    nd = len(det_cols(c["det"], np.arange(1)))
    k = len(xs)
    out = dict(c, chosen_lags=p, chosen_leads=q, nobs=int(r.nobs),
               coef=list(r.params), se=list(r.bse))
    if "R" in c:
        R = np.zeros((len(c["R"]), X.shape[1]))
        R[:, nd:nd + k] = c["R"]
        w = r.wald_test((R, np.array(c["r"])), use_f=False, scalar=True)
        out["wald"] = [float(w.statistic), float(w.pvalue), len(c["R"])]
    return out

def kernel(kind, x):
    x = np.abs(x)
    if kind == "bartlett":
        return np.where(x < 1, 1 - x, 0.0)
    z = 6 * np.pi * x / 5
    with np.errstate(divide="ignore", invalid="ignore"):
        k = 25 / (12 * np.pi ** 2 * x ** 2) * (np.sin(z) / z - np.cos(z))
    return np.where(x == 0, 1.0, k)

def andrews(W, kind):
    n = W.shape[0]
    rho = (W[1:] * W[:-1]).sum(0) / (W[:-1] ** 2).sum(0)
    s2 = ((W[1:] - rho * W[:-1]) ** 2).sum(0) / (n - 1)
    den = (s2 ** 2 / (1 - rho) ** 4).sum()
    if kind == "bartlett":
        a1 = (4 * rho ** 2 * s2 ** 2 / ((1 - rho) ** 6 * (1 + rho) ** 2)).sum() / den
        return 1.1447 * (a1 * n) ** (1 / 3)
    a2 = (4 * rho ** 2 * s2 ** 2 / (1 - rho) ** 8).sum() / den
    return 1.3221 * (a2 * n) ** 0.2

def fmols(c):
    y, xs = v[c["y"]], [v[x] for x in c["x"]]
    idx = np.arange(1, T)
    n = len(idx)
    Z = np.column_stack(det_cols(c["det"], idx) + [x[idx] for x in xs])
    yy = y[idx]
    u = sm.OLS(yy, Z).fit().resid
    V = np.column_stack([np.diff(x) for x in xs])
    V = V - V.mean(0)
    W = np.column_stack([u, V])
    b = c["bandwidth"] if c["bandwidth"] > 0 else andrews(W, c["kernel"])
    gam = [W[j:].T @ W[: n - j] / n for j in range(n)]       # Gamma(j) = sum w_t w_{t-j}'
    kw = kernel(c["kernel"], np.arange(n) / b)
    Delta = sum(kw[j] * gam[j].T for j in range(n))
    Omega = gam[0] + sum(kw[j] * (gam[j] + gam[j].T) for j in range(1, n))
    o21, O22 = Omega[1:, :1], Omega[1:, 1:]
    g = np.linalg.solve(O22, o21)
    ystar = yy - (V @ g).ravel()
    dplus = Delta[1:, :1] - Delta[1:, 1:] @ g
    nd = Z.shape[1] - len(xs)
    corr = np.zeros(Z.shape[1])
    corr[nd:] = n * dplus.ravel()
    ZZi = np.linalg.inv(Z.T @ Z)
    theta = ZZi @ (Z.T @ ystar - corr)
    o112 = float(Omega[0, 0] - (o21.T @ g)[0, 0])
    cov = o112 * ZZi
    out = dict(c, bandwidth_used=b, nobs=n, coef=list(theta), se=list(np.sqrt(np.diag(cov))),
               omega=Omega.tolist(), delta=Delta.tolist(), omega11_2=o112)
    if "R" in c:
        R, r = np.array(c["R"], float), np.array(c["r"], float)
        dd = R @ theta[nd:] - r
        W_ = float(dd @ np.linalg.solve(R @ cov[nd:, nd:] @ R.T, dd))
        out["wald"] = [W_, float(stats.chi2.sf(W_, len(r))), len(r)]
    return out

dols_cases = [
    dict(name="c_fixed", y="lc", x=["ly"], det="c", select="fixed", lags=2, leads=2, hac=4,
         R=[[1.0]], r=[1.0]),
    dict(name="ct_fixed", y="lc", x=["ly", "li"], det="ct", select="fixed", lags=1, leads=3, hac=6,
         R=[[1.0, 0.0], [0.0, 1.0]], r=[1.0, 0.0]),
    dict(name="c_aic", y="lc", x=["ly", "li"], det="c", select="aic", maxlags=3, maxleads=3, hac=4,
         R=[[1.0, 1.0]], r=[1.0]),
    dict(name="c_bic", y="lc", x=["ly"], det="c", select="bic", maxlags=4, maxleads=4, hac=5),
    dict(name="n_fixed", y="lc", x=["ly"], det="n", select="fixed", lags=0, leads=0, hac=3),
]
fmols_cases = [
    dict(name="c_bartlett_fixed", y="lc", x=["ly"], det="c", kernel="bartlett", bandwidth=5.0,
         R=[[1.0]], r=[1.0]),
    dict(name="c_qs_auto", y="lc", x=["ly", "li"], det="c", kernel="qs", bandwidth=0.0,
         R=[[1.0, 0.0], [0.0, 1.0]], r=[1.0, 0.0]),
    dict(name="ct_bartlett_auto", y="lc", x=["ly"], det="ct", kernel="bartlett", bandwidth=0.0),
    dict(name="c_qs_fixed", y="lc", x=["ly"], det="c", kernel="qs", bandwidth=3.7),
    dict(name="ctt_bartlett_auto", y="lc", x=["ly", "li"], det="ctt", kernel="bartlett", bandwidth=0.0),
]
out = {"library": "statsmodels", "version": statsmodels.__version__, "numpy": np.__version__,
       "dols": [dols(c) for c in dols_cases], "fmols": [fmols(c) for c in fmols_cases]}
with open(os.path.join(here, "..", "fixtures", "longrun_macro.json"), "w") as fh:
    json.dump(out, fh, indent=1)
    fh.write("\n")
for c in out["dols"]:
    print("dols", c["name"], c["chosen_lags"], c["chosen_leads"], c["coef"][:3], c.get("wald"))
for c in out["fmols"]:
    print("fmols", c["name"], c["bandwidth_used"], c["coef"], c["se"], c.get("wald"))
