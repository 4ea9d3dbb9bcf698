// Minimal types for the parts of jstat (dev-dependency oracle) that the tests and benchmark use.
declare module 'jstat' {
  interface JStatDistribution1 {
    cdf(x: number, df: number): number;
    inv(p: number, df: number): number;
  }
  interface JStat {
    normal: {
      cdf(x: number, mean: number, sd: number): number;
      inv(p: number, mean: number, sd: number): number;
    };
    studentt: JStatDistribution1;
    chisquare: JStatDistribution1;
    centralF: {
      cdf(x: number, df1: number, df2: number): number;
      inv(p: number, df1: number, df2: number): number;
    };
    median(values: number[]): number;
    ibeta(x: number, a: number, b: number): number;
    gammap(a: number, x: number): number;
  }
  const jStat: JStat;
  export default jStat;
}
