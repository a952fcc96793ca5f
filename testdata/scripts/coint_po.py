#!/usr/bin/python3
"""Reference values for analysis/coint PhillipsOuliaris.

1. r-cran-urca (Rscript, ca.po) on testdata/data/denmark.csv and on logs of
   testdata/data/macrodata.csv: P-u for demean none/constant/trend, P-z for
   demean none, and the critical-value tables it carries (Phillips and
   Ouliaris 1990, Tables I and II) for 2..6 variables. urca's P-u and its
   none-case P-z follow the same sample conventions as galley (N = T-1).
   urca's P-z with constant/trend uses the raw, not the demeaned/detrended,
   levels in M_zz, so those two are not compared with urca.
2. An independent numpy implementation of galley's stated formulas (doc
   comment of coint.PhillipsOuliaris) for every case, P-u and P-z.
Writes testdata/fixtures/coint_po.json. Run: /usr/bin/python3 coint_po.py
"""
import json, os, subprocess
import numpy as np, pandas as pd

here = os.path.dirname(os.path.abspath(__file__))
data = os.path.join(here, "..", "data")
den = pd.read_csv(os.path.join(data, "denmark.csv"))
mac = pd.read_csv(os.path.join(data, "macrodata.csv"))
macl = np.log(mac[["realcons", "realdpi", "realgdp", "realinv", "realgovt", "m1"]])

sets = [
    ("denmark", "LRM,LRY,IBO", den[["LRM", "LRY", "IBO"]].values),
    ("denmark", "LRM,LRY,LPY,IBO,IDE", den[["LRM", "LRY", "LPY", "IBO", "IDE"]].values),
    ("macro", "realcons,realdpi", macl.values[:, :2]),
    ("macro", "realcons,realdpi,realgdp,realinv", macl.values[:, :4]),
    ("macro", "realcons,realdpi,realgdp,realinv,realgovt,m1", macl.values),
]

R = r'''
suppressMessages(library(urca))
args <- commandArgs(TRUE)
z <- as.matrix(read.csv(args[1], header=FALSE))
for (dm in c("none","constant","trend")) for (ty in c("Pu","Pz")) for (lg in c("short","long")) {
  r <- ca.po(z, demean=dm, lag=lg, type=ty)
  cat(dm, ty, lg, r@lag, format(r@teststat, digits=17), format(r@cval[1,], digits=17), "\n")
}
cat("urca", as.character(packageVersion("urca")), "\n")
'''

def urca(z):
    tmp = "/tmp/coint_po_input.csv"
    np.savetxt(tmp, z, delimiter=",", fmt="%.17g")
    with open("/tmp/coint_po.R", "w") as fh:
        fh.write(R)
    out = subprocess.run(["Rscript", "/tmp/coint_po.R", tmp], check=True,
                         capture_output=True, text=True).stdout.split("\n")
    rows, version = [], None
    for line in out:
        f = line.split()
        if not f:
            continue
        if f[0] == "urca":
            version = f[1]
            continue
        rows.append(dict(demean=f[0], type=f[1], lagrule=f[2], lag=int(f[3]),
                         stat=float(f[4]), cval=[float(v) for v in f[5:8]]))
    return rows, version

def det(case, n):
    s = np.arange(1, n + 1.0)
    return np.column_stack([s ** j for j in range({"none": 0, "constant": 1, "trend": 2}[case])]) \
        if case != "none" else np.zeros((n, 0))

def resid(y, X):
    if X.shape[1] == 0:
        return y
    b, *_ = np.linalg.lstsq(X, y, rcond=None)
    return y - X @ b

def po(z, case, l):
    T, m = z.shape
    n = T - 1
    u = resid(z[:, 0], np.column_stack([det(case, T), z[:, 1:]]))
    D = det(case, n)
    xi = resid(z[1:], np.column_stack([D, z[:-1]]))
    om = xi.T @ xi
    for s in range(1, l + 1):
        w = 1 - s / (l + 1)
        g = np.zeros((m, m))
        for t in range(s, n):
            g += np.outer(xi[t], xi[t - s])
        om += w * (g + g.T)
    om /= n
    o112 = om[0, 0] - om[0, 1:] @ np.linalg.solve(om[1:, 1:], om[1:, 0])
    pu = n * o112 / (u @ u / n)
    zt = resid(z[1:], D)
    M = zt.T @ zt / n
    pz = n * np.trace(om @ np.linalg.inv(M))
    return float(pu), float(pz), float(o112)

cases, version = [], None
for src, cols, z in sets:
    rows, version = urca(z)
    for r in rows:
        pu, pz, o112 = po(z, r["demean"], r["lag"])
        r.update(data=src, columns=cols.split(","), numpy_pu=pu, numpy_pz=pz, numpy_omega11_2=o112)
        cases.append(r)
out = {"library": "r-cran-urca", "version": version, "numpy": np.__version__, "cases": cases}
with open(os.path.join(here, "..", "fixtures", "coint_po.json"), "w") as fh:
    json.dump(out, fh, indent=1)
    fh.write("\n")
for r in cases:
    own = r["numpy_pu"] if r["type"] == "Pu" else r["numpy_pz"]
    print(r["data"], len(r["columns"]), r["demean"], r["type"], r["lag"], r["stat"], own, own / r["stat"] - 1)
