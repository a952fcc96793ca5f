#!/usr/bin/python3
"""Reference values for analysis/ardl from statsmodels (Debian python3-statsmodels).

ARDL part (statsmodels.tsa.ardl): on the Danish money-demand data
(testdata/data/denmark.csv) and the US macro data (macrodata.csv):
  * UECM coefficients and standard errors (nonrobust), the bounds F
    statistic of UECMResults.bounds_test / ARDLResults.bounds_test for each
    case 1..5, the t-ratio of the lagged level of y, and the long-run
    coefficients ci_params with their standard errors ci_bse
    (delta method), for fixed orders;
  * the information criteria of ardl_select_order over p = 1..maxlag and
    q = 0..maxorder (entries where every x is included).
  The critical values of bounds_test are NOT recorded (see the Go test).

NARDL part (numpy and statsmodels OLS, independent of statsmodels.tsa.ardl):
  the partial sums x+ and x- are built with numpy from the published formulas
  (Shin, Yu and Greenwood-Nimmo 2014), the conditional ECM is assembled with
  pandas and fitted with statsmodels OLS; the symmetry tests are
  OLSResults.wald_test (F form); the cumulative dynamic multipliers are the
  recursion of SYG eq. (12) on the levels ARDL fitted by OLS on the same
  regressors in levels.

Writes testdata/fixtures/ardl_statsmodels.json.
Run: /usr/bin/python3 testdata/scripts/ardl_statsmodels.py
"""
import json, os, itertools
import numpy as np, pandas as pd, statsmodels, scipy
import statsmodels.api as sm
from statsmodels.tsa.ardl import ARDL, UECM, ardl_select_order

here = os.path.dirname(os.path.abspath(__file__))
dk = pd.read_csv(os.path.join(here, "..", "data", "denmark.csv"))
mac = pd.read_csv(os.path.join(here, "..", "data", "macrodata.csv"))
macv = pd.DataFrame({"lc": np.log(mac.realcons), "ly": np.log(mac.realdpi), "r": mac.tbilrate})
dkv = dk[["LRM", "LRY", "IBO", "IDE"]].astype(float)

TREND = {1: "n", 2: "c", 3: "c", 4: "ct", 5: "ct"}

def fixed_case(name, data, y, xs, p, q, case):
    exog = data[xs]
    order = dict(zip(xs, q))
    uecm = UECM(data[y], p, exog, order, trend=TREND[case], hold_back=max([p] + list(q)))
    ures = uecm.fit()
    bt = ures.bounds_test(case)
    names = list(ures.params.index)
    out = dict(name=name, y=y, x=xs, p=p, q=q, case=case,
               names=names, coef=list(ures.params.values), se=list(ures.bse.values),
               nobs=int(ures.nobs), f=float(bt.stat),
               t_ylevel=float(ures.tvalues[f"{y}.L1"]))
    ci = ures.ci_params
    out["ci_names"] = list(ci.index)
    out["ci_params"] = list(ci.values)
    out["ci_bse"] = list(ures.ci_bse.values)
    return out

fixed = [
    fixed_case("denmark_c", dkv, "LRM", ["LRY", "IBO", "IDE"], 2, [1, 1, 2], 3),
    fixed_case("denmark_n", dkv, "LRM", ["LRY", "IBO", "IDE"], 2, [1, 1, 2], 1),
    fixed_case("denmark_rc", dkv, "LRM", ["LRY", "IBO", "IDE"], 2, [1, 1, 2], 2),
    fixed_case("denmark_rt", dkv, "LRM", ["LRY", "IBO", "IDE"], 2, [1, 1, 2], 4),
    fixed_case("denmark_ct", dkv, "LRM", ["LRY", "IBO", "IDE"], 2, [1, 1, 2], 5),
    fixed_case("macro_c", macv, "lc", ["ly", "r"], 3, [2, 1], 3),
    fixed_case("macro_ct", macv, "lc", ["ly", "r"], 1, [1, 3], 5),
]

def selection(name, data, y, xs, maxlag, maxorder, trend):
    out = dict(name=name, y=y, x=xs, maxlag=maxlag, maxorder=maxorder, trend=trend, models=[])
    for ic in ("aic", "bic"):
        sel = ardl_select_order(data[y], maxlag, data[xs], maxorder, trend=trend, ic=ic)
        tab = sel.aic if ic == "aic" else sel.bic
        for val, key in tab.items():
            p, od = key
            if not p or p < 1 or any(od[x] is None for x in xs):
                continue
            qs = [int(od[x]) for x in xs]
            out.setdefault(ic, {})[f"{p}," + ",".join(map(str, qs))] = float(val)
    # statsmodels' criterion: -2 llf + c (df_model + 1), on the common sample
    out["nobs"] = int(len(data) - max(maxlag, maxorder))
    return out

selections = [
    selection("denmark_sel", dkv, "LRM", ["LRY", "IBO"], 3, 2, "c"),
    selection("macro_sel", macv, "lc", ["ly", "r"], 4, 3, "c"),
]

# ---- NARDL by hand ----
def partial(x, tau=0.0):
    d = np.diff(x, prepend=np.nan)
    d[0] = 0.0
    pos = np.cumsum(np.where(d > tau, d, 0.0))
    neg = np.cumsum(np.where(d <= tau, d, 0.0))
    return pos, neg

def nardl_case(name, data, y, xsym, xasym, tau, p, qsym, qasym, horizon):
    v = pd.DataFrame({y: data[y]})
    xs = []
    for x in xsym:
        v[x] = data[x]; xs.append(x)
    pos, neg = partial(data[xasym].values, tau)
    pn, nn = xasym + "_pos", xasym + "_neg"
    v[pn], v[nn] = pos, neg
    xs += [pn, nn]
    qs = list(qsym) + [qasym, qasym]
    # conditional ECM, case III (unrestricted intercept)
    cols = {"const": 1.0, f"{y}(-1)": v[y].shift(1)}
    for x in xs:
        cols[f"{x}(-1)"] = v[x].shift(1)
    dy = v[y].diff()
    for i in range(1, p):
        cols[f"d.{y}(-{i})"] = dy.shift(i)
    for x, q in zip(xs, qs):
        dx = v[x].diff()
        for l in range(max(q, 1)):
            cols[f"d.{x}" if l == 0 else f"d.{x}(-{l})"] = dx.shift(l)
    X = pd.DataFrame(cols)
    df = pd.concat([dy.rename("dy"), X], axis=1).dropna()
    res = sm.OLS(df.dy, df.drop(columns="dy")).fit()
    names = list(res.params.index)
    R = np.zeros((1, len(names))); R[0, names.index(f"{pn}(-1)")] = 1; R[0, names.index(f"{nn}(-1)")] = -1
    lr = res.wald_test(R, use_f=True)
    R2 = np.zeros((1, len(names)))
    for l in range(max(qasym, 1)):
        R2[0, names.index(f"d.{pn}" if l == 0 else f"d.{pn}(-{l})")] = 1
        R2[0, names.index(f"d.{nn}" if l == 0 else f"d.{nn}(-{l})")] = -1
    sr = res.wald_test(R2, use_f=True)
    piy = res.params[f"{y}(-1)"]
    theta = {x: -res.params[f"{x}(-1)"] / piy for x in xs}
    # levels ARDL with the same lags (q* = max(q,1)) fitted by OLS
    lcols = {"const": 1.0}
    for i in range(1, p + 1):
        lcols[f"{y}(-{i})"] = v[y].shift(i)
    for x, q in zip(xs, qs):
        for l in range(max(q, 1) + 1):
            lcols[f"{x}[{l}]"] = v[x].shift(l)
    L = pd.DataFrame(lcols)
    ldf = pd.concat([v[y].rename("y"), L], axis=1).dropna()
    lres = sm.OLS(ldf.y, ldf.drop(columns="y")).fit()
    phi = np.array([lres.params[f"{y}(-{i})"] for i in range(1, p + 1)])
    def cum(x, q):
        beta = np.array([lres.params[f"{x}[{l}]"] for l in range(max(q, 1) + 1)])
        lam = np.zeros(horizon + 1)
        for j in range(horizon + 1):
            s = beta[j] if j < len(beta) else 0.0
            for i in range(1, p + 1):
                if j - i >= 0:
                    s += phi[i - 1] * lam[j - i]
            lam[j] = s
        return np.cumsum(lam)
    mp, mn = cum(pn, qasym), -cum(nn, qasym)
    return dict(name=name, y=y, xsym=xsym, xasym=xasym, tau=tau, p=p, qsym=qsym, qasym=qasym,
                horizon=horizon, pos=list(pos), neg=list(neg), names=names,
                coef=list(res.params.values), se=list(res.bse.values), nobs=int(res.nobs),
                lr_f=float(lr.fvalue), lr_p=float(lr.pvalue), sr_f=float(sr.fvalue), sr_p=float(sr.pvalue),
                theta_pos=float(theta[pn]), theta_neg=float(theta[nn]),
                mult_pos=list(mp), mult_neg=list(mn), mult_asym=list(mp + mn))

nardl = [
    nardl_case("macro_rate", macv, "lc", ["ly"], "r", 0.0, 2, [1], 2, 12),
    nardl_case("macro_rate_tau", macv, "lc", ["ly"], "r", 0.25, 3, [2], 1, 8),
]

# statsmodels' own simulated asymptotic critical values (pss_critical_values,
# keyed (k, case, I1) with k the number of x variables), at 90, 95, 99,
# 99.9 percentiles, for k = 1..6: for comparing the key bounds_test uses
# (the number of ARDL order entries, k + 1) with PSS (2001) at k.
from statsmodels.tsa.ardl import pss_critical_values as pcv
smcrit = []
for k in range(1, 7):
    for case in range(1, 6):
        smcrit.append(dict(k=k, case=case, i0=list(pcv.crit_vals[(k, case, False)]),
                           i1=list(pcv.crit_vals[(k, case, True)])))

out = dict(library="statsmodels", version=statsmodels.__version__, numpy=np.__version__,
           fixed=fixed, selections=selections, nardl=nardl,
           sm_crit_percentiles=list(pcv.crit_percentiles), sm_crit=smcrit)
path = os.path.join(here, "..", "fixtures", "ardl_statsmodels.json")
with open(path, "w") as f:
    json.dump(out, f, indent=1)
print("wrote", path, "statsmodels", statsmodels.__version__)
