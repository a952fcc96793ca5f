#!/usr/bin/python3
"""Fixture for analysis/unitroot NgPerron and the MAIC lag selector: an
independent numpy (Debian python3-numpy) implementation of the published
formulas, run on open datasets, plus a simulation of the asymptotic
distributions that checks the critical-value table of analysis/critical.

Formulas (Ng and Perron 2001, Econometrica 69, 1519-1554; Perron and Ng 1996;
Elliott, Rothenberg and Stock 1996), series y_1..y_T:
  GLS detrending: abar = 1 + cbar/T, cbar = -7 (constant) or -13.5 (trend);
    regress (y_1, y_t - abar y_{t-1}) on (z_1, z_t - abar z_{t-1}), z_t = 1 or
    (1, t); yd_t = y_t - z_t'beta.
  Autoregression with k lags: dyd_t = b0 yd_{t-1} + sum_j b_j dyd_{t-j} + e,
    no deterministic terms.
  MAIC(k) = ln s2_k + 2 (tau_k + k)/N on the common sample of the N = T-1-kmax
    last observations, s2_k = SSR_k/N, tau_k = b0^2 sum yd_{t-1}^2 / s2_k.
  s2_AR = (SSR_k/N_k) / (1 - sum_j b_j)^2 on the chosen k's own sample
    (N_k = T-1-k observations).
  kappa = T^-2 sum_{t=2..T} yd_{t-1}^2, last = yd_T^2 / T;
  MZa = (last - s2_AR)/(2 kappa), MSB = sqrt(kappa/s2_AR), MZt = MZa*MSB,
  MPT = (cbar^2 kappa - cbar last)/s2_AR (constant),
        (cbar^2 kappa + (1-cbar) last)/s2_AR (trend).
Least squares here is numpy.linalg.lstsq (SVD), the Go code uses Householder
QR: the two agree to rounding.

Writes ../fixtures/unitroot_ngperron.json.
"""
import json, math, os
import numpy as np

here = os.path.dirname(os.path.abspath(__file__))
data = os.path.join(here, "..", "data")


def read_column(file, name):
    with open(os.path.join(data, file)) as f:
        head = f.readline().strip().split(",")
        i = head.index(name)
        return np.array([float(line.strip().split(",")[i]) for line in f if line.strip()])


series = {
    "log_realgdp": np.log(read_column("macrodata.csv", "realgdp")),
    "log_realcons": np.log(read_column("macrodata.csv", "realcons")),
    "tbilrate": read_column("macrodata.csv", "tbilrate"),
    "infl": read_column("macrodata.csv", "infl"),
    "denmark_LRM": read_column("denmark.csv", "LRM"),
}


def gls_detrend(y, trend):
    T = len(y)
    cbar = -13.5 if trend else -7.0
    a = 1.0 + cbar / T
    t = np.arange(1, T + 1, dtype=float)
    z = np.column_stack([np.ones(T), t]) if trend else np.ones((T, 1))
    ya = np.concatenate([[y[0]], y[1:] - a * y[:-1]])
    za = np.vstack([z[:1], z[1:] - a * z[:-1]])
    beta = np.linalg.lstsq(za, ya, rcond=None)[0]
    return y - z @ beta, beta, cbar


def ar_fit(yd, k, first):
    """Regression of dyd_t on yd_{t-1}, dyd_{t-1..t-k} over the zero-based
    observations t = first..T-1; returns coefficients, SSR, N, conventional
    t-ratio of b0."""
    T = len(yd)
    rows = range(first, T)
    X = np.array([[yd[t - 1]] + [yd[t - j] - yd[t - j - 1] for j in range(1, k + 1)] for t in rows])
    dy = np.array([yd[t] - yd[t - 1] for t in rows])
    b = np.linalg.lstsq(X, dy, rcond=None)[0]
    e = dy - X @ b
    ssr = float(e @ e)
    n, K = X.shape
    cov = ssr / (n - K) * np.linalg.inv(X.T @ X)
    return b, ssr, n, b[0] / math.sqrt(cov[0, 0]), X


def maic(yd, kmax):
    vals = []
    for k in range(kmax + 1):
        b, ssr, n, _, X = ar_fit(yd, k, kmax + 1)
        s2 = ssr / n
        tau = b[0] ** 2 * float(X[:, 0] @ X[:, 0]) / s2
        vals.append(math.log(s2) + 2.0 * (tau + k) / n)
    return vals, int(np.argmin(vals))


def m_stats(yd, s2, cbar, trend):
    T = len(yd)
    kappa = float(yd[:-1] @ yd[:-1]) / T ** 2
    last = yd[-1] ** 2 / T
    mza = (last - s2) / (2 * kappa)
    msb = math.sqrt(kappa / s2)
    mpt = (cbar ** 2 * kappa + (1 - cbar) * last) / s2 if trend else (cbar ** 2 * kappa - cbar * last) / s2
    return mza, mza * msb, msb, mpt


def schwert(T):
    return min(int(math.floor(12 * (T / 100.0) ** 0.25)), T // 2 - 1)


rows = []
for name, y in series.items():
    for case in ["c", "ct"]:
        trend = case == "ct"
        yd, beta, cbar = gls_detrend(y, trend)
        T = len(y)
        specs = [("fixed", k) for k in (0, 1, 4)] + [("maic", m) for m in (4, 8, 12, -1)]
        for sel, m in specs:
            ic = None
            if sel == "fixed":
                k, kmax = m, m
            else:
                kmax = schwert(T) if m < 0 else m
                ic, k = maic(yd, kmax)
            b, ssr, n, tstat, _ = ar_fit(yd, k, k + 1)
            s2 = ssr / n / (1 - float(np.sum(b[1:]))) ** 2
            mza, mzt, msb, mpt = m_stats(yd, s2, cbar, trend)
            rows.append({"series": name, "case": case, "select": sel, "max": m, "maxlag": kmax,
                         "lags": k, "nobs": T, "regnobs": n, "beta": list(beta), "s2ar": s2,
                         "mza": mza, "mzt": mzt, "msb": msb, "mpt": mpt, "dfgls_tau": tstat,
                         "maic": ic})

# Simulation of the asymptotic distributions: Gaussian random walks of
# length T = 2000 (u_0 = 0, unit innovations), GLS-detrended, statistics
# with the known s2 = 1 (the limit of s2_AR). Quantiles at 1%, 5%, 10% with
# distribution-free 99.9% bounds from the binomial order statistics.
rng = np.random.default_rng(20010611)
T, reps, chunk = 2000, 50000, 2500
levels = [0.01, 0.05, 0.10]
sim = {}
for case in ["c", "ct"]:
    trend = case == "ct"
    cbar = -13.5 if trend else -7.0
    a = 1.0 + cbar / T
    t = np.arange(1, T + 1, dtype=float)
    z = np.column_stack([np.ones(T), t]) if trend else np.ones((T, 1))
    za = np.vstack([z[:1], z[1:] - a * z[:-1]])
    proj = np.linalg.pinv(za)  # beta = proj @ ya
    out = {s: [] for s in ["MZa", "MZt", "MSB", "MPT"]}
    for _ in range(reps // chunk):
        y = np.cumsum(rng.standard_normal((chunk, T)), axis=1)
        ya = np.concatenate([y[:, :1], y[:, 1:] - a * y[:, :-1]], axis=1)
        yd = y - (ya @ proj.T) @ z.T
        kappa = np.sum(yd[:, :-1] ** 2, axis=1) / T ** 2
        last = yd[:, -1] ** 2 / T
        mza = (last - 1.0) / (2 * kappa)
        msb = np.sqrt(kappa)
        mpt = cbar ** 2 * kappa + ((1 - cbar) * last if trend else -cbar * last)
        out["MZa"].append(mza); out["MZt"].append(mza * msb); out["MSB"].append(msb); out["MPT"].append(mpt)
    sim[case] = {}
    for s, parts in out.items():
        x = np.sort(np.concatenate(parts))
        n = len(x)
        q, lo, hi = [], [], []
        for p in levels:
            w = 3.29 * math.sqrt(n * p * (1 - p))
            q.append(float(np.quantile(x, p)))
            lo.append(float(x[max(int(math.floor(n * p - w)) - 1, 0)]))
            hi.append(float(x[min(int(math.ceil(n * p + w)) - 1, n - 1)]))
        sim[case][s] = {"q": q, "lo": lo, "hi": hi}

out = {"library": "numpy " + np.__version__,
       "method": "independent implementation of the published formulas (see script docstring)",
       "series": "macrodata.csv (log realgdp, log realcons, tbilrate, infl), denmark.csv (LRM)",
       "rows": rows,
       "simulation": {"T": T, "reps": reps, "seed": 20010611, "levels": levels, "bounds": "99.9% order-statistic", "cases": sim}}
with open(os.path.join(here, "..", "fixtures", "unitroot_ngperron.json"), "w") as f:
    json.dump(out, f, indent=0)
print("wrote unitroot_ngperron.json with", out["library"], len(rows), "rows")
for case in sim:
    for s in sim[case]:
        print(case, s, ["%.4f" % v for v in sim[case][s]["q"]], ["%.4f" % v for v in sim[case][s]["lo"]], ["%.4f" % v for v in sim[case][s]["hi"]])
