#!/usr/bin/env Rscript
# Reference values for analysis/johansen from R's urca (Debian r-cran-urca).
# Run from the repository root:
#
#   Rscript testdata/scripts/johansen_urca.R
#
# Writes testdata/fixtures/johansen_urca.json with, on denmark.csv (LRM, LRY,
# IBO, IDE; no seasonal dummies), spec = "transitory":
#   * ca.jo eigenvalues, trace and max-eigenvalue statistics for ecdet none,
#     const, trend and K = 2, 3 lags in levels (1, 2 lagged differences);
#     ecdet none with dumvar = a linear trend gives the unrestricted-trend
#     case ("none+trend");
#   * cajorls rank-1 beta (normalised on LRM) and the OLS coefficient table
#     of the short-run equations (estimates and standard errors);
#   * blrtest and alrtest likelihood-ratio tests for rank 1;
#   * the critical-value arrays that ca.jo carries (cv.none, cv.const,
#     cv.trend; dims 11 x 3 x 2: rows K-r = 1..11, columns 10/5/1 pct,
#     slices max-eigenvalue, trace).
suppressMessages(library(urca))
ver <- as.character(packageVersion("urca"))
d <- read.csv("testdata/data/denmark.csv")[, c("LRM", "LRY", "IBO", "IDE")]

num <- function(x) paste0("[", paste(sprintf("%.17g", as.vector(x)), collapse = ","), "]")
mat <- function(x) { x <- as.matrix(x); paste0("[", paste(apply(x, 1, num), collapse = ","), "]") }
str <- function(x) paste0("\"", x, "\"")
obj <- function(...) { a <- list(...); paste0("{", paste(paste0(str(names(a)), ":", unlist(a)), collapse = ","), "}") }

runs <- c()
fits <- c()
tests <- c()
for (K in c(2, 3)) {
  for (ec in c("none", "const", "trend", "none+trend")) {
    dv <- NULL
    e <- ec
    if (ec == "none+trend") { e <- "none"; dv <- matrix(seq_len(nrow(d)), ncol = 1, dimnames = list(NULL, "trend")) }
    tr <- ca.jo(d, type = "trace", ecdet = e, K = K, spec = "transitory", dumvar = dv)
    mx <- ca.jo(d, type = "eigen", ecdet = e, K = K, spec = "transitory", dumvar = dv)
    # teststat is ordered r <= K-1 ... r = 0; reverse to r = 0 first.
    runs <- c(runs, obj(ecdet = str(ec), K = K, lambda = num(tr@lambda),
      trace = num(rev(tr@teststat)), maxeig = num(rev(mx@teststat)),
      cval_trace = mat(tr@cval[nrow(tr@cval):1, ]), cval_maxeig = mat(mx@cval[nrow(mx@cval):1, ])))
    if (ec != "none+trend") {
      f <- cajorls(tr, r = 1)
      s <- summary(f$rlm)
      est <- sapply(s, function(q) q$coefficients[, 1])
      se <- sapply(s, function(q) q$coefficients[, 2])
      fits <- c(fits, obj(ecdet = str(ec), K = K, r = 1, beta = num(f$beta),
        regressors = paste0("[", paste(str(rownames(est)), collapse = ","), "]"),
        coef = mat(t(est)), se = mat(t(se))))
    }
  }
}

# Restriction tests, rank 1, K = 2, ecdet = "const" (beta has 5 rows).
z <- ca.jo(d, type = "trace", ecdet = "const", K = 2, spec = "transitory")
H1 <- matrix(c(1, -1, 0, 0, 0,  0, 0, 1, 0, 0,  0, 0, 0, 1, 0,  0, 0, 0, 0, 1), nrow = 5)
H2 <- matrix(c(1, -1, 0, 0, 0,  0, 0, 1, -1, 0,  0, 0, 0, 0, 1), nrow = 5)
A1 <- matrix(c(1, 0, 0, 0,  0, 0, 1, 0,  0, 0, 0, 1), nrow = 4)
A2 <- matrix(c(1, 0, 0, 0,  0, 0, 0, 1), nrow = 4)
add <- function(kind, name, M, t) obj(kind = str(kind), name = str(name), ecdet = str("const"), K = 2, r = 1,
  matrix = mat(M), stat = sprintf("%.17g", t@teststat), df = t@pval[2], p = sprintf("%.17g", t@pval[1]),
  lambda = num(t@lambda))
tests <- c(tests, add("beta", "LRM = -LRY", H1, blrtest(z, H1, 1)))
tests <- c(tests, add("beta", "LRM = -LRY, IBO = -IDE", H2, blrtest(z, H2, 1)))
tests <- c(tests, add("alpha", "LRY weakly exogenous", A1, alrtest(z, A1, 1)))
tests <- c(tests, add("alpha", "LRY and IBO weakly exogenous", A2, alrtest(z, A2, 1)))
zn <- ca.jo(d, type = "trace", ecdet = "none", K = 3, spec = "transitory")
Hn <- matrix(c(1, -1, 0, 0,  0, 0, 1, 0,  0, 0, 0, 1), nrow = 4)
t3 <- blrtest(zn, Hn, 1)
tests <- c(tests, obj(kind = str("beta"), name = str("LRM = -LRY"), ecdet = str("none"), K = 3, r = 1,
  matrix = mat(Hn), stat = sprintf("%.17g", t3@teststat), df = t3@pval[2], p = sprintf("%.17g", t3@pval[1]),
  lambda = num(t3@lambda)))

b <- as.list(body(ca.jo))
cv <- list()
for (x in b) {
  s <- paste(deparse(x), collapse = "")
  if (grepl("^cv\\.(none|const|trend) <-", s)) eval(x)
}
cvs <- sapply(c("none", "const", "trend"), function(n) {
  a <- get(paste0("cv.", n))
  obj(ecdet = str(n), maxeig = mat(a[, , 1]), trace = mat(a[, , 2]))
})

json <- paste0("{", str("library"), ":", str("urca"), ",", str("version"), ":", str(ver), ",",
  str("cajo"), ":[", paste(runs, collapse = ","), "],",
  str("cajorls"), ":[", paste(fits, collapse = ","), "],",
  str("tests"), ":[", paste(tests, collapse = ","), "],",
  str("cvals"), ":[", paste(cvs, collapse = ","), "]}")
writeLines(json, "testdata/fixtures/johansen_urca.json")
cat("urca", ver, "\n")
