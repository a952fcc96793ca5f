#!/usr/bin/python3
"""Fixture for analysis/rules: automatic bandwidths and information criteria
on open data (testdata/data), from statsmodels (Debian python3-statsmodels,
used only as a reference library) and from hand computations in numpy.

Writes ../fixtures/rules_bandwidth.json with
  series   per series e (the input exactly as used, demeaned in numpy) and
           - hfo_lag: statsmodels.tsa.stattools._kpss_autolag(e, T), the
             Hobijn, Franses and Ooms (1998) lag of kpss(nlags="auto");
           - hfo_b: the same bandwidth before truncation, by hand in numpy;
           - nw_bartlett, nw_qs: Newey and West (1994) bandwidths by hand in
             numpy with the paper's preliminary lags 4(T/100)^{2/9} and
             4(T/100)^{2/25};
           - andrews_bartlett, andrews_qs: Andrews (1991) AR(1) bandwidths by
             hand in numpy;
  andrews_multi  Andrews (1991) on two columns with unit weights (numpy);
  kpss_auto      statsmodels kpss(y, regression, nlags="auto"): stat and lag;
  pp_resid       residuals of the lag-free Dickey-Fuller regression fitted by
                 numpy least squares and their Newey-West (1994) and
                 Hobijn et al. (1998) truncation lags (numpy);
  cap            a short series whose Hobijn et al. bandwidth exceeds T - 1:
                 statsmodels' _kpss_autolag and the lag kpss caps at T - 1;
  power          int(c*(T/100)**p) for T = 1..1500 by Python floats;
  ols_ic         statsmodels OLS aic and bic with nobs, k and ssr;
  var_ic         statsmodels VAR(p) log|Sigma_mle|, free parameters, nobs,
                 aic, bic, hqic.
For every truncated value the script also prints the distance of the real
value from the nearest integer, so that a flip by rounding would be seen.
"""
import json, os, warnings
import numpy as np
import pandas as pd
import statsmodels
import statsmodels.api as sm
from statsmodels.tsa.stattools import kpss, _kpss_autolag
from statsmodels.tsa.api import VAR

here = os.path.dirname(os.path.abspath(__file__))
data = os.path.join(here, "..", "data")
macro = pd.read_csv(os.path.join(data, "macrodata.csv"))
den = pd.read_csv(os.path.join(data, "denmark.csv"))

levels = {
    "log_realgdp": np.log(macro["realgdp"].values),
    "log_realcons": np.log(macro["realcons"].values),
    "tbilrate": macro["tbilrate"].values,
    "infl": macro["infl"].values,
    "unemp": macro["unemp"].values,
    "realint": macro["realint"].values,
    "dlog_realgdp": np.diff(np.log(macro["realgdp"].values)),
    "dlog_realinv": np.diff(np.log(macro["realinv"].values)),
    "denmark_LRM": den["LRM"].values,
    "denmark_IBO": den["IBO"].values,
}


def autocov(e, j):
    return np.dot(e[j:], e[: len(e) - j]) / len(e)


def nw94(e, q, n):
    """Newey and West (1994), written out from the paper's formulas."""
    T = len(e)
    s0 = autocov(e, 0) + 2 * sum(autocov(e, j) for j in range(1, n + 1))
    sq = 2 * sum(j**q * autocov(e, j) for j in range(1, n + 1))
    cg = {1: 1.1447, 2: 1.3221}[q]
    p = 1.0 / (2 * q + 1)
    return cg * ((sq / s0) ** 2) ** p * T**p


def andrews(w, kernel):
    """Andrews (1991, sec. 6) with AR(1) models, unit weights."""
    w = np.atleast_2d(w.T).T
    T = w.shape[0]
    n1 = n2 = d = 0.0
    for a in range(w.shape[1]):
        x, y = w[:-1, a], w[1:, a]
        rho = np.dot(x, y) / np.dot(x, x)
        s2 = np.sum((y - rho * x) ** 2) / (T - 1)
        n1 += 4 * rho**2 * s2**2 / ((1 - rho) ** 6 * (1 + rho) ** 2)
        n2 += 4 * rho**2 * s2**2 / (1 - rho) ** 8
        d += s2**2 / (1 - rho) ** 4
    if kernel == "bartlett":
        return 1.1447 * (n1 / d * T) ** (1 / 3)
    return 1.3221 * (n2 / d * T) ** 0.2


def frac(x):
    return abs(x - round(x))


series = []
closest = 1.0
for name, y in levels.items():
    e = y - y.mean()
    T = len(e)
    hfo_n = int(np.power(T, 2.0 / 9.0))
    row = {
        "name": name,
        "e": [float(v) for v in e],
        "hfo_prelim": hfo_n,
        "hfo_lag": int(_kpss_autolag(e, T)),
        "hfo_b": nw94(e, 1, hfo_n),
        "nw_bartlett_prelim": int(4 * (T / 100) ** (2 / 9)),
        "nw_qs_prelim": int(4 * (T / 100) ** (2 / 25)),
    }
    row["nw_bartlett"] = nw94(e, 1, row["nw_bartlett_prelim"])
    row["nw_qs"] = nw94(e, 2, row["nw_qs_prelim"])
    row["andrews_bartlett"] = andrews(e, "bartlett")
    row["andrews_qs"] = andrews(e, "qs")
    assert int(row["hfo_b"]) == row["hfo_lag"], name
    closest = min(closest, frac(row["hfo_b"]), frac(row["nw_bartlett"]))
    series.append(row)

w = np.column_stack([levels["dlog_realgdp"], np.diff(np.log(macro["realcons"].values))])
w = w - w.mean(axis=0)
andrews_multi = {"w": w.tolist(), "bartlett": andrews(w, "bartlett"), "qs": andrews(w, "qs")}

kpss_auto = []
for name in ["log_realgdp", "log_realcons", "tbilrate", "infl", "unemp", "denmark_LRM", "denmark_IBO"]:
    for case in ["c", "ct"]:
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            r = kpss(levels[name], regression=case, nlags="auto")
        kpss_auto.append({"series": name, "case": case, "stat": float(r[0]), "lags": int(r[2])})

pp_resid = []
for name in ["log_realgdp", "tbilrate", "infl", "unemp", "denmark_LRM"]:
    y = levels[name]
    for case in ["c", "ct"]:
        dy = np.diff(y)
        n = len(dy)
        cols = [np.ones(n)]
        if case == "ct":
            cols.append(np.arange(1, n + 1, dtype=float))
        cols.append(y[:-1])
        X = np.column_stack(cols)
        u = dy - X @ np.linalg.lstsq(X, dy, rcond=None)[0]
        bn = nw94(u, 1, int(4 * (n / 100) ** (2 / 9)))
        bh = nw94(u, 1, int(np.power(n, 2.0 / 9.0)))
        assert int(bh) == _kpss_autolag(u, n)
        closest = min(closest, frac(bn), frac(bh))
        pp_resid.append({"series": name, "case": case, "nw_lag": int(bn), "hfo_lag": int(bh)})

e = np.array([1, -1, 0.1] * 4, dtype=float)
cap = {"e": e.tolist(), "hfo_lag": int(_kpss_autolag(e, len(e))),
       "capped": min(int(_kpss_autolag(e, len(e))), len(e) - 1)}

rules = {"schwert12": (12, 0.25), "schwert4": (4, 0.25), "nw94_bartlett": (4, 2 / 9), "nw94_qs": (4, 2 / 25)}
power = {k: [int(c * (T / 100) ** p) for T in range(1, 1501)] for k, (c, p) in rules.items()}

ols_ic = []
X = sm.add_constant(np.column_stack([np.log(macro["realcons"].values), macro["tbilrate"].values]))
for name, y, x in [("log_realgdp~log_realcons+tbilrate", np.log(macro["realgdp"].values), X),
                   ("infl~const", macro["infl"].values, np.ones((len(macro), 1))),
                   ("denmark_LRM~LRY+IBO", den["LRM"].values, sm.add_constant(den[["LRY", "IBO"]].values))]:
    f = sm.OLS(y, x).fit()
    ols_ic.append({"model": name, "nobs": int(f.nobs), "k": int(x.shape[1]), "ssr": float(f.ssr),
                   "aic": float(f.aic), "bic": float(f.bic)})

var_ic = []
vdata = np.column_stack([np.diff(np.log(macro[c].values)) for c in ["realgdp", "realcons", "realinv"]])
for trend in ["c", "n", "ct"]:
    for p in [1, 2, 3, 4]:
        r = VAR(vdata).fit(p, trend=trend)
        ic = r.info_criteria
        ld = float(np.linalg.slogdet(r.sigma_u_mle)[1])
        var_ic.append({"trend": trend, "lags": p, "nobs": int(r.nobs),
                       "params": int(p * 9 + 3 * r.k_exog), "logdet": ld,
                       "aic": float(ic["aic"]), "bic": float(ic["bic"]), "hqic": float(ic["hqic"])})

out = {"library": "statsmodels " + statsmodels.__version__ + ", numpy " + np.__version__,
       "series": series, "andrews_multi": andrews_multi, "kpss_auto": kpss_auto,
       "pp_resid": pp_resid, "cap": cap, "power": power, "ols_ic": ols_ic, "var_ic": var_ic}
with open(os.path.join(here, "..", "fixtures", "rules_bandwidth.json"), "w") as f:
    json.dump(out, f, indent=0)
print("wrote rules_bandwidth.json with", out["library"], len(series), "series;",
      "closest truncated bandwidth to an integer: %.3g" % closest)
