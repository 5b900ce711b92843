# Regenerates the censored lifetime data sets in this folder and what R's survival package
# (survreg, T. Therneau) fits to them. Run from the project root: `npm run oracle:survreg`.
# Each data set: lives cut in one material each, on cutter types with a rated life (× a life
# scale after a regrind), ending by wear (event 1) or censored (event 0: still running, broken,
# lost). The lifetime model then is the lognormal accelerated-failure-time regression
#   log(time) = log(rated) + log(ratio[type]) - log(factor[material]) + scale * e,  e ~ N(0, 1)
# with the reference material (factor 1) as the first level.
suppressMessages(library(survival))

write_case <- function(name, seed, n, factors, ratios, rated, sigma, censor_share) {
  set.seed(seed)
  material <- sample(names(factors), n, replace = TRUE)
  type <- sample(names(ratios), n, replace = TRUE)
  scale_of_life <- ifelse(runif(n) < 0.3, 0.8, 1)
  life <- rated[type] * scale_of_life
  wear_out <- life * ratios[type] / factors[material] * exp(sigma * rnorm(n))
  # Censoring at a random point of an exponential span: some lives end before they wear out.
  censor_at <- life * rexp(n, rate = censor_share) * 1.5
  time <- round(pmin(wear_out, censor_at), 3)
  event <- as.integer(wear_out <= censor_at)
  d <- data.frame(time = time, event = event, material = material, type = type, rated = life)
  write.csv(d, file.path(dir, paste0(name, ".csv")), row.names = FALSE, quote = FALSE)

  d$material <- factor(d$material, levels = names(factors))
  d$type <- factor(d$type, levels = names(ratios))
  # One type: its log ratio is the intercept.
  form <- if (length(ratios) > 1) Surv(time, event) ~ 0 + type + material + offset(log(rated)) else Surv(time, event) ~ material + offset(log(rated))
  fit <- survreg(form, data = d, dist = "lognormal")
  beta <- coef(fit)
  se <- sqrt(diag(vcov(fit)))[names(beta)]
  names(beta)[names(beta) == "(Intercept)"] <- paste0("type", names(ratios)[1])
  names(se) <- names(beta)
  out <- c(
    "{",
    sprintf('  "n": %d, "events": %d,', nrow(d), sum(d$event)),
    sprintf('  "coefficients": {%s},', paste(sprintf('"%s": %.10g', names(beta), beta), collapse = ", ")),
    sprintf('  "se": {%s},', paste(sprintf('"%s": %.10g', names(se), se), collapse = ", ")),
    sprintf('  "scale": %.10g,', fit$scale),
    sprintf('  "logScaleSe": %.10g,', sqrt(vcov(fit)["Log(scale)", "Log(scale)"])),
    sprintf('  "loglik": %.10g,', fit$loglik[2]),
    sprintf('  "survival": "%s"', as.character(packageVersion("survival"))),
    "}"
  )
  writeLines(out, file.path(dir, paste0(name, ".survreg.json")))
}

dir <- "tests/unit/oracle/survreg"
write_case("three-materials-two-types", 21, 300,
  factors = c(MDF = 1, HDPE = 0.55, ACP = 1.7), ratios = c(T1 = 0.8, T2 = 1.1),
  rated = c(T1 = 600, T2 = 1200), sigma = 0.4, censor_share = 0.5)
write_case("four-materials-heavy-censoring", 22, 160,
  factors = c(MDF = 1, Acrylic = 0.9, Plywood = 1.3, Aluminium = 2.6), ratios = c(T1 = 0.7),
  rated = c(T1 = 1800), sigma = 0.6, censor_share = 1.2)
write_case("two-materials-small", 23, 40,
  factors = c(MDF = 1, HDPE = 0.6), ratios = c(T1 = 1), rated = c(T1 = 900), sigma = 0.3, censor_share = 0.4)
