#!/usr/bin/python3
"""Reference values for analysis/coint GregoryHansen: an independent numpy
implementation of the formulas of Gregory and Hansen (1996, Journal of
Econometrics 70, Sections 2-3), written here from the paper.

For every candidate break k = ceil(trim*n) .. floor((1-trim)*n) (the number
of observations before the shift; phi_t = 1 for t > k, one-based):
  static OLS (numpy lstsq) of model
    C   y = mu1 + mu2 phi + a'x
    C/T y = mu1 + mu2 phi + b t + a'x
    C/S y = mu1 + mu2 phi + a1'x + a2' x phi
  ADF(tau): t-ratio of e_{t-1} in the regression of De_t on e_{t-1} and p
    lagged differences, no constant: numpy lstsq with fixed p, or
    statsmodels adfuller(regression="n", autolag="aic", maxlag=max) when a
    criterion chooses p;
  Za(tau), Zt(tau): rho = sum e_t e_{t+1} / sum e_t^2 (t = 1..n-1),
    v_t = e_t - rho e_{t-1}, gamma(j) = n^-1 sum v_t v_{t-j},
    lambda = sum_{j=1..L} (1 - j/(L+1)) gamma(j), omega2 = gamma(0) + 2 lambda,
    rho* = (sum e_t e_{t+1} - (n-1) lambda) / sum e_t^2,
    Za = n (rho* - 1), Zt = (rho* - 1) / sqrt(omega2 / sum e_t^2),
    L = floor(4 ((n-1)/100)^(1/4)) (the rule4 bandwidth of the n-1 v's) or given.
ADF*, Zt*, Za* are the minima over k (the first minimiser on ties).

Data: testdata/data/macrodata.csv (statsmodels' US macro data) and
testdata/data/denmark.csv (the Danish money demand data).
Writes testdata/fixtures/coint_gh_macro.json. Run: /usr/bin/python3 coint_gh_macro.py
"""
import json, math, os, warnings
import numpy as np, pandas as pd, statsmodels
from statsmodels.tsa.stattools import adfuller

here = os.path.dirname(os.path.abspath(__file__))
macro = pd.read_csv(os.path.join(here, "..", "data", "macrodata.csv"))
den = pd.read_csv(os.path.join(here, "..", "data", "denmark.csv"))
series = {
    "lc": np.log(macro.realcons.values), "ly": np.log(macro.realdpi.values),
    "li": np.log(macro.realinv.values),
    "lrm": den.LRM.values.astype(float), "lry": den.LRY.values.astype(float),
}


def design(x, model, k):
    n = len(x[0])
    phi = (np.arange(n) >= k).astype(float)
    cols = [np.ones(n), phi]
    if model == "ct":
        cols.append(np.arange(1, n + 1, dtype=float))
    cols += list(x)
    if model == "cs":
        cols += [xi * phi for xi in x]
    return np.column_stack(cols)


def adf_fixed(e, p):
    de = np.diff(e)
    rows = len(de) - p
    cols = [e[p:-1]] + [de[p - i:len(de) - i] for i in range(1, p + 1)]
    X = np.column_stack(cols)
    yy = de[p:]
    b, *_ = np.linalg.lstsq(X, yy, rcond=None)
    r = yy - X @ b
    s2 = r @ r / (rows - X.shape[1])
    cov = s2 * np.linalg.inv(X.T @ X)
    return b[0] / math.sqrt(cov[0, 0]), p


def adf_aic(e, maxlag):
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        r = adfuller(e, maxlag=maxlag, regression="n", autolag="AIC")
    return float(r[0]), int(r[2])


def zstats(e, L):
    n = len(e)
    see = e[:-1] @ e[:-1]
    sxy = e[:-1] @ e[1:]
    rho = sxy / see
    v = e[1:] - rho * e[:-1]
    g = [v[j:] @ v[:len(v) - j] / n for j in range(L + 1)]
    lam = sum((1 - j / (L + 1)) * g[j] for j in range(1, L + 1))
    om2 = g[0] + 2 * lam
    rs = (sxy - (n - 1) * lam) / see
    return n * (rs - 1), (rs - 1) / math.sqrt(om2 / see)


def gh(c):
    y = series[c["y"]]
    x = [series[v] for v in c["x"]]
    n = len(y)
    first = math.ceil(c["trim"] * n - 1e-9)
    last = math.floor((1 - c["trim"]) * n + 1e-9)
    minreg = len(x) + 2 if c["model"] == "cs" else 2
    first, last = max(first, minreg), min(last, n - minreg)
    L = c["bandwidth"] if c["bandwidth"] is not None else math.floor(4 * ((n - 1) / 100) ** 0.25)
    path = {"adf": [], "lags": [], "za": [], "zt": []}
    for k in range(first, last + 1):
        X = design(x, c["model"], k)
        b, *_ = np.linalg.lstsq(X, y, rcond=None)
        e = y - X @ b
        t, p = adf_fixed(e, c["lags"]) if c["select"] == "fixed" else adf_aic(e, c["max"])
        za, zt = zstats(e, L)
        path["adf"].append(t); path["lags"].append(p)
        path["za"].append(za); path["zt"].append(zt)
    out = dict(c, n=n, first=first, last=last, bw=L, path=path)
    for s in ("adf", "zt", "za"):
        i = int(np.argmin(path[s]))
        out[s] = {"stat": path[s][i], "break": first + i}
    out["adf"]["lags"] = path["lags"][int(np.argmin(path["adf"]))]
    return out


cases = [
    dict(name="c_p0", y="lc", x=["ly"], model="c", trim=0.15, select="fixed", lags=0, bandwidth=None),
    dict(name="ct_p2", y="lc", x=["ly"], model="ct", trim=0.15, select="fixed", lags=2, bandwidth=None),
    dict(name="cs_p1_bw6", y="lc", x=["ly"], model="cs", trim=0.15, select="fixed", lags=1, bandwidth=6),
    dict(name="cs2_aic", y="lc", x=["ly", "li"], model="cs", trim=0.15, select="aic", max=4, bandwidth=None),
    dict(name="ct2_trim10", y="lc", x=["ly", "li"], model="ct", trim=0.10, select="fixed", lags=3, bandwidth=2),
    dict(name="denmark_c_aic", y="lrm", x=["lry"], model="c", trim=0.15, select="aic", max=3, bandwidth=None),
    dict(name="denmark_cs_p0", y="lrm", x=["lry"], model="cs", trim=0.20, select="fixed", lags=0, bandwidth=3),
]
out = {"library": "numpy %s (ADF lag choice: statsmodels %s adfuller)" % (np.__version__, statsmodels.__version__),
       "cases": [gh(c) for c in cases]}
with open(os.path.join(here, "..", "fixtures", "coint_gh_macro.json"), "w") as fh:
    json.dump(out, fh, indent=1)
    fh.write("\n")
for c in out["cases"]:
    print(c["name"], c["first"], c["last"], c["bw"], c["adf"], c["zt"], c["za"])
