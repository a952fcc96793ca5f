#!/usr/bin/python3
"""Reference values for analysis/vardyn (impulse responses, variance
decompositions, Granger causality, Toda-Yamamoto) and the VECM causality
tests of analysis/johansen.

Run from the repository root with Debian's python3-statsmodels 0.13.5 and
python3-numpy:

    /usr/bin/python3 testdata/scripts/vardyn_statsmodels.py

Writes testdata/fixtures/vardyn_statsmodels.json:

* var: statsmodels VAR on 100*dlog(realgdp, realcons, realinv) of
  macrodata.csv (1959Q2-2009Q3), 2 lags, constant: coefficient matrices,
  sigma_u, irf(10).irfs and .orth_irfs, fevd(10).decomp, and
  test_causality(caused, causing, kind="wald" and "f") for every ordered
  pair (statistic, p-value, df).
* var_order: the same VAR with the columns reordered (realinv, realgdp,
  realcons), orth_irfs: a Cholesky ordering other than the data's.
* girf: generalised impulse responses (Pesaran and Shin 1998),
  Phi_h Sigma e_j / sqrt(sigma_jj), from the numpy function girf() below
  applied to statsmodels' ma_rep and sigma_u.
* ty: Toda-Yamamoto (1995) Wald tests in a VAR in the log levels of the same
  three series (p = 2, dmax = 1: a VAR(3) with constant), only the first p
  lags restricted; numpy on statsmodels' params, regressors and sigma_u.
* vecm: statsmodels VECM on the Danish data (LRM, LRY, IBO, IDE), one lagged
  difference, rank 1, deterministic "ci" and "co": var_rep, sigma_u,
  irf(10).irfs and .orth_irfs.
* vecm_causality: Wald tests in the VECM equations given statsmodels'
  beta (numpy least squares of each Delta y_i on beta'y~_{t-1}, the lagged
  differences and the unrestricted constant; s^2 = e'e/(T - m)):
  short-run (the lagged differences of the causing series), long-run (the
  loading) and strong (both), for every ordered pair.
"""
import json

import numpy as np
import pandas as pd
import statsmodels
from statsmodels.tsa.api import VAR
from statsmodels.tsa.vector_ar.vecm import VECM
from scipy import stats

out = {"library": "statsmodels", "version": statsmodels.__version__, "numpy": np.__version__}

m = pd.read_csv("testdata/data/macrodata.csv")
names = ["realgdp", "realcons", "realinv"]
lv = np.log(m[names].values)
dl = 100 * np.diff(lv, axis=0)
H = 10


def girf(ma, sigma):
    """Generalised impulse responses: psi_h(j) = Phi_h Sigma e_j / sqrt(sigma_jj)."""
    k = sigma.shape[0]
    out = np.empty_like(ma)
    for h in range(ma.shape[0]):
        for j in range(k):
            out[h][:, j] = ma[h] @ sigma[:, j] / np.sqrt(sigma[j, j])
    return out


res = VAR(dl).fit(2, trend="c")
irf = res.irf(H)
fevd = res.fevd(H)
caus = []
for i in range(3):
    for j in range(3):
        if i == j:
            continue
        w = res.test_causality(i, [j], kind="wald")
        f = res.test_causality(i, [j], kind="f")
        caus.append({"caused": i, "causing": j, "wald": float(w.test_statistic), "wald_p": float(w.pvalue), "wald_df": int(w.df),
                     "f": float(f.test_statistic), "f_p": float(f.pvalue), "f_df": [int(x) for x in f.df]})
out["var"] = {"series": names, "scale": "100*dlog", "lags": 2, "trend": "c",
              "coefs": res.coefs.tolist(), "intercept": res.intercept.tolist(), "sigma_u": np.asarray(res.sigma_u).tolist(),
              "irfs": irf.irfs.tolist(), "orth_irfs": irf.orth_irfs.tolist(), "fevd": fevd.decomp.tolist(),
              "causality": caus, "girf": girf(res.ma_rep(H), np.asarray(res.sigma_u)).tolist()}

order = [2, 0, 1]
r2 = VAR(dl[:, order]).fit(2, trend="c")
out["var_order"] = {"order": order, "orth_irfs": r2.irf(H).orth_irfs.tolist()}

# Toda-Yamamoto: VAR(p + dmax) in levels, Wald on the first p lags only.
p, dmax = 2, 1
rl = VAR(lv).fit(p + dmax, trend="c")
params = np.asarray(rl.params)  # (1 + K(p+dmax)) x K: const, lag1 (K), lag2 (K), ...
X = np.asarray(rl.endog_lagged)  # the regressors, in the order of params' rows
xtxi = np.linalg.inv(X.T @ X)
sig = np.asarray(rl.sigma_u)     # degrees-of-freedom adjusted, as in test_causality
ty = []
for i in range(3):
    for j in range(3):
        if i == j:
            continue
        idx = [1 + l * 3 + j for l in range(p)]  # lags 1..p of series j
        b = params[idx, i]
        V = sig[i, i] * xtxi[np.ix_(idx, idx)]
        W = float(b @ np.linalg.solve(V, b))
        ty.append({"caused": i, "causing": j, "wald": W, "df": p, "p": float(stats.chi2.sf(W, p))})
out["ty"] = {"series": names, "scale": "log", "p": p, "dmax": dmax, "tests": ty}

d = pd.read_csv("testdata/data/denmark.csv")[["LRM", "LRY", "IBO", "IDE"]].values
out["vecm"] = []
out["vecm_causality"] = []
for det in ["ci", "co"]:
    v = VECM(d, k_ar_diff=1, coint_rank=1, deterministic=det).fit()
    vi = v.irf(H)
    out["vecm"].append({"deterministic": det, "k_ar_diff": 1, "rank": 1, "var_rep": v.var_rep.tolist(),
                        "sigma_u": np.asarray(v.sigma_u).tolist(), "irfs": vi.irfs.tolist(), "orth_irfs": vi.orth_irfs.tolist(),
                        "girf": girf(v.ma_rep(H), np.asarray(v.sigma_u)).tolist()})
    # Causality in the VECM equations given beta.
    beta = np.asarray(v.beta)  # K x r (ci: the constant's row is in det_coef_coint)
    T = d.shape[0] - 2
    dy = np.diff(d, axis=0)
    ylag = d[1:-1]
    ect = ylag @ beta
    if det == "ci":
        ect = ect + np.asarray(v.det_coef_coint).reshape(1, -1)
    X = [ect, dy[:-1]]
    if det == "co":
        X.append(np.ones((T, 1)))
    X = np.hstack(X)
    Y = dy[1:]
    tests = []
    for i in range(4):
        b, *_ = np.linalg.lstsq(X, Y[:, i], rcond=None)
        e = Y[:, i] - X @ b
        s2 = e @ e / (T - X.shape[1])
        C = s2 * np.linalg.inv(X.T @ X)
        for j in range(4):
            if i == j:
                continue
            for kind, idx in [("short", [1 + j]), ("long", [0]), ("strong", [0, 1 + j])]:
                W = float(b[idx] @ np.linalg.solve(C[np.ix_(idx, idx)], b[idx]))
                q = len(idx)
                tests.append({"caused": i, "causing": j, "kind": kind, "wald": W, "df": q, "p": float(stats.chi2.sf(W, q)),
                              "f": W / q, "f_df": [q, T - X.shape[1]], "f_p": float(stats.f.sf(W / q, q, T - X.shape[1]))})
    out["vecm_causality"].append({"deterministic": det, "tests": tests})

with open("testdata/fixtures/vardyn_statsmodels.json", "w") as f:
    json.dump(out, f)
print("statsmodels", statsmodels.__version__)
