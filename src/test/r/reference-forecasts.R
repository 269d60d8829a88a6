# Reference figures for the accuracy harness (ReferenceHarness): a general-purpose library used as a
# check, never as part of the product. Needs R and the forecast package from Debian:
#   apt-get install -y r-base-core r-cran-forecast
#   Rscript src/test/r/reference-forecasts.R src/test/resources/reference/r-series
# For every series (monthly and quarterly series shipped with R's datasets package and with the
# forecast package) it writes the series (<name>.csv) and, at 4 rolling origins with h = one season,
# the MASE of ets(), auto.arima(), thetaf() and the mean of the three (reference-mase.csv).
# MASE scale: the in-sample mean absolute error of the seasonal naive forecast on the training part.
suppressPackageStartupMessages(library(forecast))
args <- commandArgs(trailingOnly = TRUE)
out <- if (length(args) > 0) args[1] else "r-series"
dir.create(out, showWarnings = FALSE, recursive = TRUE)

series <- list(
  AirPassengers = datasets::AirPassengers,
  UKgas = datasets::UKgas,
  nottem = datasets::nottem,
  UKDriverDeaths = datasets::UKDriverDeaths,
  USAccDeaths = datasets::USAccDeaths,
  ldeaths = datasets::ldeaths,
  mdeaths = datasets::mdeaths,
  fdeaths = datasets::fdeaths,
  JohnsonJohnson = datasets::JohnsonJohnson,
  co2 = window(datasets::co2, start = c(1988, 1)),
  austres = datasets::austres,
  wineind = forecast::wineind,
  woolyrnq = forecast::woolyrnq,
  gas = window(forecast::gas, start = c(1981, 1))
)

origin_of <- function(name) {
  if (name %in% c("wineind", "woolyrnq", "gas")) {
    paste0("R package 'forecast' ", packageVersion("forecast"), " (Hyndman et al.), dataset ", name)
  } else {
    paste0("R package 'datasets' ", getRversion(), " (R Core Team), dataset ", name)
  }
}
# a CSV with '#' lines first that name where its numbers come from
write_with_source <- function(df, file, source) {
  lines <- capture.output(write.csv(df, row.names = FALSE))
  writeLines(c(paste("#", source), "# written by src/test/r/reference-forecasts.R", lines), file)
}

rows <- list()
for (name in names(series)) {
  y <- series[[name]]
  f <- frequency(y)
  st <- start(y)
  write_with_source(data.frame(year = floor(time(y) + 1e-9), cycle = cycle(y), value = as.numeric(y)),
                    file.path(out, paste0(name, ".csv")), origin_of(name))
  n <- length(y)
  h <- f
  for (k in 0:3) {
    T <- n - h - (3 - k)
    train <- ts(y[1:T], start = st, frequency = f)
    actual <- as.numeric(y[(T + 1):(T + h)])
    scale <- mean(abs(diff(as.numeric(train), lag = f)))
    fe <- as.numeric(forecast(ets(train), h = h)$mean)
    fa <- as.numeric(forecast(auto.arima(train), h = h)$mean)
    ft <- as.numeric(thetaf(train, h = h)$mean)
    fc <- (fe + fa + ft) / 3
    for (m in list(list("ets", fe), list("auto.arima", fa), list("thetaf", ft), list("mean3", fc))) {
      rows[[length(rows) + 1]] <- data.frame(series = name, frequency = f, origin = T, method = m[[1]],
                                             mase = mean(abs(actual - m[[2]])) / scale)
    }
  }
}
write_with_source(do.call(rbind, rows), file.path(out, "reference-mase.csv"),
                  paste0("MASE of ets(), auto.arima(), thetaf() and their mean from R package 'forecast' ",
                         packageVersion("forecast"), " (Hyndman & Khandakar 2008, J. Stat. Softw. 27(3)) on R ",
                         getRversion(), " (Debian bookworm), 4 rolling origins per series, h = one season"))
