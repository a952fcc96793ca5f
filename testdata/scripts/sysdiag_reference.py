#!/usr/bin/python3
"""Reference values for analysis/sysdiag (system residual diagnostics) and
the vecm directive's `diagnostics:` rows. Run from the repository root:

    /usr/bin/python3 testdata/scripts/sysdiag_reference.py

Needs Debian's python3-statsmodels (0.13.5), python3-numpy, python3-scipy.
Writes testdata/fixtures/sysdiag_reference.json. For each system the
fixture holds the residuals U (T×K) and regressors X (T×n) that the tests
were computed from, so that the Go tests compare the tests and not the
estimation. Sources of each value:

  * jb (skew, kurt, joint): statsmodels VARResults.test_normality /
    VECMResults.test_normality gives the joint statistic; the skewness and
    kurtosis parts are recomputed here (Lütkepohl 2005, §4.5) and their sum
    is asserted equal to statsmodels' joint statistic.
  * serial (LM and Edgerton–Shukur F, h = 1..4): numpy written here from
    the published formulas (Lütkepohl 2005, §4.4.4; Edgerton and Shukur
    1999):
        aux: U = X B + [U_{-1} .. U_{-h}] D + E, presample U = 0
        LM = T (K - tr(S_R^{-1} S_e)),  chi2(h K^2)
        R2 = 1 - |S_e|/|S_R|, m = K h, s = sqrt((K^2 m^2 - 4)/(K^2 + m^2 - 5))
        (s = 1 when either is <= 0), q = K m/2 - 1,
        N = T - n - m - (K - m + 1)/2,
        F = ((1 - R2)^(-1/s) - 1) (N s - q)/(K m),  F(K m, N s - q).
    For K = 1 they are checked here against statsmodels'
    acorr_breusch_godfrey (lm, fval) and stored under "single".
  * arch (q = 1, 2): numpy from Lütkepohl (2005, ch. 16):
        v_t = vech(u_t u_t'), regression on [1, v_{t-1} .. v_{t-q}], t > q,
        R2m = 1 - 2/(K(K+1)) tr(Omega Omega0^{-1}), stat = T_q K(K+1) R2m/2,
        chi2(q K^2 (K+1)^2 / 4), T_q = T - q.
    For K = 1 checked against statsmodels' het_arch ((T - q) R^2).
  * dh: numpy from Doornik and Hansen (2008): correlation-matrix
    orthogonalisation, D'Agostino's z1 (asserted equal to
    scipy.stats.skewtest's statistic on each transformed component) and the
    Wilson–Hilferty z2; statistic sum z1^2 + z2^2, chi2(2K).
"""
import json

import numpy as np
import pandas as pd
import scipy
import statsmodels
from scipy import stats
from statsmodels.regression.linear_model import OLS
from statsmodels.stats.diagnostic import acorr_breusch_godfrey, het_arch
from statsmodels.tsa.api import VAR
from statsmodels.tsa.vector_ar.vecm import VECM


def serial(u, x, h):
    t, k = u.shape
    n = 0 if x is None else x.shape[1]
    lagged = np.zeros((t, k * h))
    for l in range(1, h + 1):
        lagged[l:, (l - 1) * k:l * k] = u[:-l]
    z = lagged if x is None else np.hstack([x, lagged])
    er = u if x is None else u - x @ np.linalg.lstsq(x, u, rcond=None)[0]
    ee = u - z @ np.linalg.lstsq(z, u, rcond=None)[0]
    sr, se = er.T @ er / t, ee.T @ ee / t
    lm = t * (k - np.trace(np.linalg.solve(sr, se)))
    m = k * h
    r2 = 1 - np.linalg.det(se) / np.linalg.det(sr)
    num, den = k * k * m * m - 4, k * k + m * m - 5
    s = np.sqrt(num / den) if num > 0 and den > 0 else 1.0
    q = k * m / 2 - 1
    nn = t - n - m - (k - m + 1) / 2
    df2 = nn * s - q
    f = ((1 - r2) ** (-1 / s) - 1) * df2 / (k * m)
    return {"h": h, "lm": lm, "lm_df": k * m, "lm_p": stats.chi2.sf(lm, k * m),
            "f": f, "f_df1": k * m, "f_df2": df2, "f_p": stats.f.sf(f, k * m, df2)}


def vech(a):
    k = a.shape[0]
    return np.array([a[i, j] for j in range(k) for i in range(j, k)])


def arch(u, q):
    t, k = u.shape
    v = np.array([vech(np.outer(r, r)) for r in u])
    y = v[q:]
    x = np.hstack([np.ones((t - q, 1))] + [v[q - l:t - l] for l in range(1, q + 1)])
    e = y - x @ np.linalg.lstsq(x, y, rcond=None)[0]
    yc = y - y.mean(0)
    om, om0 = e.T @ e / (t - q), yc.T @ yc / (t - q)
    r2 = 1 - 2 / (k * (k + 1)) * np.trace(om @ np.linalg.inv(om0))
    stat = 0.5 * (t - q) * k * (k + 1) * r2
    df = q * k * k * (k + 1) ** 2 // 4
    return {"q": q, "stat": stat, "df": df, "p": stats.chi2.sf(stat, df)}


def jb_parts(u):
    t, k = u.shape
    c = u - u.mean(0)
    p = np.linalg.cholesky(c.T @ c / t)
    w = np.linalg.solve(p, c.T)
    b1 = (w ** 3).mean(1)
    b2 = (w ** 4).mean(1)
    ls, lk = t * b1 @ b1 / 6, t * (b2 - 3) @ (b2 - 3) / 24
    return {"skew": ls, "skew_p": stats.chi2.sf(ls, k), "kurt": lk, "kurt_p": stats.chi2.sf(lk, k),
            "joint": ls + lk, "joint_p": stats.chi2.sf(ls + lk, 2 * k), "df": k}


def dh(u):
    t, k = u.shape
    n = float(t)
    c = u - u.mean(0)
    s = c.T @ c / t
    v = np.diag(1 / np.sqrt(np.diag(s)))
    lam, h = np.linalg.eigh(v @ s @ v)
    y = c @ (h @ np.diag(lam ** -0.5) @ h.T @ v).T
    z1, z2 = [], []
    for j in range(k):
        d = y[:, j] - y[:, j].mean()
        m2, m3, m4 = (d ** 2).mean(), (d ** 3).mean(), (d ** 4).mean()
        rb1, b2 = m3 / m2 ** 1.5, m4 / m2 ** 2
        beta = 3 * (n * n + 27 * n - 70) * (n + 1) * (n + 3) / ((n - 2) * (n + 5) * (n + 7) * (n + 9))
        w2 = -1 + np.sqrt(2 * (beta - 1))
        delta = 1 / np.sqrt(np.log(np.sqrt(w2)))
        yy = rb1 * np.sqrt((w2 - 1) * (n + 1) * (n + 3) / (12 * (n - 2)))
        a1 = delta * np.log(yy + np.sqrt(yy * yy + 1))
        sk = stats.skewtest(y[:, j]).statistic
        assert abs(a1 - sk) < 1e-9 * max(1, abs(sk)), (a1, sk)
        b1 = rb1 * rb1
        dd = (n - 3) * (n + 1) * (n * n + 15 * n - 4)
        a = (n - 2) * (n + 5) * (n + 7) * (n * n + 27 * n - 70) / (6 * dd)
        cc = (n - 7) * (n + 5) * (n + 7) * (n * n + 2 * n - 5) / (6 * dd)
        kk = (n + 5) * (n + 7) * (n ** 3 + 37 * n * n + 11 * n - 313) / (12 * dd)
        alpha = a + b1 * cc
        chi = 2 * kk * (b2 - 1 - b1)
        z1.append(a1)
        z2.append((np.cbrt(chi / (2 * alpha)) - 1 + 1 / (9 * alpha)) * np.sqrt(9 * alpha))
    e = float(np.sum(np.square(z1)) + np.sum(np.square(z2)))
    return {"z1": z1, "z2": z2, "stat": e, "df": 2 * k, "p": stats.chi2.sf(e, 2 * k)}


def system(name, u, x, sm_joint, hs=(1, 2, 3, 4), qs=(1, 2)):
    parts = jb_parts(u)
    assert abs(parts["joint"] - sm_joint) <= 1e-10 * sm_joint, (parts["joint"], sm_joint)
    parts["joint_statsmodels"] = sm_joint
    return {"name": name, "u": u.tolist(), "x": None if x is None else x.tolist(),
            "jb": parts, "serial": [serial(u, x, h) for h in hs],
            "arch": [arch(u, q) for q in qs], "dh": dh(u)}


out = {"library": "statsmodels", "version": statsmodels.__version__,
       "numpy": np.__version__, "scipy": scipy.__version__, "systems": [], "single": [], "vecm": []}

mac = pd.read_csv("testdata/data/macrodata.csv")
us = 100 * np.log(mac[["realgdp", "realcons", "realinv"]]).diff().dropna()
den = pd.read_csv("testdata/data/denmark.csv")[["LRM", "LRY", "IBO", "IDE"]]

for name, d in (("macrodata 100*dlog(realgdp, realcons, realinv), VAR(2) with constant", us),
                ("denmark LRM, LRY, IBO, IDE, VAR(2) with constant", den)):
    r = VAR(d.values).fit(2, trend="c")
    u, x = np.asarray(r.resid), np.asarray(r.endog_lagged)
    out["systems"].append(system(name, u, x, float(r.test_normality().test_statistic)))

# K = 1: the system formulas against statsmodels' single-equation tests.
y = us.values[2:, 0]
x = np.asarray(VAR(us.values).fit(2, trend="c").endog_lagged)
res = OLS(y, x).fit()
u1 = res.resid[:, None]
single = {"name": "macrodata equation 1 of the VAR(2), by OLS", "u": u1.tolist(), "x": x.tolist(),
          "serial": [], "arch": []}
for h in (1, 2, 3, 4):
    lm, lmp, fv, fp = acorr_breusch_godfrey(res, nlags=h)
    mine = serial(u1, x, h)
    assert abs(mine["lm"] - lm) < 1e-8 * lm and abs(mine["f"] - fv) < 1e-8 * fv, (mine, lm, fv)
    single["serial"].append({"h": h, "lm": lm, "lm_p": lmp, "f": fv, "f_p": fp,
                             "f_df2": float(res.nobs - x.shape[1] - h)})
for q in (1, 2, 3, 4):
    lm, lmp, _, _ = het_arch(res.resid, nlags=q)
    mine = arch(u1, q)
    assert abs(mine["stat"] - lm) < 1e-8 * lm, (mine, lm)
    single["arch"].append({"q": q, "stat": lm, "p": lmp})
out["single"].append(single)

# VECM on the Danish data (rank 1, one lagged difference): statsmodels'
# residuals, the regressors [beta'y_{t-1} (with the restricted constant
# for "ci"), const (for "co"), dy_{t-1}], and the tests on them.
for det, case in (("co", "constant"), ("ci", "restricted constant")):
    f = VECM(den.values, k_ar_diff=1, coint_rank=1, deterministic=det).fit()
    yv = den.values
    t = yv.shape[0] - 2
    ylag = yv[1:-1]
    beta = f.beta
    if det == "ci":
        ect = np.hstack([ylag, np.ones((t, 1))]) @ np.vstack([beta, f.det_coef_coint.T]) if f.det_coef_coint.size else ylag @ beta
    else:
        ect = ylag @ beta
    dy = np.diff(yv, axis=0)
    cols = [ect]
    if det == "co":
        cols.append(np.ones((t, 1)))
    cols.append(dy[:-1])
    xv = np.hstack(cols)
    u = np.asarray(f.resid)
    # The residuals are least-squares residuals on these regressors.
    assert np.abs(xv.T @ u).max() < 1e-8 * np.abs(xv).max() * np.abs(u).max() * t, np.abs(xv.T @ u).max()
    s = system("denmark VECM rank 1, k_ar_diff 1, deterministic " + det, u, xv,
               float(f.test_normality().test_statistic), qs=(1,))
    s["case"] = case
    out["vecm"].append(s)

with open("testdata/fixtures/sysdiag_reference.json", "w") as fh:
    json.dump(out, fh, indent=0)
print("statsmodels", statsmodels.__version__, "numpy", np.__version__, "scipy", scipy.__version__)
