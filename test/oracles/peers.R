# Peer timing for `npm run bench:peers` (test/bench/peers.ts), not a fixture script.
# R's closest analogue of Ebbline's decomposition + ETS forecast of a daily series:
#   fit <- forecast::mstl(msts(y, seasonal.periods = c(7, 365.25)))   # weekly + yearly STL
#   forecast::forecast(fit, h, method = "ets", etsmodel = "AZN")       # additive ETS on the
#                                                                       # seasonally adjusted
#                                                                       # series, seasonal naive
#                                                                       # for the seasonal parts
# forecast::mstl keeps period 365.25 only with more than two years of data, as Ebbline's
# yearly component. Usage: Rscript test/oracles/peers.R <series.csv> <horizon> <runs>
# The CSV has one column `y` (training values, oldest first). Prints one JSON object:
# the point forecast, the ETS model chosen and the elapsed milliseconds of each run
# (mstl + forecast only; R start-up and package loading excluded).
suppressMessages(library(forecast))

args <- commandArgs(trailingOnly = TRUE)
y <- read.csv(args[1])$y
h <- as.integer(args[2])
runs <- as.integer(args[3])

series <- msts(y, seasonal.periods = c(7, 365.25))
elapsed <- numeric(runs)
for (i in seq_len(runs)) {
  start <- proc.time()[["elapsed"]]
  fit <- mstl(series)
  fc <- forecast(fit, h = h, method = "ets", etsmodel = "AZN")
  elapsed[i] <- 1000 * (proc.time()[["elapsed"]] - start)
}
num <- function(x) sprintf("%.17g", x)
cat(
  "{",
  sprintf("\"columns\": [%s],", paste0("\"", colnames(fit), "\"", collapse = ", ")),
  sprintf("\"model\": \"%s\",", fc$model$method),
  sprintf("\"point\": [%s],", paste(num(as.numeric(fc$mean)), collapse = ", ")),
  sprintf("\"elapsedMs\": [%s],", paste(num(elapsed), collapse = ", ")),
  sprintf("\"version\": \"R %s, forecast %s\"", paste(R.version$major, R.version$minor, sep = "."), packageVersion("forecast")),
  "}\n",
  sep = ""
)
