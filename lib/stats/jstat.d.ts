// Minimal typings for the parts of jstat 1.9.6 that Tareline uses (the package ships none).
declare module "jstat" {
  interface JStatStudentT {
    cdf(x: number, dof: number): number;
    inv(p: number, dof: number): number;
  }
  interface JStatCentralF {
    cdf(x: number, df1: number, df2: number): number;
    inv(p: number, df1: number, df2: number): number;
  }
  interface JStatNormal {
    inv(p: number, mean: number, sd: number): number;
  }
  interface JStat {
    studentt: JStatStudentT;
    /** The normal distribution (the normal probability plot's scores, lib/results/diagnostic-plots.ts). */
    normal: JStatNormal;
    centralF: JStatCentralF;
    /** Regularised incomplete beta function I_x(a, b). */
    ibeta(x: number, a: number, b: number): number;
  }
  const jStat: JStat;
  export default jStat;
}
