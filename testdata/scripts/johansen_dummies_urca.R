#!/usr/bin/env Rscript
# Reference values for the Johansen analysis with dummies and extra
# regressors (analysis/johansen TestExtra), from R's urca (Debian
# r-cran-urca) and, for step dummies restricted to the cointegrating
# relations (which ca.jo cannot place there), from a direct reduced-rank
# regression in base R that is first checked against ca.jo.
# Run from the repository root:
#
#   Rscript testdata/scripts/johansen_dummies_urca.R
#
# Writes testdata/fixtures/johansen_dummies_urca.json. Data: denmark.csv
# (LRM, LRY, IBO, IDE; 1974Q1-1987Q3), K = 2 lags in levels (one lagged
# difference), spec = "transitory". Runs:
#   season4_const:   season = 4, ecdet = "const"  (the Johansen-Juselius
#                    setting: centred seasonals, constant in the relations)
#   season4_none:    season = 4, ecdet = "none"   (unrestricted constant)
#   dummies_none:    season = 4, ecdet = "none", dumvar = an impulse at
#                    1983Q1, a step from 1983Q1 and the differenced log
#                    price level (an I(0) regressor), on 1974Q2-1987Q3 (the
#                    difference has no 1974Q1 value)
#   restricted_step: seasonals, restricted constant and a step from 1983Q1
#                    inside the relations (lagged once), with impulses at
#                    1983Q1 and 1983Q2 unrestricted (direct RRR in base R)
# For each: eigenvalues, trace and max-eigenvalue statistics (r = 0 first),
# and the rank-1 beta normalised on LRM (cajorls, or the direct RRR).
suppressMessages(library(urca))
ver <- as.character(packageVersion("urca"))
raw <- read.csv("testdata/data/denmark.csv")
d <- raw[, c("LRM", "LRY", "IBO", "IDE")]
N <- nrow(d)
brk <- which(raw$date == "1983Q1")
impulse <- as.numeric(seq_len(N) == brk)
step <- as.numeric(seq_len(N) >= brk)
dlpy <- c(NA, diff(raw$LPY))

num <- function(x) paste0("[", paste(sprintf("%.17g", as.vector(x)), collapse = ","), "]")
str <- function(x) paste0("\"", x, "\"")
obj <- function(...) { a <- list(...); paste0("{", paste(paste0(str(names(a)), ":", unlist(a)), collapse = ","), "}") }

# Direct reduced-rank regression (Johansen 1995, ch. 6): Z0 = dy_t,
# Z1 = (y_{t-1}, restricted), Z2 = unrestricted short-run regressors.
rrr <- function(y, K, restricted, unrestricted) {
  y <- as.matrix(y)
  n <- nrow(y)
  dy <- diff(y)
  idx <- (K + 1):n                       # rows of y for dy_t
  Z0 <- dy[idx - 1, , drop = FALSE]
  Z1 <- cbind(y[idx - 1, , drop = FALSE], restricted[idx - 1, , drop = FALSE])
  Z2 <- unrestricted[idx, , drop = FALSE]
  for (l in seq_len(K - 1)) Z2 <- cbind(Z2, dy[idx - 1 - l, , drop = FALSE])
  R0 <- resid(lm(Z0 ~ Z2 - 1)); R1 <- resid(lm(Z1 ~ Z2 - 1))
  T <- nrow(R0)
  S00 <- crossprod(R0) / T; S11 <- crossprod(R1) / T; S01 <- crossprod(R0, R1) / T
  C <- chol(S11)
  M <- solve(t(C)) %*% t(S01) %*% solve(S00) %*% S01 %*% solve(C)
  e <- eigen(M, symmetric = TRUE)
  lam <- e$values[1:ncol(y)]
  V <- solve(C) %*% e$vectors
  b <- V[, 1] / V[1, 1]
  tr <- rev(cumsum(rev(-T * log(1 - lam))))
  list(lambda = lam, trace = tr, maxeig = -T * log(1 - lam), beta = b)
}

season <- function(n) { dum <- (diag(4) - 1 / 4)[, -4]; dum[rep(1:4, length.out = n), ] }
runs <- c()
add_cajo <- function(name, ecdet, dv, rows = seq_len(N)) {
  if (!is.null(dv)) dv <- dv[rows, , drop = FALSE]
  tr <- ca.jo(d[rows, ], type = "trace", ecdet = ecdet, K = 2, spec = "transitory", season = 4, dumvar = dv)
  mx <- ca.jo(d[rows, ], type = "eigen", ecdet = ecdet, K = 2, spec = "transitory", season = 4, dumvar = dv)
  f <- cajorls(tr, r = 1)
  runs <<- c(runs, obj(name = str(name), source = str(paste("urca", ver, "ca.jo/cajorls")), lambda = num(tr@lambda[1:4]),
    trace = num(rev(tr@teststat)), maxeig = num(rev(mx@teststat)), beta = num(f$beta[, 1])))
  tr
}
z <- add_cajo("season4_const", "const", NULL)
invisible(add_cajo("season4_none", "none", NULL))
dv <- cbind(impulse = impulse, step = step, dlpy = dlpy)
invisible(add_cajo("dummies_none", "none", dv, rows = 2:N))

# The direct RRR reproduces ca.jo in the Johansen-Juselius setting ...
chk <- rrr(d, 2, matrix(1, N, 1), season(N))
stopifnot(max(abs(chk$lambda - z@lambda[1:4])) < 1e-10)
# ... and gives the restricted step: beta'(y_{t-1}, 1, step_{t-1}), with
# impulses at the break and one period after it (d step_t, d step_{t-1}).
imp2 <- as.numeric(seq_len(N) == brk + 1)
rs <- rrr(d, 2, cbind(1, step), cbind(season(N), impulse, imp2))
runs <- c(runs, obj(name = str("restricted_step"), source = str(paste("direct reduced-rank regression in base R", R.version.string, "(checked against urca", ver, "ca.jo)")),
  lambda = num(rs$lambda), trace = num(rs$trace), maxeig = num(rs$maxeig), beta = num(rs$beta)))

json <- paste0("{", str("library"), ":", str("urca"), ",", str("version"), ":", str(ver), ",",
  str("break"), ":", str("1983Q1"), ",", str("runs"), ":[", paste(runs, collapse = ","), "]}")
writeLines(json, "testdata/fixtures/johansen_dummies_urca.json")
cat("urca", ver, "\n")
