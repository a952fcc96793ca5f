#!/usr/bin/python3
"""Reference values for the bootstrap Bartlett correction of the trace
statistic in analysis/johansen (bartlett.go), written independently with
numpy (Debian python3-numpy) and scipy (python3-scipy). Run from the
repository root:

    /usr/bin/python3 testdata/scripts/johansen_bartlett.py

Writes testdata/fixtures/johansen_bartlett.json with

  * "doornik": the mean of the asymptotic trace distribution for
    d = K - r = 1..12 in the five cases, from the response surface of
    Doornik (1998), "Approximations to the asymptotic distributions of
    cointegration tests", Journal of Economic Surveys 12(5), 573-593,
    Table 7:  E = 2d^2 + a d + b + c sqrt(d) + e1 1{d=1} + e2 1{d=2}.
    The coefficients are those of the public transcriptions in the R
    packages pvars (coint_rscoef) and tsDyn (doornik_tab7_mean), which
    agree; they were not read from the journal itself.

  * "cases": for denmark.csv (LRM, LRY, IBO, IDE), cases c and rc, one
    lagged difference and every rank r: the trace statistic Q_r, B = 25
    vectors of Rademacher weights w_t (drawn here), the wild bootstrap
    statistics Q*_{r,b} for those weights (the recursive algorithm of
    Cavaliere, Rahbek and Taylor 2012, as in johansen_wildboot.py), their
    mean m_T, the asymptotic mean m_inf(K - r) and the corrected statistic
    Q_r * m_inf / m_T (Bartlett 1937; the bootstrap mean as in Rocke 1989).
"""
import json
import math

import numpy as np
import scipy
import scipy.linalg as sl

# Doornik (1998) Table 7, trace test mean: (a, b, c, e1, e2).
DOORNIK = {
    "n": (-1.0, 0.07, 0.0, 0.07, 0.0),     # H_z
    "rc": (2.01, 0.0, 0.0, 0.06, 0.05),    # H_c
    "c": (1.05, -1.55, 0.0, -0.5, -0.23),  # H_lc
    "rt": (4.05, 0.5, 0.0, -0.23, -0.07),  # H_l
    "ct": (2.85, -5.1, 1.35, -0.1, -0.06),  # H_ql
}


def asy_mean(case, d):
    a, b, c, e1, e2 = DOORNIK[case]
    return 2 * d * d + a * d + b + c * math.sqrt(d) + e1 * (d == 1) + e2 * (d == 2)


Y = np.genfromtxt("testdata/data/denmark.csv", delimiter=",", names=True)
Y = np.column_stack([Y[c] for c in ("LRM", "LRY", "IBO", "IDE")])


def design(y, case, k):
    T0, K = y.shape
    dy = np.diff(y, axis=0)
    rows = range(k + 1, T0)
    z0 = np.array([dy[s - 1] for s in rows])
    z1 = np.array([y[s - 1] for s in rows])
    zs = [np.array([dy[s - 1 - l] for s in rows]) for l in range(1, k + 1)]
    if case == "rc":
        z1 = np.column_stack([z1, np.ones(len(z0))])
    if case == "c":
        zs = [np.ones((len(z0), 1))] + zs
    zs = np.column_stack(zs) if zs else None
    return z0, z1, zs


def resid(a, x):
    if x is None:
        return a
    return a - x @ np.linalg.lstsq(x, a, rcond=None)[0]


def johansen(y, case, k):
    z0, z1, zs = design(y, case, k)
    T = len(z0)
    r0, r1 = resid(z0, zs), resid(z1, zs)
    s00, s11, s01 = r0.T @ r0 / T, r1.T @ r1 / T, r0.T @ r1 / T
    lam, v = sl.eigh(s01.T @ np.linalg.solve(s00, s01), s11)
    o = np.argsort(lam)[::-1]
    lam, v = lam[o], v[:, o]
    K = y.shape[1]
    lam = lam[:K]
    trace = np.array([-T * np.sum(np.log(1 - lam[r:])) for r in range(K)])
    return trace, v, (z0, z1, zs)


def null_model(y, case, k, r):
    K = y.shape[1]
    _, v, (z0, z1, zs) = johansen(y, case, k)
    beta = v[:, :r]
    cols = []
    if r > 0:
        cols.append(z1 @ beta)
    if zs is not None:
        cols.append(zs)
    X = np.column_stack(cols) if cols else None
    if X is None:
        coef, e = np.zeros((0, K)), z0
    else:
        coef = np.linalg.lstsq(X, z0, rcond=None)[0]
        e = z0 - X @ coef
    alpha = coef[:r].T
    short = coef[r:].T
    off = 1 if case == "c" else 0
    gam = [short[:, off + (l - 1) * K: off + l * K] for l in range(1, k + 1)]
    A = [np.eye(K) + alpha @ beta[:K].T]
    if k >= 1:
        A[0] = A[0] + gam[0]
        for i in range(2, k + 1):
            A.append(gam[i - 1] - gam[i - 2])
        A.append(-gam[k - 1])
    p = k + 1
    d = np.zeros((len(z0), K))
    for t in range(len(z0)):
        s = t + p
        d[t] = y[s] - e[t] - sum(A[l - 1] @ y[s - l] for l in range(1, p + 1))
    return A, d, e


def bootstrap_stat(model, y, case, k, r, w):
    A, d, e = model
    p = k + 1
    ys = y.copy()
    for t in range(len(e)):
        s = t + p
        ys[s] = sum(A[l - 1] @ ys[s - l] for l in range(1, p + 1)) + d[t] + w[t] * e[t]
    tr, _, _ = johansen(ys, case, k)
    return tr[r]


B = 25
rng = np.random.default_rng(19370614)
out = {"library": "numpy", "version": np.__version__, "scipy": scipy.__version__,
       "source": "Doornik (1998) Table 7 as transcribed in R packages pvars and tsDyn",
       "doornik": [{"det": c, "dim": d, "mean": asy_mean(c, d)}
                   for c in ("n", "rc", "c", "rt", "ct") for d in range(1, 13)],
       "data": "denmark", "columns": ["LRM", "LRY", "IBO", "IDE"], "cases": []}
for case in ("c", "rc"):
    k = 1
    trace, _, (z0, _, _) = johansen(Y, case, k)
    T, K = len(z0), Y.shape[1]
    for r in range(K):
        model = null_model(Y, case, k, r)
        ws = [rng.choice([-1.0, 1.0], size=T) for _ in range(B)]
        stats = np.array([bootstrap_stat(model, Y, case, k, r, w) for w in ws])
        m_t = float(np.mean(stats))
        m_inf = asy_mean(case, K - r)
        out["cases"].append({
            "det": case, "lags": k, "rank": r, "trace": float(trace[r]),
            "weights": [w.tolist() for w in ws], "stats": stats.tolist(),
            "boot_mean": m_t, "asymptotic_mean": m_inf,
            "corrected": float(trace[r] * m_inf / m_t)})

with open("testdata/fixtures/johansen_bartlett.json", "w") as f:
    json.dump(out, f, indent=1)
