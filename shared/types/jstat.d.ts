// The small part of jStat that Kerfbook uses (the package ships no types).
declare module 'jstat' {
  const jstat: {
    jStat: {
      normal: {
        /** Quantile (inverse CDF) of the normal distribution. */
        inv(p: number, mean: number, std: number): number
      }
    }
  }
  export default jstat
}
