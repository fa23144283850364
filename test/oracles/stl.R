# Reference fixtures for engine/decompose (STL and MSTL), computed with R 4.2.2 stats::stl
# (Fortran stl.f) and forecast 8.20 forecast::mstl, both from Debian.
# Run from the project root:  Rscript test/oracles/stl.R
# Writes test/fixtures/decompose/stl.json and test/fixtures/decompose/mstl.json. Every case
# records the exact R call in "call". Numbers are written with sprintf("%.17g") so they
# round-trip to the same IEEE doubles (jsonlite::toJSON(digits = NA) stops at 15
# significant digits, which is not full precision).
suppressMessages(library(forecast))

out_dir <- file.path("test", "fixtures", "decompose")
dir.create(out_dir, recursive = TRUE, showWarnings = FALSE)

# --- minimal JSON writer with full double precision ----------------------------------
num <- function(v) {
  if (is.na(v)) return("null")
  if (v == round(v) && abs(v) < 2^53) return(sprintf("%.0f", v))
  sprintf("%.17g", v)
}
qstr <- function(s) paste0("\"", gsub("\"", "\\\\\"", s), "\"")
vec <- function(x) structure(list(as.numeric(x)), class = "json_vec")
json <- function(x) {
  if (inherits(x, "json_vec")) {
    return(paste0("[", paste(vapply(x[[1]], num, ""), collapse = ","), "]"))
  }
  if (is.null(x)) return("null")
  if (is.list(x)) {
    if (!is.null(names(x))) {
      parts <- vapply(seq_along(x), function(i) paste0(qstr(names(x)[i]), ":", json(x[[i]])), "")
      return(paste0("{", paste(parts, collapse = ","), "}"))
    }
    return(paste0("[", paste(vapply(x, json, ""), collapse = ","), "]"))
  }
  if (is.character(x)) {
    if (length(x) == 1) return(qstr(x))
    return(paste0("[", paste(vapply(x, qstr, ""), collapse = ","), "]"))
  }
  if (is.logical(x) && length(x) == 1) return(if (x) "true" else "false")
  if (is.numeric(x) && length(x) == 1) return(num(x))
  stop("unsupported value")
}

# --- seeded synthetic daily series ---------------------------------------------------
# Weekly pattern (Mon..Sun effects), gentle trend and Gaussian noise; 400 days, so the
# length is not a multiple of the period.
set.seed(20240601)
weekly_effect <- c(12, 4, 0, -3, 18, -14, -17)
n_w <- 400
daily_weekly <- 100 + 0.05 * seq_len(n_w) + weekly_effect[(seq_len(n_w) - 1) %% 7 + 1] + rnorm(n_w, sd = 3)

# Three years of daily data with weekly and yearly components (for MSTL).
set.seed(7301)
n_y <- 1096
tt <- seq_len(n_y)
daily_yearly <- 200 + 0.02 * tt + weekly_effect[(tt - 1) %% 7 + 1] +
  25 * sin(2 * pi * tt / 365.25) + 10 * cos(4 * pi * tt / 365.25) + rnorm(n_y, sd = 4)
# Add a few outliers so the robust MSTL case differs from the plain one.
daily_yearly[c(50, 400, 777)] <- daily_yearly[c(50, 400, 777)] + c(150, -120, 200)

# Weekly plus a 30-day cycle, 300 days (the REFERENCES.md example shape).
set.seed(4411)
n_30 <- 300
t30 <- seq_len(n_30)
daily_30 <- 50 + weekly_effect[(t30 - 1) %% 7 + 1] + 8 * sin(2 * pi * t30 / 30) + rnorm(n_30, sd = 2)

# --- STL cases -------------------------------------------------------------------------
stl_case <- function(name, call_text, data, data_call) {
  x <- eval(parse(text = data_call))
  fit <- eval(parse(text = call_text), envir = list(x = x, nottem = nottem, co2 = co2,
    USAccDeaths = USAccDeaths, daily_weekly = daily_weekly))
  ts_ <- fit$time.series
  list(
    name = name,
    call = call_text,
    data = data_call,
    period = frequency(x),
    x = vec(x),
    win = list(s = unname(fit$win["s"]), t = unname(fit$win["t"]), l = unname(fit$win["l"])),
    deg = list(s = unname(fit$deg["s"]), t = unname(fit$deg["t"]), l = unname(fit$deg["l"])),
    jump = list(s = unname(fit$jump["s"]), t = unname(fit$jump["t"]), l = unname(fit$jump["l"])),
    inner = fit$inner,
    outer = fit$outer,
    seasonal = vec(ts_[, "seasonal"]),
    trend = vec(ts_[, "trend"]),
    remainder = vec(ts_[, "remainder"]),
    weights = vec(fit$weights)
  )
}

stl_cases <- list(
  stl_case("nottem-periodic", 'stl(nottem, s.window = "periodic")', NULL, "nottem"),
  stl_case("nottem-7", "stl(nottem, s.window = 7)", NULL, "nottem"),
  stl_case("nottem-7-sdeg1", "stl(nottem, s.window = 7, s.degree = 1)", NULL, "nottem"),
  stl_case("co2-21", "stl(co2, s.window = 21)", NULL, "co2"),
  stl_case("co2-periodic-robust", 'stl(co2, s.window = "periodic", robust = TRUE)', NULL, "co2"),
  stl_case("co2-35-sdeg1-tdeg0-jump1",
    "stl(co2, s.window = 35, s.degree = 1, t.degree = 0, s.jump = 1, t.jump = 1, l.jump = 1)", NULL, "co2"),
  stl_case("USAccDeaths-13-robust", "stl(USAccDeaths, s.window = 13, robust = TRUE)", NULL, "USAccDeaths"),
  stl_case("daily-weekly-11", "stl(x, s.window = 11)", NULL, "ts(daily_weekly, frequency = 7)"),
  stl_case("daily-weekly-11-robust", "stl(x, s.window = 11, robust = TRUE)", NULL, "ts(daily_weekly, frequency = 7)")
)

stl_doc <- list(
  source = paste0("R ", R.version$major, ".", R.version$minor, " stats::stl (Debian); script test/oracles/stl.R"),
  note = paste0("x is the input series; seasonal, trend, remainder from fit$time.series; weights = fit$weights. ",
    "daily_weekly: set.seed(20240601); 100 + 0.05*t + weekly effect c(12,4,0,-3,18,-14,-17) + rnorm(400, sd = 3)."),
  cases = stl_cases
)
writeLines(json(stl_doc), file.path(out_dir, "stl.json"))

# --- MSTL cases ------------------------------------------------------------------------
mstl_case <- function(name, call_text, data_call, periods) {
  x <- eval(parse(text = data_call))
  warned <- character(0)
  fit <- withCallingHandlers(
    eval(parse(text = call_text), envir = list(x = x)),
    warning = function(w) {
      warned <<- c(warned, conditionMessage(w))
      invokeRestart("muffleWarning")
    }
  )
  cols <- colnames(fit)
  seas_cols <- cols[grepl("^Seasonal", cols)]
  list(
    name = name,
    call = call_text,
    data = data_call,
    periods = vec(periods),
    x = vec(as.numeric(x)),
    columns = cols,
    warnings = as.list(warned),
    trend = vec(fit[, "Trend"]),
    seasonal = lapply(seas_cols, function(cn) list(column = cn, values = vec(fit[, cn]))),
    remainder = vec(fit[, "Remainder"])
  )
}

mstl_cases <- list(
  mstl_case("daily-7-365.25", "mstl(x)", "msts(daily_yearly, seasonal.periods = c(7, 365.25))", c(7, 365.25)),
  mstl_case("daily-7-365.25-robust", "mstl(x, robust = TRUE)",
    "msts(daily_yearly, seasonal.periods = c(7, 365.25))", c(7, 365.25)),
  mstl_case("daily-7-30", "mstl(x)", "msts(daily_30, seasonal.periods = c(7, 30))", c(7, 30)),
  mstl_case("daily-30-7-periodic", 'mstl(x, s.window = "periodic")',
    "msts(daily_30, seasonal.periods = c(30, 7))", c(30, 7)),
  mstl_case("daily-600-drops-yearly", "mstl(x)",
    "msts(daily_yearly[1:600], seasonal.periods = c(7, 365.25))", c(7, 365.25)),
  mstl_case("daily-7-iterate3-swindow", "mstl(x, iterate = 3, s.window = 21)",
    "msts(daily_weekly, seasonal.periods = 7)", 7)
)

mstl_doc <- list(
  source = paste0("R ", R.version$major, ".", R.version$minor, " forecast ", as.character(packageVersion("forecast")),
    " forecast::mstl (Debian); script test/oracles/stl.R"),
  note = paste0("daily_yearly: set.seed(7301); 200 + 0.02*t + weekly + 25 sin(2 pi t/365.25) + 10 cos(4 pi t/365.25) ",
    "+ rnorm(1096, sd = 4), outliers added at t = 50, 400, 777. daily_30: set.seed(4411); 50 + weekly + ",
    "8 sin(2 pi t/30) + rnorm(300, sd = 2). daily_weekly as in stl.json."),
  cases = mstl_cases
)
writeLines(json(mstl_doc), file.path(out_dir, "mstl.json"))
cat("wrote", file.path(out_dir, "stl.json"), "and", file.path(out_dir, "mstl.json"), "\n")
