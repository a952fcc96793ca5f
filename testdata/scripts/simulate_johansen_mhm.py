#!/usr/bin/python3
"""Published asymptotic critical values of Johansen's trace and
maximum-eigenvalue statistics, MacKinnon, Haug and Michelis (1999), as
statsmodels (Debian python3-statsmodels 0.13.5) ships them in
statsmodels.tsa.coint_tables (functions c_sjt and c_sja; 90 %, 95 %, 99 %
quantiles, K - r = 1..12). Run from the repository root:

    /usr/bin/python3 testdata/scripts/simulate_johansen_mhm.py

Writes testdata/fixtures/simulate_johansen_mhm.json.

statsmodels' det_order (the "order of time polynomial in the null") maps
to galley's johansen.Case as
    -1 -> n   (no deterministic terms),
     0 -> c   (unrestricted constant; K - r = 1 is chi-square(1)),
     1 -> ct  (unrestricted constant and trend; K - r = 1 is chi-square(1)).
The mapping follows from statsmodels' coint_johansen, which detrends the
data by a polynomial of order det_order before the reduced-rank
regression, and from the first rows of the tables. The restricted cases rc
and rt have no table in statsmodels.
"""
import json
import statsmodels
from statsmodels.tsa.coint_tables import c_sjt, c_sja

CASE = {-1: "n", 0: "c", 1: "ct"}

out = {"library": "statsmodels", "version": statsmodels.__version__,
       "source": "statsmodels.tsa.coint_tables c_sjt, c_sja "
                 "(MacKinnon, Haug and Michelis 1999)",
       "levels": [0.10, 0.05, 0.01],
       "tables": []}
for det in (-1, 0, 1):
    for n in range(1, 13):
        out["tables"].append({"det_order": det, "case": CASE[det], "dim": n,
                              "trace": [float(x) for x in c_sjt(n, det)],
                              "maxeig": [float(x) for x in c_sja(n, det)]})

with open("testdata/fixtures/simulate_johansen_mhm.json", "w") as fh:
    json.dump(out, fh, indent=1)
print("statsmodels", statsmodels.__version__)
