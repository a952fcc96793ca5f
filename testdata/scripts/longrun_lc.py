#!/usr/bin/python3
"""Reference values for analysis/longrun HansenLc: an independent numpy
implementation of Hansen's (1992, Journal of Business and Economic
Statistics 10, 321-335) Lc test of parameter stability in a cointegrating
regression estimated by fully modified OLS (Phillips and Hansen 1990), and
a Monte Carlo of its null distribution for the critical values.

FMOLS as in longrun_macro.py (first-stage static OLS, v_t = dx_t - mean,
Bartlett or QS kernel, Andrews 1991 AR(1) bandwidth or given). Then
  u+_t  = y+_t - z_t' theta+,           y+_t = y_t - omega12 Omega22^-1 v_t
  s_t   = z_t u+_t - (0', Delta+21')'   (the correction on the rows of x)
  S_t   = s_1 + ... + s_t
  Lc    = n^-1 sum_t S_t' (omega11.2 Z'Z)^-1 S_t   (n = T - 1 observations).

Mode "fixture" (default): testdata/fixtures/longrun_lc.json for the macro
data. Mode "crit": the 1%, 5%, 10% upper quantiles of Lc under the null
(y_t = x_t'1 + u_t, x a Gaussian random walk with m columns, u iid N(0,1)
independent of dx, deterministic terms c or ct), T = 500, Bartlett kernel,
Andrews bandwidth, REPS replications, printed with their Monte Carlo
standard errors; written to testdata/fixtures/longrun_lc_crit.json.
Run: /usr/bin/python3 longrun_lc.py [crit REPS]
"""
import json, math, os, sys
import numpy as np, pandas as pd

here = os.path.dirname(os.path.abspath(__file__))


def det_cols(case, idx):
    t = idx + 1.0
    return [np.ones_like(t), t, t * t][: {"n": 0, "c": 1, "ct": 2, "ctt": 3}[case]]


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


def fmols_lc(y, xs, det, kind, bw):
    T = len(y)
    idx = np.arange(1, T)
    n = len(idx)
    Z = np.column_stack(det_cols(det, idx) + [x[idx] for x in xs])
    yy = y[idx]
    b0 = np.linalg.lstsq(Z, yy, rcond=None)[0]
    u = yy - Z @ b0
    V = np.column_stack([np.diff(x) for x in xs])
    V = V - V.mean(0)
    W = np.column_stack([u, V])
    b = bw if bw > 0 else andrews(W, kind)
    js = np.arange(n)
    kw = kernel(kind, js / b)
    use = [j for j in range(n) if kw[j] != 0] if kind == "bartlett" else range(n)
    Delta = np.zeros((W.shape[1], W.shape[1]))
    for j in use:
        Delta += kw[j] * (W[j:].T @ W[: n - j] / n).T
    G0 = W.T @ W / n
    Omega = Delta + Delta.T - G0
    o21, O22 = Omega[1:, :1], Omega[1:, 1:]
    g = np.linalg.solve(O22, o21)
    ystar = yy - (V @ g).ravel()
    dplus = Delta[1:, :1] - Delta[1:, 1:] @ g
    nd = Z.shape[1] - len(xs)
    corr = np.zeros(Z.shape[1])
    corr[nd:] = dplus.ravel()
    M = Z.T @ Z
    theta = np.linalg.solve(M, Z.T @ ystar - n * corr)
    o112 = float(Omega[0, 0] - (o21.T @ g)[0, 0])
    up = ystar - Z @ theta
    s = Z * up[:, None] - corr[None, :]
    S = np.cumsum(s, axis=0)
    Lc = float(np.einsum("ti,ti->", S, np.linalg.solve(o112 * M, S.T).T)) / n
    return dict(theta=theta.tolist(), bandwidth_used=float(b), omega11_2=o112, lc=Lc, ssum=float(np.abs(S[-1]).max()))


def fixture():
    d = pd.read_csv(os.path.join(here, "..", "data", "macrodata.csv"))
    v = {"lc": np.log(d.realcons.values), "ly": np.log(d.realdpi.values), "li": np.log(d.realinv.values)}
    cases = [
        dict(name="c_bartlett_auto", y="lc", x=["ly"], det="c", kernel="bartlett", bandwidth=0.0),
        dict(name="c_qs_auto2", y="lc", x=["ly", "li"], det="c", kernel="qs", bandwidth=0.0),
        dict(name="ct_bartlett_fixed", y="lc", x=["ly"], det="ct", kernel="bartlett", bandwidth=5.0),
        dict(name="ct_qs_fixed2", y="lc", x=["ly", "li"], det="ct", kernel="qs", bandwidth=3.7),
    ]
    out = {"library": "numpy %s" % np.__version__, "cases": []}
    for c in cases:
        r = fmols_lc(v[c["y"]], [v[x] for x in c["x"]], c["det"], c["kernel"], c["bandwidth"])
        assert r["ssum"] < 1e-8, r["ssum"]
        out["cases"].append(dict(c, **r))
        print(c["name"], r["lc"], r["bandwidth_used"])
    with open(os.path.join(here, "..", "fixtures", "longrun_lc.json"), "w") as fh:
        json.dump(out, fh, indent=1)
        fh.write("\n")


def crit(reps):
    rng = np.random.default_rng(20240615)
    T = 500
    table = {"library": "numpy %s" % np.__version__, "T": T, "reps": reps, "seed": 20240615, "entries": []}
    for det in ("c", "ct"):
        for m in (1, 2, 3, 4):
            lc = np.empty(reps)
            for r in range(reps):
                xs = [np.cumsum(rng.standard_normal(T)) for _ in range(m)]
                y = sum(xs) + rng.standard_normal(T)
                lc[r] = fmols_lc(y, xs, det, "bartlett", 0.0)["lc"]
            lc.sort()
            row = {"det": det, "m": m}
            for lev in (0.01, 0.05, 0.10):
                q = 1 - lev
                val = float(np.quantile(lc, q))
                # MCSE: binomial order-statistic interval / 2 / 1.96
                lo = lc[max(0, int(math.floor(reps * q - 1.96 * math.sqrt(reps * q * (1 - q)))))]
                hi = lc[min(reps - 1, int(math.ceil(reps * q + 1.96 * math.sqrt(reps * q * (1 - q)))))]
                row["%g" % lev] = val
                row["mcse_%g" % lev] = float((hi - lo) / (2 * 1.96))
            table["entries"].append(row)
            print(row, flush=True)
    with open(os.path.join(here, "..", "fixtures", "longrun_lc_crit.json"), "w") as fh:
        json.dump(table, fh, indent=1)
        fh.write("\n")


if len(sys.argv) > 1 and sys.argv[1] == "crit":
    crit(int(sys.argv[2]) if len(sys.argv) > 2 else 10000)
else:
    fixture()
