# Reference values from R's stats::cor.test(method = "kendall") on R's built-in open datasets.
# Run once with Debian's r-base-core:  /usr/bin/Rscript test/reference/make-r-reference.R
# Writes test/reference/datasets.json (the series) and test/reference/r-kendall.json (the values).
# The tests read these files; they never call R.
num <- function(x) sprintf("%.17g", x)
arr <- function(x) paste0("[", paste(num(x), collapse = ","), "]")
series <- list(
  Nile = list(t = as.numeric(time(Nile)), y = as.numeric(Nile)),
  LakeHuron = list(t = as.numeric(time(LakeHuron)), y = as.numeric(LakeHuron)),
  nottem = list(t = as.numeric(time(nottem)), y = as.numeric(nottem), season = as.numeric(cycle(nottem))),
  co2 = list(t = as.numeric(time(co2)), y = as.numeric(co2), season = as.numeric(cycle(co2)))
)
# A short tied series: Nile rounded to hundreds, first 30 years (ties in value)
series$NileHundreds <- list(t = series$Nile$t[1:30], y = round(series$Nile$y[1:30] / 100) * 100)
dataset_json <- c()
result_json <- c()
for (name in names(series)) {
  s <- series[[name]]
  fields <- c(sprintf('"t":%s', arr(s$t)), sprintf('"y":%s', arr(s$y)))
  if (!is.null(s$season)) fields <- c(fields, sprintf('"season":%s', arr(s$season)))
  dataset_json <- c(dataset_json, sprintf('"%s":{%s}', name, paste(fields, collapse = ",")))
  plain <- suppressWarnings(cor.test(s$t, s$y, method = "kendall", exact = FALSE, continuity = FALSE))
  corrected <- suppressWarnings(cor.test(s$t, s$y, method = "kendall", exact = FALSE, continuity = TRUE))
  result_json <- c(result_json, sprintf('"%s":{"tau":%s,"z":%s,"p":%s,"zContinuity":%s,"pContinuity":%s}',
    name, num(plain$estimate), num(plain$statistic), num(plain$p.value), num(corrected$statistic), num(corrected$p.value)))
}
# Exact p for a short series without ties: first 9 values of LakeHuron (R uses the exact
# distribution when n < 50 and there are no ties).
lh9 <- series$LakeHuron$y[1:9]
exact <- cor.test(1:9, lh9, method = "kendall", exact = TRUE)
result_json <- c(result_json, sprintf('"LakeHuron9Exact":{"y":%s,"tau":%s,"p":%s}', arr(lh9), num(exact$estimate), num(exact$p.value)))
version_line <- sprintf('"_source":"%s, stats::cor.test(method = \\"kendall\\")"', R.version.string)
writeLines(paste0("{", paste(c(version_line, dataset_json), collapse = ",\n"), "}"), "test/reference/datasets.json")
writeLines(paste0("{", paste(c(version_line, result_json), collapse = ",\n"), "}"), "test/reference/r-kendall.json")
