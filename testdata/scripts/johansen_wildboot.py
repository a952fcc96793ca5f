#!/usr/bin/python3
"""Reference values for the wild bootstrap rank test in analysis/johansen
(Cavaliere, Rahbek and Taylor 2012 algorithm with Rademacher weights),
written independently with numpy and scipy (Debian python3-numpy,
python3-scipy) from the published description. Run from the repository
root:

    /usr/bin/python3 testdata/scripts/johansen_wildboot.py

For denmark.csv (LRM, LRY, IBO, IDE), cases c (unrestricted constant) and
rc (constant in the relations), 1 lagged difference, and every rank r:
  * the trace statistic Q_r;
  * the moduli of the companion roots of the VAR form of the VECM
    estimated under H(r);
  * for five vectors of Rademacher weights w_t (drawn here and stored), the
    trace statistic Q*_r of the bootstrap sample
    y*_t = sum_i A_i y*_{t-i} + d_t + w_t e_t built from the first k + 1
    observations (A_i, d_t, e_t: the VAR form, fitted deterministic part
    and residuals of the model under H(r)).

Writes testdata/fixtures/johansen_wildboot.json.
"""
import json
import numpy as np
import scipy
import scipy.linalg as sl

Y = np.genfromtxt("testdata/data/denmark.csv", delimiter=",", names=True)
Y = np.column_stack([Y[c] for c in ("LRM", "LRY", "IBO", "IDE")])


def design(y, case, k):
    T0, K = y.shape
    dy = np.diff(y, axis=0)           # dy[s-1] = y[s] - y[s-1]
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
    trace, v, (z0, z1, zs) = johansen(y, case, k)
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
    short = coef[r:].T  # K x ns
    off = 1 if case == "c" else 0
    gam = [short[:, off + (l - 1) * K: off + l * K] for l in range(1, k + 1)]
    A = [np.eye(K) + alpha @ beta[:K].T]
    if k >= 1:
        A[0] = A[0] + gam[0]
        for i in range(2, k + 1):
            A.append(gam[i - 1] - gam[i - 2])
        A.append(-gam[k - 1])
    p = k + 1
    T = len(z0)
    d = np.zeros((T, K))
    for t in range(T):
        s = t + p
        d[t] = y[s] - e[t] - sum(A[l - 1] @ y[s - l] for l in range(1, p + 1))
    F = np.zeros((K * p, K * p))
    for l in range(p):
        F[:K, l * K:(l + 1) * K] = A[l]
    F[K:, :-K] = np.eye(K * (p - 1))
    mods = sorted(np.abs(np.linalg.eigvals(F)), reverse=True)
    return A, d, e, mods, trace


def bootstrap_stat(y, case, k, r, w):
    A, d, e, _, _ = null_model(y, case, k, r)
    p = k + 1
    ys = y.copy()
    for t in range(len(e)):
        s = t + p
        ys[s] = sum(A[l - 1] @ ys[s - l] for l in range(1, p + 1)) + d[t] + w[t] * e[t]
    tr, _, _ = johansen(ys, case, k)
    return tr[r]


rng = np.random.default_rng(20240611)
out = {"library": "numpy", "version": np.__version__, "scipy": scipy.__version__,
       "data": "denmark", "columns": ["LRM", "LRY", "IBO", "IDE"], "cases": []}
for case in ("c", "rc"):
    k = 1
    trace, _, (z0, _, _) = johansen(Y, case, k)
    T = len(z0)
    for r in range(Y.shape[1]):
        _, _, _, mods, _ = null_model(Y, case, k, r)
        ws = [rng.choice([-1.0, 1.0], size=T) for _ in range(5)]
        out["cases"].append({
            "det": case, "lags": k, "rank": r, "trace": float(trace[r]),
            "moduli": [float(m) for m in mods],
            "weights": [w.tolist() for w in ws],
            "stats": [float(bootstrap_stat(Y, case, k, r, w)) for w in ws]})

with open("testdata/fixtures/johansen_wildboot.json", "w") as f:
    json.dump(out, f, indent=1)
