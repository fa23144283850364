# Reference fixtures for engine/stats (series diagnostics), computed with R and its
# packages from Debian (R 4.2.2, forecast 8.20, tseries 0.10.53, urca 1.3.3, jsonlite).
#
#   Rscript test/oracles/diagnostics.R        (from the repository root)
#
# Writes test/fixtures/stats/*.json. Every stored value carries the exact R call that
# produced it in its "call" field; numbers are written with full precision (sprintf("%.17g"), see exact_json).
# The synthetic daily series are generated here with set.seed and stored with the fixtures,
# so the tests never need R. test/oracles/diagnostics.py reads series.json afterwards and
# adds the statsmodels references.

suppressPackageStartupMessages({
  library(jsonlite)
  library(tseries)
  library(urca)
  library(forecast)
})

out_dir <- file.path("test", "fixtures", "stats")
dir.create(out_dir, recursive = TRUE, showWarnings = FALSE)

# jsonlite's digits = NA still stops at 15 significant digits, which is not enough to
# reproduce a double: every double is written here with sprintf("%.17g") (round-trip exact)
# and handed to toJSON verbatim.
exact_json <- function(x) {
  if (is.list(x)) {
    out <- lapply(x, exact_json)
    names(out) <- names(x)
    return(out)
  }
  if (is.double(x)) {
    if (any(!is.finite(x))) stop("non-finite value in a fixture")
    digits <- sprintf("%.17g", x)
    if (length(x) == 1) return(structure(digits, class = "json"))
    return(structure(paste0("[", paste(digits, collapse = ","), "]"), class = "json"))
  }
  x
}

write_fixture <- function(x, name) {
  path <- file.path(out_dir, name)
  writeLines(toJSON(exact_json(x), auto_unbox = TRUE, json_verbatim = TRUE, pretty = FALSE), path)
  cat("wrote", path, "\n")
}

versions <- list(
  R = R.version.string,
  forecast = as.character(packageVersion("forecast")),
  tseries = as.character(packageVersion("tseries")),
  urca = as.character(packageVersion("urca"))
)

# ---------------------------------------------------------------------------------------
# Input series: R datasets plus seeded synthetic daily series (frequency 7).
# ---------------------------------------------------------------------------------------
set.seed(20240611)
n_daily <- 365
synthetic <- list(
  whiteNoise = list(
    x = ts(rnorm(n_daily, mean = 100, sd = 15), frequency = 7),
    how = "set.seed(20240611); rnorm(365, mean = 100, sd = 15)"
  ),
  ar1 = list(
    x = ts(as.numeric(arima.sim(list(ar = 0.6), n = n_daily, sd = 20)) + 250, frequency = 7),
    how = "arima.sim(list(ar = 0.6), n = 365, sd = 20) + 250 (after whiteNoise)"
  ),
  randomWalk = list(
    x = ts(1000 + cumsum(rnorm(n_daily, sd = 25)), frequency = 7),
    how = "1000 + cumsum(rnorm(365, sd = 25)) (after ar1)"
  ),
  weeklySeasonal = list(
    x = ts(rep(c(120, 80, 60, 55, 70, 140, 30), 52) + rnorm(364, sd = 12), frequency = 7),
    how = "rep(c(120, 80, 60, 55, 70, 140, 30), 52) + rnorm(364, sd = 12) (after randomWalk)"
  ),
  trendStationary = list(
    x = ts(5 + 0.2 * (1:400) + as.numeric(arima.sim(list(ar = 0.4), n = 400, sd = 4)), frequency = 7),
    how = "5 + 0.2 * (1:400) + arima.sim(list(ar = 0.4), n = 400, sd = 4) (after weeklySeasonal)"
  ),
  shortDaily = list(
    x = ts(round(rnorm(30, mean = 40, sd = 9), 2), frequency = 7),
    how = "round(rnorm(30, mean = 40, sd = 9), 2) (after trendStationary)"
  )
)

datasets <- list(
  AirPassengers = AirPassengers,
  logAirPassengers = log(AirPassengers),
  nottem = nottem,
  Nile = Nile,
  co2 = co2,
  USAccDeaths = USAccDeaths,
  UKgas = UKgas
)

all_series <- c(
  lapply(names(datasets), function(nm) list(name = nm, x = datasets[[nm]], source = if (nm == "logAirPassengers") "log(R datasets::AirPassengers)" else paste0("R datasets::", nm), expr = if (nm == "logAirPassengers") "log(AirPassengers)" else nm)),
  lapply(names(synthetic), function(nm) list(name = nm, x = synthetic[[nm]]$x, source = synthetic[[nm]]$how, expr = nm))
)
names(all_series) <- vapply(all_series, function(s) s$name, "")

write_fixture(list(
  versions = versions,
  series = lapply(all_series, function(s) list(
    name = s$name,
    source = s$source,
    expr = s$expr,
    frequency = frequency(s$x),
    values = as.numeric(s$x)
  ))
), "series.json")

# ---------------------------------------------------------------------------------------
# ACF, PACF and bands.
# ---------------------------------------------------------------------------------------
acf_fixture <- lapply(all_series, function(s) {
  x <- s$x
  n <- length(x)
  lag_max <- min(40, n - 1)
  a <- drop(acf(x, lag.max = lag_max, plot = FALSE)$acf)
  p <- drop(pacf(x, lag.max = lag_max, plot = FALSE)$acf)
  clim0 <- qnorm((1 + 0.95) / 2) / sqrt(n)
  # The Bartlett band exactly as stats:::plot.acf draws ci.type = "ma".
  ma <- clim0 * sqrt(cumsum(c(1, 2 * a[-1]^2)))
  ma <- ma[-length(ma)]
  list(
    name = s$name,
    n = n,
    lagMax = lag_max,
    acf = list(call = sprintf("drop(acf(%s, lag.max = %d, plot = FALSE)$acf)", s$expr, lag_max), value = a),
    pacf = list(call = sprintf("drop(pacf(%s, lag.max = %d, plot = FALSE)$acf)", s$expr, lag_max), value = p),
    whiteNoiseBand = list(call = sprintf("qnorm((1 + 0.95) / 2) / sqrt(%d)", n), value = clim0),
    whiteNoiseBand80 = list(call = sprintf("qnorm((1 + 0.8) / 2) / sqrt(%d)", n), value = qnorm(0.9) / sqrt(n)),
    bartlettBands = list(
      call = sprintf("clim0 <- qnorm(0.975)/sqrt(%d); a <- acf(%s, %d, plot = FALSE)$acf; head(clim0 * sqrt(cumsum(c(1, 2 * a[-1]^2))), -1)  # stats:::plot.acf, ci.type = \"ma\"", n, s$expr, lag_max),
      value = ma
    )
  )
})
write_fixture(list(versions = versions, cases = unname(acf_fixture)), "acf.json")

# ---------------------------------------------------------------------------------------
# Ljung-Box.
# ---------------------------------------------------------------------------------------
lb_cases <- list()
add_lb <- function(name, x, lag, fitdf, x_expr = name) {
  b <- Box.test(x, lag = lag, type = "Ljung-Box", fitdf = fitdf)
  lb_cases[[length(lb_cases) + 1]] <<- list(
    name = name,
    lag = lag,
    fitdf = fitdf,
    call = sprintf("Box.test(%s, lag = %d, type = \"Ljung-Box\", fitdf = %d)", x_expr, lag, fitdf),
    statistic = unname(b$statistic),
    df = unname(b$parameter),
    pValue = b$p.value,
    pValueUpper = pchisq(unname(b$statistic), unname(b$parameter), lower.tail = FALSE)
  )
}
for (s in all_series) {
  n <- length(s$x)
  add_lb(s$name, s$x, 1, 0, s$expr)
  add_lb(s$name, s$x, 10, 0, s$expr)
  add_lb(s$name, s$x, min(24, n - 1), 2, s$expr)
  add_lb(s$name, s$x, min(2 * frequency(s$x), n - 1), 0, s$expr)
}
lb_small <- Box.test(1:5, lag = 2, type = "Ljung-Box")
lb_cases[[length(lb_cases) + 1]] <- list(
  name = "oneToFive",
  values = 1:5,
  lag = 2,
  fitdf = 0,
  call = "Box.test(1:5, lag = 2, type = \"Ljung-Box\")",
  statistic = unname(lb_small$statistic),
  df = 2,
  pValue = lb_small$p.value,
  pValueUpper = pchisq(unname(lb_small$statistic), 2, lower.tail = FALSE)
)
write_fixture(list(versions = versions, cases = lb_cases), "ljungBox.json")

# ---------------------------------------------------------------------------------------
# White-noise verdict ingredients: Ljung-Box at the default lag of engine/stats/whiteNoise.ts
# (min(2 * frequency, n / 5) for seasonal data, min(10, n / 5) otherwise; Hyndman and
# Athanasopoulos, FPP3 section 5.4), the lags outside the 95% band and the binomial chance
# of that many outside for white noise.
# ---------------------------------------------------------------------------------------
wn_cases <- lapply(all_series, function(s) {
  x <- s$x
  n <- length(x)
  f <- frequency(x)
  h <- max(1, min(if (f > 1) 2 * f else 10, floor(n / 5)))
  r <- drop(acf(x, lag.max = h, plot = FALSE)$acf)[-1]
  band <- qnorm(0.975) / sqrt(n)
  outside <- which(abs(r) > band)
  list(
    name = s$name,
    lag = h,
    call = sprintf(paste0(
      "h <- %d; Box.test(%s, lag = h, type = \"Ljung-Box\")$p.value; ",
      "r <- acf(%s, h, plot = FALSE)$acf[-1]; o <- which(abs(r) > qnorm(0.975)/sqrt(%d)); ",
      "pbinom(length(o) - 1, h, 0.05, lower.tail = FALSE)"), h, s$expr, s$expr, n),
    pValue = Box.test(x, lag = h, type = "Ljung-Box")$p.value,
    lagsOutside = I(outside),
    chanceOfThatManyOutside = if (length(outside) == 0) 1 else pbinom(length(outside) - 1, h, 0.05, lower.tail = FALSE)
  )
})
write_fixture(list(versions = versions, cases = unname(wn_cases)), "whiteNoise.json")

# ---------------------------------------------------------------------------------------
# Differencing.
# ---------------------------------------------------------------------------------------
diff_cases <- list()
for (nm in c("Nile", "AirPassengers", "weeklySeasonal")) {
  x <- all_series[[nm]]$x
  for (spec in list(c(1, 1), c(1, 2), c(frequency(x), 1), c(frequency(x), 2), c(3, 3))) {
    d <- diff(as.numeric(x), lag = spec[1], differences = spec[2])
    diff_cases[[length(diff_cases) + 1]] <- list(
      name = nm,
      lag = spec[1],
      differences = spec[2],
      call = sprintf("diff(as.numeric(%s), lag = %d, differences = %d)", nm, spec[1], spec[2]),
      value = d
    )
  }
}
write_fixture(list(versions = versions, cases = diff_cases), "diff.json")

# ---------------------------------------------------------------------------------------
# ADF: tseries::adf.test (constant + trend, fixed lag) and urca::ur.df (AIC).
# ---------------------------------------------------------------------------------------
urdf_chosen_lag <- function(fit, type) {
  # ur.df keeps the lag it was given in @lags; the lag AIC chose is the number of lagged
  # differences left in the final regression.
  rows <- rownames(coef(fit@testreg))
  sum(startsWith(rows, "z.diff.lag"))
}

adf_tseries <- list()
adf_urca <- list()
for (s in all_series) {
  x <- s$x
  n <- length(x)
  for (k in list(NULL, 0, 2)) {
    if (is.null(k)) {
      r <- suppressWarnings(adf.test(x))
      call <- sprintf("tseries::adf.test(%s)", s$expr)
    } else {
      r <- suppressWarnings(adf.test(x, k = k))
      call <- sprintf("tseries::adf.test(%s, k = %d)", s$expr, k)
    }
    entry <- list(
      name = s$name,
      call = call,
      statistic = unname(r$statistic),
      lag = unname(r$parameter),
      pValueTable = r$p.value
    )
    if (!is.null(k)) entry$k <- k # absent: adf.test's default k = trunc((n - 1)^(1/3))
    adf_tseries[[length(adf_tseries) + 1]] <- entry
  }
  max_lag <- trunc(12 * (n / 100)^0.25)
  for (type in c("drift", "trend")) {
    for (sel in c("AIC", "Fixed")) {
      lags <- if (sel == "AIC") max_lag else 4
      fit <- ur.df(as.numeric(x), type = type, lags = lags, selectlags = sel)
      adf_urca[[length(adf_urca) + 1]] <- list(
        name = s$name,
        type = type,
        selectlags = sel,
        lags = lags,
        call = sprintf("urca::ur.df(as.numeric(%s), type = \"%s\", lags = %d, selectlags = \"%s\")", s$expr, type, lags, sel),
        statistic = unname(fit@teststat[1, 1]),
        chosenLag = urdf_chosen_lag(fit, type),
        nobs = length(residuals(fit@testreg))
      )
    }
  }
}
write_fixture(list(versions = versions, tseries = adf_tseries, urca = adf_urca), "adf.json")

# ---------------------------------------------------------------------------------------
# KPSS: tseries::kpss.test (short and long lags) and urca::ur.kpss with ndiffs' lag.
# ---------------------------------------------------------------------------------------
kpss_cases <- list()
for (s in all_series) {
  x <- s$x
  n <- length(x)
  for (null in c("Level", "Trend")) {
    for (lshort in c(TRUE, FALSE)) {
      r <- suppressWarnings(kpss.test(x, null = null, lshort = lshort))
      kpss_cases[[length(kpss_cases) + 1]] <- list(
        name = s$name,
        null = null,
        lshort = lshort,
        call = sprintf("tseries::kpss.test(%s, null = \"%s\", lshort = %s)", s$expr, null, lshort),
        statistic = unname(r$statistic),
        lag = unname(r$parameter),
        pValue = r$p.value
      )
    }
  }
}
urkpss_cases <- list()
for (s in all_series) {
  x <- as.numeric(s$x)
  n <- length(x)
  use_lag <- trunc(3 * sqrt(n) / 13)
  for (type in c("mu", "tau")) {
    r <- ur.kpss(x, type = type, use.lag = use_lag)
    urkpss_cases[[length(urkpss_cases) + 1]] <- list(
      name = s$name,
      type = type,
      useLag = use_lag,
      call = sprintf("urca::ur.kpss(as.numeric(%s), type = \"%s\", use.lag = %d)", s$expr, type, use_lag),
      statistic = r@teststat,
      lag = r@lag
    )
  }
}
write_fixture(list(versions = versions, tseries = kpss_cases, urca = urkpss_cases), "kpss.json")

# ---------------------------------------------------------------------------------------
# Suggested differencing: forecast::ndiffs (KPSS) and forecast::nsdiffs (seasonal strength).
# ---------------------------------------------------------------------------------------
ndiffs_cases <- list()
for (s in all_series) {
  x <- s$x
  for (type in c("level", "trend")) {
    for (alpha in c(0.05, 0.01)) {
      ndiffs_cases[[length(ndiffs_cases) + 1]] <- list(
        name = s$name,
        type = type,
        alpha = alpha,
        call = sprintf("forecast::ndiffs(%s, alpha = %s, test = \"kpss\", type = \"%s\")", s$expr, alpha, type),
        value = ndiffs(x, alpha = alpha, test = "kpss", type = type)
      )
    }
  }
}
nsdiffs_cases <- list()
for (s in all_series) {
  x <- s$x
  if (frequency(x) > 1 && length(x) > 2 * frequency(x)) {
    # seas.heuristic measures strength on mstl(x); its components are stored so the
    # strength formula can be checked without a decomposition in the test.
    fit <- mstl(x)
    nsdiffs_cases[[length(nsdiffs_cases) + 1]] <- list(
      name = s$name,
      frequency = frequency(x),
      call = sprintf("forecast::nsdiffs(%s); forecast:::seas.heuristic(%s); forecast::mstl(%s)", s$expr, s$expr, s$expr),
      value = nsdiffs(x),
      seasonalStrength = forecast:::seas.heuristic(x),
      mstlSeasonal = as.numeric(fit[, grep("Season", colnames(fit))[1]]),
      mstlRemainder = as.numeric(fit[, "Remainder"])
    )
  }
}
is_constant_inputs <- list(
  c(5, 5, 5), c(1e6, 1e6 + 1e-4), c(1e6, 1e6 + 1e-2), c(1e6, 1e6 + 0.1), c(0, 1e-10, 0), c(0, 1e-7),
  c(1, 1 + 1e-8, 1 - 1e-8), c(1, 1 + 2e-8), c(1, 2), c(-3, -3 - 3e-8, -3), c(0.1, 0.1, 0.1)
)
is_constant_cases <- lapply(is_constant_inputs, function(x) list(
  x = I(x),
  call = sprintf("forecast:::is.constant(c(%s))", paste(sprintf("%.17g", x), collapse = ", ")),
  value = forecast:::is.constant(x)
))
write_fixture(list(versions = versions, ndiffs = ndiffs_cases, nsdiffs = nsdiffs_cases, isConstant = is_constant_cases), "ndiffs.json")

# ---------------------------------------------------------------------------------------
# Distributions: pchisq, pgamma, pnorm, qnorm, lgamma.
# ---------------------------------------------------------------------------------------
chisq_grid <- expand.grid(
  q = c(1e-8, 0.001, 0.1, 0.5, 1, 1.5166667, 2, 3.84, 5, 10, 18.3, 25, 40, 75, 150, 400, 857.06864),
  df = c(1, 2, 3, 5, 8, 10, 22, 38, 100, 250)
)
gamma_grid <- expand.grid(
  x = c(1e-6, 0.05, 0.5, 1, 2.5, 7, 12, 30, 90, 300),
  a = c(0.1, 0.5, 0.75, 1, 2.3, 7.5, 20, 61.7, 150)
)
norm_x <- c(-37, -30, -20, -10, -8.3, -6, -5, -4, -3, -2.5, -1.959964, -1.5, -1, -0.5, -0.1, -1e-6, 0,
            1e-6, 0.1, 0.5, 1, 1.281552, 1.644854, 2, 3, 4, 5, 6, 7, 8, 8.3)
norm_p <- c(1e-300, 1e-100, 1e-20, 1e-10, 1e-5, 1e-3, 0.005, 0.01, 0.025, 0.05, 0.1, 0.2, 0.3, 0.4, 0.425,
            0.45, 0.5, 0.55, 0.575, 0.6, 0.7, 0.8, 0.9, 0.95, 0.975, 0.99, 0.995, 0.999, 1 - 1e-5, 1 - 1e-10)
lgamma_x <- c(1e-8, 0.01, 0.1, 0.5, 1, 1.5, 2, 2.5, 3.7, 5, 10, 11.5, 25, 50.5, 100, 171.5, 1000, 1e6)
write_fixture(list(
  versions = versions,
  pchisq = list(
    call = "pchisq(q, df) and pchisq(q, df, lower.tail = FALSE) over expand.grid(q, df)",
    q = chisq_grid$q, df = chisq_grid$df,
    lower = pchisq(chisq_grid$q, chisq_grid$df),
    upper = pchisq(chisq_grid$q, chisq_grid$df, lower.tail = FALSE)
  ),
  pgamma = list(
    call = "pgamma(x, shape = a) and pgamma(x, shape = a, lower.tail = FALSE) over expand.grid(x, a)",
    x = gamma_grid$x, a = gamma_grid$a,
    lower = pgamma(gamma_grid$x, shape = gamma_grid$a),
    upper = pgamma(gamma_grid$x, shape = gamma_grid$a, lower.tail = FALSE)
  ),
  pnorm = list(call = "pnorm(x)", x = norm_x, value = pnorm(norm_x)),
  qnorm = list(call = "qnorm(p)", p = norm_p, value = qnorm(norm_p)),
  lgamma = list(call = "lgamma(x)", x = lgamma_x, value = lgamma(lgamma_x))
), "distributions.json")
