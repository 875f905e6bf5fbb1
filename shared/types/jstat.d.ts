/**
 * Minimal type declarations for jstat 1.9.x (the package ships none). Only the functions Ringlet
 * uses are declared; extend append-only when you use another one.
 * API as in the jStat documentation (jstat.github.io/all.html) and node_modules/jstat/dist/jstat.js.
 */
declare module 'jstat' {
  interface JStatContinuousDistribution2 {
    pdf(x: number, a: number, b: number): number;
    cdf(x: number, a: number, b: number): number;
    inv(p: number, a: number, b: number): number;
  }
  interface JStatContinuousDistribution1 {
    pdf(x: number, a: number): number;
    cdf(x: number, a: number): number;
    inv(p: number, a: number): number;
  }
  interface JStatStatic {
    /** Student t: cdf(x, dof), inv(p, dof). */
    studentt: JStatContinuousDistribution1;
    /** Fisher F: cdf(x, df1, df2), inv(p, df1, df2). */
    centralF: JStatContinuousDistribution2;
    /** Chi-squared: cdf(x, dof), inv(p, dof). */
    chisquare: JStatContinuousDistribution1;
    /** Normal: cdf(x, mean, sd), inv(p, mean, sd). */
    normal: JStatContinuousDistribution2;
    /** Inverse of the regularised incomplete beta function I_x(a, b). */
    ibetainv(p: number, a: number, b: number): number;
    /** Regularised incomplete beta function I_x(a, b). */
    ibeta(x: number, a: number, b: number): number;
    jStat: JStatStatic;
  }
  const jStat: JStatStatic;
  export { jStat };
  export default jStat;
}
