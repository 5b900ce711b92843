// The small part of jStat that Kerfbook uses (the package ships no types).
declare module 'jstat' {
  const jstat: {
    jStat: {
      normal: {
        /** Quantile (inverse CDF) of the normal distribution. */
        inv(p: number, mean: number, std: number): number
        /** Cumulative distribution function of the normal distribution. */
        cdf(x: number, mean: number, std: number): number
      }
      poisson: {
        /** P(X ≤ k) for a Poisson distribution with mean λ (used by tests as an outside check). */
        cdf(k: number, lambda: number): number
      }
    }
  }
  export default jstat
}
