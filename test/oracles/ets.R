# Reference fixtures for engine/models and engine/backtest, computed with R 4.2.2 and
# forecast 8.20 (Debian). Run from the project root:  Rscript test/oracles/ets.R
# Every fixture records the exact R call that produced it. Numbers are written with
# sprintf("%.17g") so they round-trip to the same IEEE doubles.
suppressMessages(library(forecast))

out_dir <- file.path("test", "fixtures", "models")
dir.create(out_dir, recursive = TRUE, showWarnings = FALSE)

# --- a tiny JSON writer with full double precision ---------------------------------
arr <- function(x) structure(list(as.numeric(x)), class = "json_array")
json <- function(x) {
  if (inherits(x, "json_array")) {
    v <- x[[1]]
    return(paste0("[", paste(vapply(v, num, ""), collapse = ","), "]"))
  }
  if (is.null(x)) return("null")
  if (is.list(x)) {
    if (!is.null(names(x))) {
      keys <- names(x)
      parts <- vapply(seq_along(x), function(i) paste0(str(keys[i]), ":", json(x[[i]])), "")
      return(paste0("{", paste(parts, collapse = ","), "}"))
    }
    return(paste0("[", paste(vapply(x, json, ""), collapse = ","), "]"))
  }
  if (is.character(x)) {
    if (length(x) == 1) return(str(x))
    return(paste0("[", paste(vapply(x, str, ""), collapse = ","), "]"))
  }
  if (is.logical(x) && length(x) == 1) return(if (is.na(x)) "null" else if (x) "true" else "false")
  if (is.numeric(x)) {
    if (length(x) == 1) return(num(x))
    return(paste0("[", paste(vapply(x, num, ""), collapse = ","), "]"))
  }
  stop("cannot write ", class(x))
}
num <- function(v) if (is.na(v)) "null" else if (is.infinite(v)) stop("infinite value") else sprintf("%.17g", v)
str <- function(s) paste0("\"", gsub("\"", "\\\\\"", s), "\"")
write_fixture <- function(x, name) {
  writeLines(json(x), file.path(out_dir, name))
  cat("wrote", file.path(out_dir, name), "\n")
}

# --- ETS fits ------------------------------------------------------------------------
ets_case <- function(name, call_text, y, h) {
  fit <- eval(parse(text = call_text))
  fc <- forecast(fit, h = h, level = c(80, 95))
  comp <- fit$components
  p <- fit$par
  getp <- function(k) if (k %in% names(p)) unname(p[k]) else NULL
  st <- fit$states
  list(
    name = name,
    call = paste0(call_text, "; forecast(fit, h = ", h, ", level = c(80, 95))"),
    y = arr(y),
    frequency = frequency(y),
    method = fit$method,
    components = list(error = comp[1], trend = comp[2], season = comp[3], damped = comp[4] == "TRUE"),
    par = list(alpha = getp("alpha"), beta = getp("beta"), gamma = getp("gamma"), phi = getp("phi")),
    initstate = arr(fit$initstate),
    stateWidth = ncol(st),
    states = arr(as.vector(t(st))),
    loglik = fit$loglik, aic = fit$aic, aicc = fit$aicc, bic = fit$bic,
    sigma2 = fit$sigma2, mse = fit$mse,
    nmEvaluations = if (!is.null(fit$fit$fncount)) fit$fit$fncount else NULL,
    residuals = arr(fit$residuals), fitted = arr(fit$fitted),
    forecast = list(h = h, mean = arr(fc$mean),
      lower80 = arr(fc$lower[, 1]), upper80 = arr(fc$upper[, 1]),
      lower95 = arr(fc$lower[, 2]), upper95 = arr(fc$upper[, 2]))
  )
}

# A seeded synthetic daily-like series with period 7: a drifting level, a weekly pattern
# and noise. Each of the six additive models is fitted to it.
set.seed(20240601)
n_syn <- 168
weekly <- c(12, -4, -6, -3, 0, 8, -7)
level <- 200 + cumsum(rnorm(n_syn, 0.15, 0.8))
synthetic <- ts(level + rep(weekly, length.out = n_syn) + rnorm(n_syn, 0, 3), frequency = 7)

cases <- list(
  ets_case("WWWusage-auto", "fit <- ets(WWWusage)", WWWusage, 10),
  ets_case("AirPassengers-AAdA", "fit <- ets(AirPassengers, model = \"AAA\", damped = TRUE)", AirPassengers, 24),
  ets_case("USAccDeaths-AAA", "fit <- ets(USAccDeaths, model = \"AAA\")", USAccDeaths, 24),
  ets_case("USAccDeaths-AAA-undamped", "fit <- ets(USAccDeaths, model = \"AAA\", damped = FALSE)", USAccDeaths, 24),
  ets_case("Nile-ANN", "fit <- ets(Nile, model = \"ANN\")", Nile, 10),
  ets_case("synthetic-ANN", "fit <- ets(synthetic, model = \"ANN\")", synthetic, 14),
  ets_case("synthetic-AAN", "fit <- ets(synthetic, model = \"AAN\", damped = FALSE)", synthetic, 14),
  ets_case("synthetic-AAdN", "fit <- ets(synthetic, model = \"AAN\", damped = TRUE)", synthetic, 14),
  ets_case("synthetic-ANA", "fit <- ets(synthetic, model = \"ANA\")", synthetic, 14),
  ets_case("synthetic-AAA", "fit <- ets(synthetic, model = \"AAA\", damped = FALSE)", synthetic, 14),
  ets_case("synthetic-AAdA", "fit <- ets(synthetic, model = \"AAA\", damped = TRUE)", synthetic, 14)
)

# Automatic selection among the additive models only (the family Ebbline implements).
auto_case <- function(name, call_text, y) {
  fit <- eval(parse(text = call_text))
  list(name = name, call = call_text, y = arr(y), frequency = frequency(y),
       method = fit$method, aicc = fit$aicc)
}
autos <- list(
  auto_case("WWWusage", "fit <- ets(WWWusage, additive.only = TRUE)", WWWusage),
  auto_case("USAccDeaths", "fit <- ets(USAccDeaths, additive.only = TRUE)", USAccDeaths),
  auto_case("synthetic", "fit <- ets(synthetic, additive.only = TRUE)", synthetic),
  auto_case("Nile", "fit <- ets(Nile, additive.only = TRUE)", Nile)
)

write_fixture(list(
  source = "R 4.2.2, forecast 8.20 (Debian); script test/oracles/ets.R",
  synthetic = list(call = paste(
    "set.seed(20240601); n_syn <- 168; weekly <- c(12, -4, -6, -3, 0, 8, -7);",
    "level <- 200 + cumsum(rnorm(n_syn, 0.15, 0.8));",
    "synthetic <- ts(level + rep(weekly, length.out = n_syn) + rnorm(n_syn, 0, 3), frequency = 7)")),
  cases = cases,
  auto = autos
), "ets.json")

# --- forecast's initial-state heuristic (the optimiser's starting point) --------------
init_case <- function(name, y, trend, season) {
  call_text <- sprintf("forecast:::initstate(%s, trendtype = \"%s\", seasontype = \"%s\")", name, trend, season)
  list(name = name, call = call_text, y = arr(y), frequency = frequency(y), trend = trend, season = season,
       state = arr(unname(forecast:::initstate(y, trendtype = trend, seasontype = season))))
}
short_seasonal <- ts(synthetic[1:18], frequency = 7)
write_fixture(list(
  source = "R 4.2.2, forecast 8.20 (Debian); script test/oracles/ets.R",
  cases = list(
    init_case("WWWusage", WWWusage, "N", "N"),
    init_case("WWWusage", WWWusage, "A", "N"),
    init_case("USAccDeaths", USAccDeaths, "A", "A"),
    init_case("AirPassengers", AirPassengers, "N", "A"),
    init_case("short_seasonal", short_seasonal, "A", "A"),
    init_case("short_seasonal", short_seasonal, "N", "A")
  ),
  notes = "short_seasonal <- ts(synthetic[1:18], frequency = 7): fewer than 3 periods, so initstate uses the Fourier regression"
), "initstate.json")

# --- R's Nelder-Mead (the optimiser forecast::ets calls) -----------------------------
rosenbrock <- function(x) 100 * (x[2] - x[1]^2)^2 + (1 - x[1])^2
nm1 <- optim(c(-1.2, 1), rosenbrock, method = "Nelder-Mead")
quartic <- function(x) sum((x - c(1, -2, 3, 0.5))^4) + sum(x^2)
nm2 <- optim(c(0, 0, 0, 0), quartic, method = "Nelder-Mead", control = list(maxit = 2000, reltol = sqrt(.Machine$double.eps)))
write_fixture(list(
  source = "R 4.2.2 stats::optim (Debian); script test/oracles/ets.R",
  cases = list(
    list(call = "optim(c(-1.2, 1), function(x) 100 * (x[2] - x[1]^2)^2 + (1 - x[1])^2, method = \"Nelder-Mead\")",
         function_name = "rosenbrock", start = arr(c(-1.2, 1)), maxit = 500,
         par = arr(nm1$par), value = nm1$value, evaluations = unname(nm1$counts["function"]), convergence = nm1$convergence),
    list(call = "optim(c(0, 0, 0, 0), function(x) sum((x - c(1, -2, 3, 0.5))^4) + sum(x^2), method = \"Nelder-Mead\", control = list(maxit = 2000))",
         function_name = "quartic", start = arr(c(0, 0, 0, 0)), maxit = 2000,
         par = arr(nm2$par), value = nm2$value, evaluations = unname(nm2$counts["function"]), convergence = nm2$convergence)
  )
), "neldermead.json")

# --- decomposition + ETS (forecast's stlf: ETS on the seasonally adjusted series) ----
dec <- mstl(USAccDeaths, s.window = 13)
seasonal_usa <- rowSums(dec[, grep("Seasonal", colnames(dec)), drop = FALSE])
stl_fc <- stlf(USAccDeaths, h = 24, s.window = 13, etsmodel = "AZN", level = c(80, 95))
write_fixture(list(
  source = "R 4.2.2, forecast 8.20 (Debian); script test/oracles/ets.R",
  call = "dec <- mstl(USAccDeaths, s.window = 13); seasonal <- rowSums(dec[, grep(\"Seasonal\", colnames(dec)), drop = FALSE]); f <- stlf(USAccDeaths, h = 24, s.window = 13, etsmodel = \"AZN\", level = c(80, 95))",
  y = arr(USAccDeaths), period = 12, seasonal = arr(seasonal_usa),
  method = stl_fc$method, etsMethod = stl_fc$model$method, etsAicc = stl_fc$model$aicc,
  mean = arr(stl_fc$mean), lower80 = arr(stl_fc$lower[, 1]), upper80 = arr(stl_fc$upper[, 1]),
  lower95 = arr(stl_fc$lower[, 2]), upper95 = arr(stl_fc$upper[, 2])
), "decomposition_ets.json")

# --- HoltWinters: smoothing recursions with R's own start values --------------------
hw_case <- function(name, call_text, x) {
  hw <- eval(parse(text = call_text))
  f <- frequency(x)
  seasonal <- !is.logical(hw$gamma)
  trend <- !is.logical(hw$beta)
  # Start values exactly as stats::HoltWinters computes them.
  if (!seasonal) {
    l.start <- x[1L]; b.start <- NULL; s.start <- NULL; start.time <- 2L
  } else {
    st <- decompose(ts(x[1L:(2L * f)], start = start(x), frequency = f), "additive")
    dat <- na.omit(st$trend)
    cf <- coef(.lm.fit(x = cbind(1, seq_along(dat)), y = dat))
    l.start <- cf[1L]; b.start <- cf[2L]; s.start <- st$figure; start.time <- f + 1L
  }
  list(name = name, call = call_text, x = arr(x), frequency = f,
       alpha = unname(hw$alpha), beta = if (trend) unname(hw$beta) else NULL,
       gamma = if (seasonal) unname(hw$gamma) else NULL,
       lStart = unname(l.start), bStart = if (trend) unname(b.start) else NULL,
       sStart = if (seasonal) arr(s.start) else NULL, startTime = start.time,
       SSE = hw$SSE, coefficients = arr(hw$coefficients))
}
write_fixture(list(
  source = "R 4.2.2 stats::HoltWinters (Debian); script test/oracles/ets.R",
  cases = list(
    hw_case("Nile-ses", "hw <- HoltWinters(Nile, beta = FALSE, gamma = FALSE)", Nile),
    hw_case("co2", "hw <- HoltWinters(co2)", co2)
  )
), "holtwinters.json")

# --- classical decomposition (the start of forecast's initial states) --------------
dec_case <- function(name, x) {
  d <- decompose(x)
  list(name = name, call = paste0("decompose(", name, ")"), x = arr(x), frequency = frequency(x),
       figure = arr(d$figure), trend = arr(d$trend))
}
write_fixture(list(
  source = "R 4.2.2 stats::decompose (Debian); script test/oracles/ets.R",
  cases = list(dec_case("USAccDeaths", USAccDeaths), dec_case("synthetic", synthetic))
), "decompose.json")

# --- seasonal naive / naive forecasts and accuracy (MASE) ---------------------------
train_air <- window(AirPassengers, end = c(1958, 12))
test_air <- window(AirPassengers, start = c(1959, 1))
sn <- snaive(train_air, h = 24, level = c(80, 95))
acc_sn <- accuracy(sn, test_air)
fit_air <- ets(train_air, model = "AAA")
fc_air <- forecast(fit_air, h = 24)
acc_air <- accuracy(fc_air, test_air)
train_nile <- window(Nile, end = 1950)
test_nile <- window(Nile, start = 1951)
nv <- naive(train_nile, h = 20, level = c(80, 95))
acc_nv <- accuracy(nv, test_nile)
write_fixture(list(
  source = "R 4.2.2, forecast 8.20 (Debian); script test/oracles/ets.R",
  snaive = list(
    call = "train <- window(AirPassengers, end = c(1958, 12)); test <- window(AirPassengers, start = c(1959, 1)); f <- snaive(train, h = 24, level = c(80, 95)); accuracy(f, test)",
    train = arr(train_air), test = arr(test_air), period = 12,
    mean = arr(sn$mean), lower80 = arr(sn$lower[, 1]), upper80 = arr(sn$upper[, 1]),
    lower95 = arr(sn$lower[, 2]), upper95 = arr(sn$upper[, 2]),
    testMASE = acc_sn["Test set", "MASE"], testMAE = acc_sn["Test set", "MAE"]),
  etsAccuracy = list(
    call = "fit <- ets(train, model = \"AAA\"); f <- forecast(fit, h = 24); accuracy(f, test)",
    mean = arr(fc_air$mean), testMASE = acc_air["Test set", "MASE"]),
  naive = list(
    call = "train <- window(Nile, end = 1950); test <- window(Nile, start = 1951); f <- naive(train, h = 20, level = c(80, 95)); accuracy(f, test)",
    train = arr(train_nile), test = arr(test_nile), period = 1,
    mean = arr(nv$mean), lower80 = arr(nv$lower[, 1]), upper80 = arr(nv$upper[, 1]),
    lower95 = arr(nv$lower[, 2]), upper95 = arr(nv$upper[, 2]),
    testMASE = acc_nv["Test set", "MASE"])
), "accuracy.json")

# --- Croston's method -------------------------------------------------------------------
set.seed(7)
n_int <- 120
occur <- rbinom(n_int, 1, 0.25)
intermittent <- occur * round(rlnorm(n_int, log(40), 0.5), 2)
cr1 <- croston(intermittent, h = 5, alpha = 0.1)
cr2 <- croston(intermittent, h = 5, alpha = 0.2)
write_fixture(list(
  source = "R 4.2.2, forecast 8.20 (Debian); script test/oracles/ets.R",
  series = list(call = "set.seed(7); occur <- rbinom(120, 1, 0.25); y <- occur * round(rlnorm(120, log(40), 0.5), 2)",
                y = arr(intermittent)),
  cases = list(
    list(call = "croston(y, h = 5, alpha = 0.1)", alpha = 0.1, mean = arr(cr1$mean),
         demand = unname(cr1$model$demand$mean[1]), interval = unname(cr1$model$period$mean[1])),
    list(call = "croston(y, h = 5, alpha = 0.2)", alpha = 0.2, mean = arr(cr2$mean),
         demand = unname(cr2$model$demand$mean[1]), interval = unname(cr2$model$period$mean[1])))
), "croston.json")
