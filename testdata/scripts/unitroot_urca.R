#!/usr/bin/env Rscript
# Fixtures for analysis/unitroot and analysis/critical from R's urca
# (Debian r-cran-urca), used only as a reference library:
#   ../fixtures/unitroot_urca.json   ur.pp, ur.kpss, ur.ers (DF-GLS), ur.za
#       on log realgdp, log realcons, tbilrate, infl (macrodata.csv) and
#       LRM (denmark.csv);
#   ../fixtures/critical_urca.json   qunitroot / punitroot (MacKinnon 1996
#       numerical distribution functions), asymptotic and finite T.
# Run from any directory: Rscript testdata/scripts/unitroot_urca.R
suppressMessages(library(urca))
args <- commandArgs(trailingOnly = FALSE)
here <- dirname(normalizePath(sub("^--file=", "", args[grep("^--file=", args)])))
data <- file.path(here, "..", "data")
fix <- file.path(here, "..", "fixtures")
macro <- read.csv(file.path(data, "macrodata.csv"))
den <- read.csv(file.path(data, "denmark.csv"))
series <- list(log_realgdp = log(macro$realgdp), log_realcons = log(macro$realcons),
               tbilrate = macro$tbilrate, infl = macro$infl, denmark_LRM = den$LRM)
ver <- paste("urca", as.character(packageVersion("urca")), "on R", getRversion())

num <- function(x) {
  x <- as.numeric(x)
  s <- ifelse(is.na(x), "null", sprintf("%.17g", x))
  paste0("[", paste(s, collapse = ","), "]")
}
str <- function(x) paste0("\"", x, "\"")
obj <- function(...) {
  kv <- list(...)
  paste0("{", paste(paste0(str(names(kv)), ":", unlist(kv)), collapse = ","), "}")
}

pp <- c(); kp <- c(); ers <- c(); za <- c()
for (nm in names(series)) {
  y <- series[[nm]]
  for (model in c("constant", "trend")) {
    for (type in c("Z-tau", "Z-alpha")) {
      for (lg in list("short", "long", 2L)) {
        r <- if (is.character(lg)) ur.pp(y, type = type, model = model, lags = lg)
             else ur.pp(y, type = type, model = model, use.lag = lg)
        co <- coef(r@testreg)
        pp <- c(pp, obj(series = str(nm), model = str(model), type = str(type),
                        lags = str(as.character(lg)), stat = num(r@teststat), lag = num(r@lag),
                        rho = num(co[2, 1]), se = num(co[2, 2]), cval = num(r@cval)))
      }
    }
  }
  for (type in c("mu", "tau")) {
    for (lg in list("short", "long", 3L)) {
      r <- if (is.character(lg)) ur.kpss(y, type = type, lags = lg)
           else ur.kpss(y, type = type, use.lag = lg)
      kp <- c(kp, obj(series = str(nm), type = str(type), lags = str(as.character(lg)),
                      stat = num(r@teststat), lag = num(r@lag), cval = num(r@cval)))
    }
  }
  for (model in c("constant", "trend")) {
    for (lm in c(0L, 1L, 4L)) {
      r <- ur.ers(y, type = "DF-GLS", model = model, lag.max = lm)
      ers <- c(ers, obj(series = str(nm), model = str(model), lagmax = num(lm),
                        stat = num(r@teststat), lag = num(r@lag), cval = num(r@cval),
                        nobs = num(length(y))))
    }
  }
  for (model in c("intercept", "trend", "both")) {
    for (lg in c(0L, 2L)) {
      r <- suppressWarnings(ur.za(y, model = model, lag = lg))
      za <- c(za, obj(series = str(nm), model = str(model), lag = num(lg),
                      stat = num(r@teststat), bpoint = num(r@bpoint),
                      tstats = num(r@tstats), cval = num(r@cval)))
    }
  }
}
out <- paste0("{", str("library"), ":", str(ver), ",\n",
              str("pp"), ":[\n", paste(pp, collapse = ",\n"), "],\n",
              str("kpss"), ":[\n", paste(kp, collapse = ",\n"), "],\n",
              str("ers"), ":[\n", paste(ers, collapse = ",\n"), "],\n",
              str("za"), ":[\n", paste(za, collapse = ",\n"), "]}\n")
writeLines(out, file.path(fix, "unitroot_urca.json"))

# MacKinnon (1996) numerical distribution functions, N = Inf (asymptotic)
# and finite samples; one variable (unit-root case).
q <- c(); p <- c()
for (tr in c("nc", "c", "ct", "ctt")) {
  for (st in c("t", "n")) {
    for (nn in c(Inf, 100, 250)) {
      lv <- c(0.01, 0.025, 0.05, 0.10)
      q <- c(q, obj(trend = str(tr), statistic = str(st), n = if (is.finite(nn)) num(nn) else num(0),
                    levels = num(lv), q = num(qunitroot(lv, N = nn, trend = tr, statistic = st))))
    }
  }
  s <- c(-4.5, -4, -3.5, -3, -2.5, -2, -1.5, -1, 0)
  p <- c(p, obj(trend = str(tr), stat = num(s), p = num(punitroot(s, N = Inf, trend = tr, statistic = "t"))))
}
out <- paste0("{", str("library"), ":", str(ver), ",\n",
              str("functions"), ":", str("urca qunitroot, punitroot"), ",\n",
              str("quantiles"), ":[\n", paste(q, collapse = ",\n"), "],\n",
              str("pvalues"), ":[\n", paste(p, collapse = ",\n"), "]}\n")
writeLines(out, file.path(fix, "critical_urca.json"))
cat("wrote unitroot_urca.json and critical_urca.json with", ver, "\n")
