#!/bin/sh
# Exports the open datasets that the reference checks use, from the
# packages that ship them (run once; the CSVs are committed):
#   macrodata.csv  US quarterly macro data 1959Q1–2009Q3, public domain,
#                  shipped by statsmodels (Debian python3-statsmodels).
#   denmark.csv    Danish money-demand data 1974Q1–1987Q3 (Johansen and
#                  Juselius 1990), shipped by R's urca (Debian r-cran-urca).
set -e
cd "$(dirname "$0")/../data"
/usr/bin/python3 - <<'PY'
import statsmodels, statsmodels.api as sm
d = sm.datasets.macrodata.load_pandas().data
d.insert(0, "date", [f"{int(y)}Q{int(q)}" for y, q in zip(d.year, d.quarter)])
d = d.drop(columns=["year", "quarter"])
d.to_csv("macrodata.csv", index=False)
print("macrodata from statsmodels", statsmodels.__version__)
PY
Rscript -e 'suppressMessages(library(urca)); data(denmark); d <- denmark; d$ENTRY <- NULL;
 dates <- paste0(rep(1974:1987, each=4), "Q", 1:4)[1:nrow(d)];
 d <- cbind(date=dates, d); write.csv(d, "denmark.csv", row.names=FALSE, quote=FALSE);
 cat("denmark from urca", as.character(packageVersion("urca")), "\n")'
