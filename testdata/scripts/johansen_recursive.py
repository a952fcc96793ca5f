#!/usr/bin/python3
"""Reference values for the recursive eigenvalues and trace statistics of
analysis/johansen (Recursive) and for the companion roots of a VECM. Run
from the repository root:

    /usr/bin/python3 testdata/scripts/johansen_recursive.py

Writes testdata/fixtures/johansen_recursive.json with

  * "statsmodels": the X-form, every parameter re-estimated on each
    subsample, as statsmodels' coint_johansen (Debian python3-statsmodels)
    run on the first n + k + 1 rows of the levels for every n from the
    first window to T (det_order -1 is case n, 0 is case c); eigenvalues
    (eig) and trace statistics (lr1).

  * "numpy": written here with numpy and scipy from the published
    equations (Hansen and Johansen 1999, Econometrics Journal 2, §3):
        Z0t = Δy_t,  Z1t = ỹ_{t-1} (y_{t-1}, with 1 appended in case rc and a
              step dummy lagged once where given),
        Z2t = the short-run regressors (1 in case c, Δy_{t-1..t-k},
              an impulse dummy where given),
        R_it = Z_it - M_i2 M_22^{-1} Z_2t  (least-squares residuals),
        S_ij(t) = t^{-1} sum_{s<=t} R_is R_js',
        solve |λ S_11(t) - S_10(t) S_00(t)^{-1} S_01(t)| = 0,
        trace_r(t) = -t sum_{j>r} ln(1 - λ_j(t)).
    In the R-form the residuals R_it come from the regression on the full
    sample, once; in the X-form from the regression on the first t
    observations (a dummy column that is zero on the first t observations
    is left out of that subsample's Z2 or Z1).

  * "roots": the eigenvalues of the companion matrix of the VAR form
    (statsmodels VECMResults.var_rep) of statsmodels' VECM fitted with
    deterministic="co" (case c) at each rank, by numpy.linalg.eigvals.
"""
import json

import numpy as np
import pandas as pd
import scipy
import scipy.linalg as sl
import statsmodels
from statsmodels.tsa.vector_ar.vecm import VECM, coint_johansen

den = pd.read_csv("testdata/data/denmark.csv")[["LRM", "LRY", "IBO", "IDE"]].values
mac = np.log(pd.read_csv("testdata/data/macrodata.csv")[["realgdp", "realcons", "realinv"]].values)
DATA = {"denmark": den, "macrodata": mac}


def design(y, case, k, dummy=None, step=None):
    """Z0, Z1, Z2 for the rows s = k+1 .. T0-1 of y (Z2 None if empty);
    dummy enters Z2 at s, step enters Z1 lagged (at s-1)."""
    T0, K = y.shape
    rows = range(k + 1, T0)
    z0 = np.array([y[s] - y[s - 1] for s in rows])
    z1 = np.array([y[s - 1] for s in rows])
    if case == "rc":
        z1 = np.column_stack([z1, np.ones(len(z0))])
    if step is not None:
        z1 = np.column_stack([z1, np.array([step[s - 1] for s in rows])])
    z2 = []
    if case == "c":
        z2.append(np.ones((len(z0), 1)))
    for l in range(1, k + 1):
        z2.append(np.array([y[s - l] - y[s - l - 1] for s in rows]))
    if dummy is not None:
        z2.append(np.array([[dummy[s]] for s in rows]))
    z2 = np.column_stack(z2) if z2 else None
    return z0, z1, z2


def resid(a, x):
    if x is None:
        return a
    keep = [j for j in range(x.shape[1]) if np.any(x[:, j] != 0)]
    if not keep:
        return a
    x = x[:, keep]
    return a - x @ np.linalg.lstsq(x, a, rcond=None)[0]


def drop_zero(x, cols):
    """x without those of the columns cols that are zero throughout."""
    keep = [j for j in range(x.shape[1]) if j not in cols or np.any(x[:, j] != 0)]
    return x[:, keep]


def eig_trace(r0, r1, K):
    t = len(r0)
    s00, s11, s01 = r0.T @ r0 / t, r1.T @ r1 / t, r0.T @ r1 / t
    lam = sl.eigh(s01.T @ np.linalg.solve(s00, s01), s11, eigvals_only=True)
    lam = np.sort(lam)[::-1][:K]
    trace = [float(-t * np.sum(np.log(1 - lam[r:]))) for r in range(K)]
    return [float(v) for v in lam], trace


def numpy_recursive(y, case, k, first, form, dummy=None, step=None):
    K = y.shape[1]
    z0, z1, z2 = design(y, case, k, dummy, step)
    stepcol = [z1.shape[1] - 1] if step is not None else []
    T = len(z0)
    if form == "R":
        r0, r1 = resid(z0, z2), resid(z1, z2)
    out = {"end": [], "eig": [], "trace": []}
    for n in range(first, T + 1):
        if form == "R":
            e, tr = eig_trace(r0[:n], r1[:n], K)
        else:
            x = None if z2 is None else z2[:n]
            e, tr = eig_trace(resid(z0[:n], x), resid(drop_zero(z1[:n], stepcol), x), K)
        out["end"].append(n)
        out["eig"].append(e)
        out["trace"].append(tr)
    return out


out = {"library": "statsmodels", "version": statsmodels.__version__,
       "numpy": np.__version__, "scipy": scipy.__version__,
       "statsmodels": [], "numpy_recursive": [], "roots": []}

for name, det, k, first in (("denmark", -1, 1, 20), ("denmark", 0, 1, 20),
                            ("denmark", 0, 2, 25), ("macrodata", 0, 2, 60)):
    y = DATA[name]
    T = len(y) - k - 1
    rec = {"data": name, "det_order": det, "k_ar_diff": k, "first": first,
           "end": [], "eig": [], "trace": []}
    for n in range(first, T + 1):
        r = coint_johansen(y[:n + k + 1], det, k)
        rec["end"].append(n)
        rec["eig"].append(r.eig.tolist())
        rec["trace"].append(r.lr1.tolist())
    out["statsmodels"].append(rec)

impulse_row = 40  # a row of y: the impulse dummy is 1 there, 0 elsewhere
step_row = 35     # a row of y: the step dummy is 0 before it, 1 from it
for name, case, k, first, form, dummy in (
        ("denmark", "c", 1, 20, "R", None), ("denmark", "c", 2, 25, "R", None),
        ("denmark", "rc", 1, 20, "R", None), ("macrodata", "c", 2, 60, "R", None),
        ("denmark", "rc", 1, 20, "X", None), ("denmark", "c", 1, 20, "X", "impulse"),
        ("denmark", "c", 1, 20, "R", "impulse"), ("denmark", "rc", 1, 20, "X", "step"),
        ("denmark", "rc", 1, 20, "R", "step")):
    y = DATA[name]
    dv = sv = None
    if dummy == "impulse":
        dv = np.zeros(len(y))
        dv[impulse_row] = 1.0
    if dummy == "step":
        sv = np.zeros(len(y))
        sv[step_row:] = 1.0
    rec = numpy_recursive(y, case, k, first, form, dv, sv)
    rec.update({"data": name, "case": case, "lags": k, "first": first, "form": form,
                "impulse_row": impulse_row if dummy == "impulse" else None,
                "step_row": step_row if dummy == "step" else None})
    out["numpy_recursive"].append(rec)

for rank in (1, 2, 3):
    for k in (1, 2):
        f = VECM(den, k_ar_diff=k, coint_rank=rank, deterministic="co").fit()
        A = f.var_rep  # (k+1) x K x K
        p, K = A.shape[0], A.shape[1]
        F = np.zeros((K * p, K * p))
        for l in range(p):
            F[:K, l * K:(l + 1) * K] = A[l]
        F[K:, :-K] = np.eye(K * (p - 1))
        z = np.linalg.eigvals(F)
        out["roots"].append({"data": "denmark", "deterministic": "co", "k_ar_diff": k,
                             "rank": rank, "re": z.real.tolist(), "im": z.imag.tolist()})

with open("testdata/fixtures/johansen_recursive.json", "w") as fh:
    json.dump(out, fh, indent=0)
print("statsmodels", statsmodels.__version__, "numpy", np.__version__, "scipy", scipy.__version__)
