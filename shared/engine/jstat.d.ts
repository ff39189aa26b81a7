// Minimal typings for the parts of jstat 1.9 the engine and its tests use (the package ships none).
declare module 'jstat' {
  interface ContinuousDistribution {
    cdf(x: number, ...params: number[]): number
    inv(p: number, ...params: number[]): number
    pdf(x: number, ...params: number[]): number
  }
  interface JStatStatic {
    beta: ContinuousDistribution & { mean(alpha: number, beta: number): number; variance(alpha: number, beta: number): number }
    gamma: ContinuousDistribution
    chisquare: ContinuousDistribution
    lognormal: ContinuousDistribution
    normal: ContinuousDistribution
    poisson: { cdf(k: number, mean: number): number; pdf(k: number, mean: number): number }
  }
  const jStat: JStatStatic
  export default jStat
}
