#!/usr/bin/python3
"""Reference values for the asymptotic (delta-method) standard errors of
impulse responses in analysis/vardyn (asymptotic.go) and for the
responses directive's `bands: asymptotic`.

Run from the repository root with Debian's python3-statsmodels 0.13.5 and
python3-numpy:

    /usr/bin/python3 testdata/scripts/vardyn_irf_stderr.py

Writes testdata/fixtures/vardyn_irf_stderr.json, one entry per VAR in
"cases":

* name, data, series, transform ("100*dlog" or "log" or "none"), lags,
  trend (statsmodels' "n", "c", "ct"), nobs (T, the observations used),
  horizon H = 10;
* stderr, orth_stderr: statsmodels VARResults.irf(H).stderr(orth=False)
  and .stderr(orth=True), indexed [h][response][shock], h = 0..H. These are
  Lütkepohl (2005), Proposition 3.6: for Phi_h, G_h Sigma_a G_h' with
  Sigma_a = (Z Z')^{-1} (x) Sigma_u (the lag block; Sigma_u with T - Kp - d
  degrees of freedom, statsmodels' sigma_u); for Theta_h = Phi_h P, in
  addition Cbar_h Sigma_s Cbar_h' / T with Sigma_s = 2 D+ (Sigma_u (x)
  Sigma_u) D+'.
* cov, orth_cov (first case only): the full covariance matrices of
  vec(Phi_h) and vec(Theta_h) (K^2 x K^2, vec stacking columns) from
  irf.cov(orth=False) and irf.cov(orth=True), for h = 0..H; girf_cov the
  same for the generalised responses (complex-step, below).
* girf, girf_stderr: the generalised responses of Pesaran and Shin (1998),
  Psi_h = Phi_h Sigma_u D^{-1/2} (D = diag Sigma_u), and the delta-method
  standard errors J_a Sigma_a J_a' + J_s Sigma_s J_s' / T, the Jacobians J
  of vec(Psi_h) with respect to a = vec(A_1..A_p) and vech(Sigma_u) taken
  here by complex-step differentiation (an independent check of the
  analytic derivative in asymptotic.go); Sigma_a and Sigma_s are
  statsmodels' _cov_alpha and _cov_sigma. The same complex-step Jacobian
  applied to Phi_h must reproduce statsmodels' irf.cov() (asserted below),
  which checks the numerical route against the library.
* vecm: statsmodels VECM on the Danish data (LRM, LRY, IBO, IDE), rank 1,
  deterministic "ci" (restricted constant) and "co" (unrestricted), 1 and
  2 lagged differences: irf(H).stderr(orth=False/True), nobs; for these
  statsmodels uses its cov_var_repr (the covariance of the VAR-form
  coefficients with beta fixed, Luetkepohl 2005 ch. 7 and 9) and
  _cov_sigma with the ML sigma_u. girf_stderr as above from the same
  covariances (complex step on the VAR form).
* z: scipy.stats.norm.ppf((1 + c)/2) for coverages c = 0.68, 0.9, 0.95.
* ordered: for the first case, the VAR fitted with its columns reordered
  (order [2, 0, 1]): orth_stderr of that fit, [h][a][b] for response
  order[a] and shock order[b] of the original columns.
"""
import json

import numpy as np
import pandas as pd
import scipy
import statsmodels
from scipy import stats
from statsmodels.tsa.api import VAR
from statsmodels.tsa.vector_ar.vecm import VECM

H = 10


def ma(coefs, h):
    """Phi_0..Phi_h of a VAR with coefficient matrices coefs (p, K, K);
    works for complex arrays."""
    p, k, _ = coefs.shape
    out = [np.eye(k, dtype=coefs.dtype)]
    for s in range(1, h + 1):
        acc = np.zeros((k, k), dtype=coefs.dtype)
        for j in range(1, min(s, p) + 1):
            acc = acc + out[s - j] @ coefs[j - 1]
        out.append(acc)
    return out


def unvech(v, k):
    m = np.zeros((k, k), dtype=v.dtype)
    idx = 0
    for j in range(k):
        for i in range(j, k):
            m[i, j] = v[idx]
            m[j, i] = v[idx]
            idx += 1
    return m


def vech(m):
    k = m.shape[0]
    return np.array([m[i, j] for j in range(k) for i in range(j, k)])


def unpack_alpha(alpha, k, p):
    """alpha = vec([A_1 ... A_p]) (columns stacked) -> (p, K, K)."""
    big = alpha.reshape(k * p, k).T  # K x Kp, column-major unvec
    return np.stack([big[:, l * k:(l + 1) * k] for l in range(p)])


def responses_vec(alpha, vs, k, p, kind):
    """vec of each h's responses (columns stacked), h = 0..H."""
    phi = ma(unpack_alpha(alpha, k, p), H)
    if kind == "ma":
        return [f.T.reshape(-1) for f in phi]
    sig = unvech(vs, k)
    s = sig / np.sqrt(np.diag(sig))[None, :]
    return [(f @ s).T.reshape(-1) for f in phi]


def jacobians(alpha, vs, k, p, kind):
    step = 1e-30
    na, ns = alpha.size, vs.size
    ja = [np.zeros((k * k, na)) for _ in range(H + 1)]
    js = [np.zeros((k * k, ns)) for _ in range(H + 1)]
    for c in range(na):
        a = alpha.astype(complex)
        a[c] += 1j * step
        for h, v in enumerate(responses_vec(a, vs.astype(complex), k, p, kind)):
            ja[h][:, c] = v.imag / step
    for c in range(ns):
        s = vs.astype(complex)
        s[c] += 1j * step
        for h, v in enumerate(responses_vec(alpha.astype(complex), s, k, p, kind)):
            js[h][:, c] = v.imag / step
    return ja, js


def unvec_diag(c, k):
    return np.sqrt(np.diag(c)).reshape(k, k).T


def case(name, data, series, transform, y, lags, trend, full=False, vecm=None):
    if vecm is None:
        res = VAR(y).fit(lags, trend=trend)
        coefs = res.coefs
        cov_a = np.asarray(res._cov_alpha)
    else:
        res = VECM(y, k_ar_diff=lags, coint_rank=1, deterministic=trend).fit()
        coefs = res.var_rep
        lags = lags + 1  # the order of the VAR form
        cov_a = np.asarray(res.cov_var_repr)
    irf = res.irf(H)
    k = y.shape[1]
    sig = np.asarray(res.sigma_u)
    cov_s = np.asarray(res._cov_sigma)
    T = res.nobs
    alpha = np.hstack([c.T.reshape(-1) for c in coefs])  # vec(A_1), vec(A_2), ... = vec([A_1 ... A_p])
    assert np.allclose(unpack_alpha(alpha, k, lags), coefs, rtol=0, atol=0)
    vs = vech(sig)
    # The complex-step route reproduces statsmodels for Phi_h.
    ja, _ = jacobians(alpha, vs, k, lags, "ma")
    for h in range(H + 1):
        c = ja[h] @ cov_a @ ja[h].T
        assert np.allclose(c, irf.cov()[h], rtol=1e-10, atol=1e-14), (name, h)
    ja, js = jacobians(alpha, vs, k, lags, "g")
    gcov = [ja[h] @ cov_a @ ja[h].T + js[h] @ cov_s @ js[h].T / T for h in range(H + 1)]
    phi = ma(np.asarray(coefs), H)
    girf = np.array([phi[h] @ sig / np.sqrt(np.diag(sig))[None, :] for h in range(H + 1)])
    out = {"name": name, "data": data, "series": series, "transform": transform, "lags": lags, "trend": trend,
           "nobs": int(T), "horizon": H,
           "stderr": irf.stderr(orth=False).tolist(), "orth_stderr": irf.stderr(orth=True).tolist(),
           "girf": girf.tolist(), "girf_stderr": [unvec_diag(c, k).tolist() for c in gcov]}
    if vecm is not None:
        out["k_ar_diff"] = lags - 1
    if full:
        out["cov"] = np.asarray(irf.cov(orth=False)).tolist()
        out["orth_cov"] = np.asarray(irf.cov(orth=True)).tolist()
        out["girf_cov"] = [c.tolist() for c in gcov]
    return out


m = pd.read_csv("testdata/data/macrodata.csv")
mac = ["realgdp", "realcons", "realinv"]
lv = np.log(m[mac].values)
dl = 100 * np.diff(lv, axis=0)
d = pd.read_csv("testdata/data/denmark.csv")
dk = ["LRM", "LRY", "IBO", "IDE"]

out = {"library": "statsmodels", "version": statsmodels.__version__, "numpy": np.__version__, "scipy": scipy.__version__, "cases": []}
# Normal quantiles z_{(1+c)/2} for the band half-widths (scipy.stats.norm.ppf).
out["z"] = {str(c): float(stats.norm.ppf((1 + c) / 2)) for c in [0.68, 0.9, 0.95]}
out["cases"].append(case("growth", "macrodata.csv", mac, "100*dlog", dl, 2, "c", full=True))
out["cases"].append(case("levels", "macrodata.csv", mac, "log", lv, 3, "ct"))
out["cases"].append(case("denmark", "denmark.csv", dk, "none", d[dk].values, 2, "n"))

out["vecm"] = [case("vecm-%s-%d" % (det, kd), "denmark.csv", dk, "none", d[dk].values, kd, det, vecm=True)
               for det in ["ci", "co"] for kd in [1, 2]]

order = [2, 0, 1]
r2 = VAR(dl[:, order]).fit(2, trend="c")
out["ordered"] = {"case": "growth", "order": order, "orth_stderr": r2.irf(H).stderr(orth=True).tolist()}

with open("testdata/fixtures/vardyn_irf_stderr.json", "w") as f:
    json.dump(out, f)
print("statsmodels", statsmodels.__version__, "numpy", np.__version__)
