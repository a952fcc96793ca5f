#!/usr/bin/python3
"""Reference values for analysis/longrun.CCR on testdata/data/macrodata.csv.

An independent numpy implementation of Park's (1992) canonical cointegrating
regression, written here from the published formulas (as recalled; see the
doc comment of CCR): the first stage is static OLS of y on (d_t, x_t) over
t = 2..T; w_t = (u_t, v_t') with v_t the demeaned first difference of x;
the kernel (Bartlett or quadratic spectral) and Andrews' (1991) AR(1) plug-in
bandwidth; Sigma = mean of w_t w_t'; Gamma2 = sum_{j>=0} k(j/b) n^-1
sum_t w_{t+j} v_t' (built directly from its definition, not from the
one-sided matrix galley uses); Omega = Gamma(0) + sum_{j>=1} k(j/b)
(Gamma(j) + Gamma(j)');
  x*_t = x_t - (Sigma^-1 Gamma2)' w_t,
  y*_t = y_t - (Sigma^-1 Gamma2 b_ols + (0, omega12 Omega22^-1)')' w_t,
OLS of y* on (d_t, x*_t) by numpy.linalg.lstsq, covariance
omega_{1.2} (Z*'Z*)^-1, Wald tests in chi-square form with scipy.

Writes testdata/fixtures/longrun_ccr.json.
Run: /usr/bin/python3 testdata/scripts/longrun_ccr.py
"""
import json, os
import numpy as np, scipy
from scipy import stats

here = os.path.dirname(os.path.abspath(__file__))
raw = np.genfromtxt(os.path.join(here, "..", "data", "macrodata.csv"), delimiter=",", names=True, dtype=None, encoding="utf-8")
v = {"lc": np.log(raw["realcons"].astype(float)), "ly": np.log(raw["realdpi"].astype(float)),
     "li": np.log(raw["realinv"].astype(float))}
T = len(raw)


def kernel(kind, x):
    x = abs(x)
    if kind == "bartlett":
        return 1 - x if x < 1 else 0.0
    if x == 0:
        return 1.0
    z = 6 * np.pi * x / 5
    return 25 / (12 * np.pi ** 2 * x ** 2) * (np.sin(z) / z - np.cos(z))


def andrews(W, kind):
    # Andrews (1991) AR(1) plug-in, every column of W with unit weight.
    num2 = num1 = den = 0.0
    n = W.shape[0]
    for a in range(W.shape[1]):
        e = W[:, a]
        rho = e[1:] @ e[:-1] / (e[:-1] @ e[:-1])
        s2 = np.sum((e[1:] - rho * e[:-1]) ** 2) / (n - 1)
        den += s2 ** 2 / (1 - rho) ** 4
        num1 += 4 * rho ** 2 * s2 ** 2 / ((1 - rho) ** 6 * (1 + rho) ** 2)
        num2 += 4 * rho ** 2 * s2 ** 2 / (1 - rho) ** 8
    if kind == "bartlett":
        return 1.1447 * (num1 / den * n) ** (1 / 3)
    return 1.3221 * (num2 / den * n) ** 0.2


def ccr(c):
    y, xs = v[c["y"]], [v[x] for x in c["x"]]
    k = len(xs)
    t = np.arange(2, T + 1, dtype=float)           # trend counted from the first observation
    D = [np.ones_like(t), t, t * t][: {"n": 0, "c": 1, "ct": 2, "ctt": 3}[c["det"]]]
    nd = len(D)
    X = np.column_stack([x[1:] for x in xs])
    Z = np.column_stack(D + [X])
    yy = y[1:]
    n = len(yy)
    b_ols = np.linalg.lstsq(Z, yy, rcond=None)[0]
    u = yy - Z @ b_ols
    V = np.column_stack([x[1:] - x[:-1] for x in xs])
    V = V - V.mean(axis=0)
    W = np.column_stack([u, V])
    b = c["bandwidth"] if c["bandwidth"] > 0 else andrews(W, c["kernel"])
    kw = np.array([kernel(c["kernel"], j / b) for j in range(n)])
    Sigma = W.T @ W / n
    Omega = Sigma.copy()
    Gamma2 = np.zeros((1 + k, k))
    for j in range(n):
        if kw[j] == 0:
            continue
        G = W[j:].T @ W[: n - j] / n               # n^-1 sum_t w_t w_{t-j}'
        if j > 0:
            Omega += kw[j] * (G + G.T)
        Gamma2 += kw[j] * (W[j:].T @ V[: n - j]) / n   # n^-1 sum_t w_{t+j} v_t'
    o12, O22 = Omega[0, 1:], Omega[1:, 1:]
    kappa = np.linalg.solve(O22, o12)
    o112 = Omega[0, 0] - o12 @ kappa
    Pi = np.linalg.solve(Sigma, Gamma2)
    Xs = X - W @ Pi
    ys = yy - W @ (Pi @ b_ols[nd:] + np.concatenate([[0.0], kappa]))
    Zs = np.column_stack(D + [Xs])
    theta = np.linalg.lstsq(Zs, ys, rcond=None)[0]
    cov = o112 * np.linalg.inv(Zs.T @ Zs)
    out = dict(c, bandwidth_used=float(b), nobs=n, coef=theta.tolist(), se=np.sqrt(np.diag(cov)).tolist(),
               sigma=Sigma.tolist(), pi=Pi.tolist(), omega11_2=float(o112),
               ystar_sum=float(ys.sum()), ystar_last=float(ys[-1]),
               xstar_sum=Xs.sum(axis=0).tolist(), xstar_last=Xs[-1].tolist(),
               ssr=float(np.sum((ys - Zs @ theta) ** 2)))
    if "R" in c:
        R, r = np.array(c["R"], float), np.array(c["r"], float)
        d = R @ theta[nd:] - r
        w = float(d @ np.linalg.solve(R @ cov[nd:, nd:] @ R.T, d))
        out["wald"] = [w, float(stats.chi2.sf(w, len(r))), len(r)]
    return out


cases = [
    dict(name="c_bartlett_fixed", y="lc", x=["ly"], det="c", kernel="bartlett", bandwidth=5.0,
         R=[[1.0]], r=[1.0]),
    dict(name="c_bartlett_auto", y="lc", x=["ly"], det="c", kernel="bartlett", bandwidth=0.0),
    dict(name="c_qs_auto", y="lc", x=["ly", "li"], det="c", kernel="qs", bandwidth=0.0,
         R=[[1.0, 0.0], [0.0, 1.0]], r=[1.0, 0.0]),
    dict(name="ct_bartlett_auto", y="lc", x=["ly", "li"], det="ct", kernel="bartlett", bandwidth=0.0,
         R=[[1.0, 1.0]], r=[1.0]),
    dict(name="n_qs_fixed", y="lc", x=["ly"], det="n", kernel="qs", bandwidth=3.7),
    dict(name="ctt_bartlett_auto", y="lc", x=["ly", "li"], det="ctt", kernel="bartlett", bandwidth=0.0),
]
out = {"library": "numpy", "version": np.__version__, "scipy": scipy.__version__,
       "ccr": [ccr(c) for c in cases]}
with open(os.path.join(here, "..", "fixtures", "longrun_ccr.json"), "w") as fh:
    json.dump(out, fh, indent=1)
    fh.write("\n")
for c in out["ccr"]:
    print(c["name"], c["bandwidth_used"], c["coef"], c["se"], c.get("wald"))
