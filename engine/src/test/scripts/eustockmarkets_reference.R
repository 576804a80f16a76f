# Reference computations on R's open dataset datasets::EuStockMarkets (package r-base-core): daily closing
# prices of the DAX, SMI, CAC and FTSE indices, 1991-1998, 1860 business days, a ts of frequency 260.
#
# Usage: Rscript eustockmarkets_reference.R OUT_DIR
# Writes OUT_DIR/eustockmarkets.csv (date,DAX,SMI,CAC,FTSE) and OUT_DIR/reference.csv (quantity,first,second,value)
# with R's own colMeans, cov and quadprog::solve.QP results (package r-cran-quadprog), every number with 17
# significant digits so that it reads back to the same double.
#
# The ts carries no calendar dates, only a fractional-year index with 260 observations a year; the dates written
# are consecutive weekdays from Monday 1991-07-01, a construction of this script, so that the history has a date
# column. Annualisation uses R's own frequency, 260.
suppressPackageStartupMessages(library(quadprog))
args <- commandArgs(trailingOnly = TRUE)
out <- args[1]
x <- as.matrix(EuStockMarkets)
n <- nrow(x)
days <- seq(as.Date("1991-07-01"), by = "day", length.out = 2 * n)
days <- days[!(format(days, "%u") %in% c("6", "7"))][1:n]
f17 <- function(v) sprintf("%.17g", v)
prices <- data.frame(date = format(days, "%Y-%m-%d"), apply(x, 2, f17), check.names = FALSE)
write.csv(prices, file.path(out, "eustockmarkets.csv"), row.names = FALSE, quote = FALSE)

ppy <- frequency(EuStockMarkets)
rows <- list()
add <- function(q, a, b, v) rows[[length(rows) + 1]] <<- data.frame(quantity = q, first = a, second = b, value = f17(v))
assets <- colnames(x)
for (kind in c("simple", "log")) {
  r <- if (kind == "simple") diff(x) / x[-n, ] else diff(log(x))
  mu <- colMeans(r) * ppy
  S <- cov(r) * ppy
  for (i in seq_along(assets)) {
    add(paste0("mean_", kind), assets[i], "", mu[i])
    for (j in seq_along(assets)) add(paste0("cov_", kind), assets[i], assets[j], S[i, j])
  }
  k <- length(assets)
  # minimise w'Sw subject to sum(w) = 1 (solve.QP minimises -d'b + b'Db/2, so D = 2S, d = 0)
  gmv <- solve.QP(Dmat = 2 * S, dvec = rep(0, k), Amat = cbind(rep(1, k)), bvec = 1, meq = 1)$solution
  long <- solve.QP(Dmat = 2 * S, dvec = rep(0, k), Amat = cbind(rep(1, k), diag(k)), bvec = c(1, rep(0, k)),
                   meq = 1)$solution
  for (i in seq_along(assets)) {
    add(paste0("gmv_", kind), assets[i], "", gmv[i])
    add(paste0("gmv_long_only_", kind), assets[i], "", long[i])
  }
}
add("periods_per_year", "", "", ppy)
add("rows", "", "", n)
write.csv(do.call(rbind, rows), file.path(out, "reference.csv"), row.names = FALSE, quote = FALSE)
