#!/usr/bin/env Rscript
# Independent cross-check of isorisk's active-set QP with R's quadprog (Goldfarb & Idnani 1983 dual method,
# Debian package r-cran-quadprog).
#
# Usage: Rscript check_qp_against_quadprog.R ROOT
# Every sub-folder of ROOT holds one problem written by the Java tests ExternalSolverCrossCheckTests and
# ParametricQpTests:
#   sigma.csv        n lines of n numbers: the covariance matrix
#   constraints.csv  one constraint a'w (=|<=|>=) limit per line: name,relation,limit,a_1,...,a_n
#                    (bounds come as rows too, named lower:<asset> / upper:<asset>)
#   linear.csv       optional, n lines: a linear term q (surplus, tracking error); absent means q = 0
# The script minimises w'Sigma w - 2 q'w and writes beside them
#   quadprog_weights.csv      n lines: the weights
#   quadprog_multipliers.csv  name,value: each constraint's multiplier in isorisk's convention dV*/dlimit
# quadprog solves min 1/2 b'Db - d'b s.t. A'b >= b0 (first meq rows equalities), with KKT D b - d = A lambda and
# lambda >= 0 on inequalities. With D = 2 Sigma, d = 2 q and each '<=' row negated to a '>=' row, the stationarity
# 2 Sigma w - 2 q = sum_k lambda_k s_k a_k (s_k = -1 for '<=' rows, +1 otherwise) is isorisk's
# 2 Sigma w - 2 q = sum nu_k a_k,
# so nu_k = s_k lambda_k: '<=' limits get nu <= 0, '>=' limits nu >= 0 (equalities: see below).
suppressPackageStartupMessages(library(quadprog))
args <- commandArgs(trailingOnly = TRUE)
if (length(args) != 1) stop("usage: check_qp_against_quadprog.R ROOT")
for (d in list.dirs(args[1], recursive = FALSE)) {
  S <- as.matrix(read.csv(file.path(d, "sigma.csv"), header = FALSE))
  n <- nrow(S)
  lin <- if (file.exists(file.path(d, "linear.csv"))) as.numeric(readLines(file.path(d, "linear.csv"))) else rep(0, n)
  parts <- strsplit(readLines(file.path(d, "constraints.csv")), ",", fixed = TRUE)
  nm <- vapply(parts, `[`, "", 1)
  rel <- vapply(parts, `[`, "", 2)
  lim <- as.numeric(vapply(parts, `[`, "", 3))
  A <- t(vapply(parts, function(p) as.numeric(p[-(1:3)]), numeric(n)))
  s <- ifelse(rel == "<=", -1, 1)
  ord <- c(which(rel == "="), which(rel != "="))
  Amat <- t(A[ord, , drop = FALSE] * s[ord])
  bvec <- lim[ord] * s[ord]
  # At an exact end of the achievable range the target row depends on the binding rows and bounds (the end is a
  # linear programme's optimum), so whether the target rounded to a double is reachable is a matter of the last
  # bit; quadprog then stops with "constraints are inconsistent". When the folder has inward.txt (+1 or -1: the
  # direction into the range), the target is moved into the range by 1, 4, 16, then 64 units of double
  # precision until quadprog accepts it, and quadprog_status.txt says which.
  inward <- if (file.exists(file.path(d, "inward.txt"))) as.numeric(readLines(file.path(d, "inward.txt"))) else 0
  target <- which(nm[ord] == "target_return")
  status <- "exact"
  sol <- tryCatch(solve.QP(Dmat = 2 * S, dvec = 2 * lin, Amat = Amat, bvec = bvec, meq = sum(rel == "=")),
                  error = function(e) NULL)
  for (k in c(1, 4, 16, 64)) {
    if (!is.null(sol) || inward == 0 || length(target) != 1) break
    moved <- bvec
    moved[target] <- bvec[target] + inward * k * .Machine$double.eps * max(1, abs(bvec[target]))
    sol <- tryCatch(solve.QP(Dmat = 2 * S, dvec = 2 * lin, Amat = Amat, bvec = moved, meq = sum(rel == "=")),
                    error = function(e) NULL)
    if (!is.null(sol)) status <- paste("moved", k, "ulp inward")
  }
  if (is.null(sol)) stop(paste("quadprog found no solution in", d))
  writeLines(status, file.path(d, "quadprog_status.txt"))
  lambda <- numeric(length(lim))
  lambda[ord] <- sol$Lagrangian
  nu <- s * lambda
  # quadprog may flip the sign of an equality row internally and then reports that row's multiplier with the
  # flipped sign (seen on budget rows), so the equality multipliers are recovered from stationarity instead:
  # 2 Sigma w - 2 q - sum_ineq nu_k a_k = sum_eq nu_k a_k, solved by least squares (QR) for the equality nu.
  eq <- which(rel == "=")
  if (length(eq) > 0) {
    r <- 2 * S %*% sol$solution - 2 * lin - t(A[-eq, , drop = FALSE]) %*% nu[-eq]
    nu[eq] <- qr.solve(t(A[eq, , drop = FALSE]), r)
  }
  writeLines(formatC(sol$solution, digits = 17, format = "g"), file.path(d, "quadprog_weights.csv"))
  writeLines(paste(nm, formatC(nu, digits = 17, format = "g"), sep = ","), file.path(d, "quadprog_multipliers.csv"))
}
