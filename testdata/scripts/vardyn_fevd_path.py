#!/usr/bin/python3
"""Reference values for the variance-shares figure (figure plot:
variance-shares): forecast-error variance decompositions at every horizon
h = 1..24.

Run from the repository root with Debian's python3-statsmodels 0.13.5 and
python3-numpy:

    /usr/bin/python3 testdata/scripts/vardyn_fevd_path.py

Writes testdata/fixtures/vardyn_fevd_path.json:

* var: statsmodels VAR on 100*dlog(realgdp, realcons, realinv) of
  macrodata.csv (1959Q2-2009Q3), 2 lags, constant; VARResults.fevd(24).decomp,
  indexed [series][h-1][shock] in the order of "series".
* var_order: the same VAR with the Cholesky ordering realinv, realgdp,
  realcons: statsmodels fits the VAR to the columns in that order (its
  Cholesky factor follows the column order), fevd(24).decomp is taken there
  and its rows and columns are put back in the order of "series".
* vecm: statsmodels VECM on the Danish data (LRM, LRY, IBO, IDE), one lagged
  difference, rank 1, deterministic "ci" (a restricted constant). VECMResults
  has no fevd(), so statsmodels' own FEVD class (the one VARResults.fevd
  returns) is applied to the VECM: it reads the VECM's irf() (orth_irfs from
  its var_rep and sigma_u) and mse() of VARProcess(var_rep, None, sigma_u).
  The decomposition does not depend on the scale of sigma_u, so its degrees
  of freedom do not matter.
"""
import json

import numpy as np
import pandas as pd
import statsmodels
from statsmodels.tsa.api import VAR
from statsmodels.tsa.vector_ar.var_model import FEVD, VARProcess
from statsmodels.tsa.vector_ar.vecm import VECM

H = 24
out = {"library": "statsmodels", "version": statsmodels.__version__, "numpy": np.__version__, "horizon": H}

m = pd.read_csv("testdata/data/macrodata.csv")
names = ["realgdp", "realcons", "realinv"]
dl = 100 * np.diff(np.log(m[names].values), axis=0)

res = VAR(dl).fit(2, trend="c")
out["var"] = {"series": names, "scale": "100*dlog", "lags": 2, "trend": "c", "fevd": res.fevd(H).decomp.tolist()}

order = [2, 0, 1]
r2 = VAR(dl[:, order]).fit(2, trend="c")
d2 = r2.fevd(H).decomp  # [series in order][h][shock in order]
back = np.empty_like(d2)
for a, i in enumerate(order):
    for b, j in enumerate(order):
        back[i, :, j] = d2[a, :, b]
out["var_order"] = {"order": [names[i] for i in order], "fevd": back.tolist()}


class VECMAsVAR:
    """What statsmodels' FEVD class reads from a VAR result, for a VECM."""

    def __init__(self, v, endog_names):
        self.v = v
        self.neqs = v.neqs
        self.model = type("M", (), {"endog_names": endog_names})()
        self.proc = VARProcess(v.var_rep, None, np.asarray(v.sigma_u))

    def irf(self, var_decomp=None, periods=10):
        assert var_decomp is None
        return self.v.irf(periods)

    def mse(self, steps):
        return self.proc.mse(steps)


dk = ["LRM", "LRY", "IBO", "IDE"]
d = pd.read_csv("testdata/data/denmark.csv")[dk].values
v = VECM(d, k_ar_diff=1, coint_rank=1, deterministic="ci").fit()
fe = FEVD(VECMAsVAR(v, dk), periods=H).decomp
out["vecm"] = {"series": dk, "deterministic": "ci", "k_ar_diff": 1, "rank": 1, "fevd": fe.tolist()}

for k in ["var", "var_order", "vecm"]:
    s = np.asarray(out[k]["fevd"]).sum(axis=2)
    assert np.allclose(s, 1), k

with open("testdata/fixtures/vardyn_fevd_path.json", "w") as f:
    json.dump(out, f)
print("statsmodels", statsmodels.__version__)
