#!/usr/bin/python3
"""Reference values for the exact Durbin-Watson p-value (analysis/diag/dw_exact.go).

Independent of the Go code path: numpy/scipy (Debian python3-numpy, python3-scipy),
with the statistic itself from statsmodels (python3-statsmodels) durbin_watson.

For each regression on testdata/data/macrodata.csv, y on X:
  * the eigenvalues of Z'AZ, Z = scipy.linalg.null_space(X') (an SVD basis of the
    residual space, not the Householder QR of the Go code), A the first-difference form;
  * P(d <= c) = P(sum (lam_i - c) z_i^2 <= 0) by Imhof's (1961) formula
        1/2 - (1/pi) int_0^inf sin(theta(u)) / (u rho(u)) du,
        theta = 1/2 sum atan(w_i u), rho = prod (1 + w_i^2 u^2)^(1/4),
    integrated with scipy.integrate.quad over [0, inf) (QUADPACK qagi), at the
    observed d and at a grid of c;
  * a Monte Carlo estimate of the same probabilities: R draws of y ~ N(0, I), the
    least-squares residuals e = y - Q Q'y (numpy QR), d = sum(diff(e)^2)/sum(e^2)
    (no eigenvalues used), seeded.

Models:
  cons_dpi: log(realcons) on const, log(realdpi)            1959Q1-2009Q3
  infl:     infl on const, tbilrate, unemp                  1959Q1-2009Q3
  infl_nc:  infl on tbilrate, unemp (no constant)           1959Q1-2009Q3
  growth:   dlog(realcons) on const, dlog(realdpi), tbilrate 1959Q2-2009Q3
Writes testdata/fixtures/diag_dw_exact.json. Run: /usr/bin/python3 diag_dw_exact.py
"""
import json, os
import numpy as np, pandas as pd, scipy, statsmodels
import scipy.linalg, scipy.integrate
import statsmodels.api as sm
from statsmodels.stats.stattools import durbin_watson

here = os.path.dirname(os.path.abspath(__file__))
d = pd.read_csv(os.path.join(here, "..", "data", "macrodata.csv"))

GRID = [0.5, 1.0, 1.5, 1.8, 2.0, 2.2, 2.5, 3.0]
R = 1_000_000
CHUNK = 20_000
SEED = 20240611


def models():
    one = np.ones(len(d))
    yield "cons_dpi", np.log(d.realcons).values, np.column_stack([one, np.log(d.realdpi)])
    yield "infl", d.infl.values, np.column_stack([one, d.tbilrate, d.unemp])
    yield "infl_nc", d.infl.values, np.column_stack([d.tbilrate, d.unemp])
    g = pd.DataFrame({"y": np.log(d.realcons).diff(), "x1": np.log(d.realdpi).diff(),
                      "x2": d.tbilrate}).dropna()
    yield "growth", g.y.values, sm.add_constant(g[["x1", "x2"]].values, prepend=True)


def diff_form(n):
    a = 2 * np.eye(n) - np.eye(n, k=1) - np.eye(n, k=-1)
    a[0, 0] = a[-1, -1] = 1
    return a


def imhof_lower(lam, c):
    w = lam - c
    w = w[w != 0]
    if (w > 0).all():
        return 0.0, 0.0
    if (w < 0).all():
        return 1.0, 0.0

    def f(u):
        if u == 0:
            return 0.5 * w.sum()
        th = 0.5 * np.arctan(w * u).sum()
        rho = np.exp(0.25 * np.log1p((w * u) ** 2).sum())
        return np.sin(th) / (u * rho)

    val, err = scipy.integrate.quad(f, 0, np.inf, epsabs=1e-13, epsrel=1e-12, limit=2000)
    return 0.5 - val / np.pi, err / np.pi


out = {"library": "scipy", "version": scipy.__version__, "numpy": np.__version__,
       "statsmodels": statsmodels.__version__, "grid": GRID, "mc_reps": R, "mc_seed": SEED,
       "models": {}}
rng = np.random.default_rng(SEED)
for name, y, X in models():
    n, k = X.shape
    res = sm.OLS(y, X).fit()
    dw = float(durbin_watson(res.resid))
    Z = scipy.linalg.null_space(X.T)
    assert Z.shape == (n, n - k)
    lam = np.sort(scipy.linalg.eigvalsh(Z.T @ diff_form(n) @ Z))
    cs = [dw] + GRID
    quad, qerr = zip(*(imhof_lower(lam, c) for c in cs))
    assert max(qerr) < 1e-9, (name, qerr)
    Q, _ = np.linalg.qr(X)
    counts = np.zeros(len(cs))
    for _ in range(R // CHUNK):
        e = rng.standard_normal((CHUNK, n))
        e -= (e @ Q) @ Q.T
        dd = (np.diff(e, axis=1) ** 2).sum(axis=1) / (e ** 2).sum(axis=1)
        counts += np.array([(dd <= c).sum() for c in cs])
    out["models"][name] = {
        "nobs": n, "k": k, "dw": dw, "eigenvalues": lam.tolist(),
        "p_lower": quad[0], "quad_abserr": qerr[0],
        "cdf_grid": list(quad[1:]), "mc_p_lower": counts[0] / R, "mc_cdf_grid": (counts[1:] / R).tolist(),
    }
    print(name, n, k, dw, quad[0], counts[0] / R)

with open(os.path.join(here, "..", "fixtures", "diag_dw_exact.json"), "w") as fh:
    json.dump(out, fh, indent=1, default=float)
    fh.write("\n")
