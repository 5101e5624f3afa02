/** Minimal typing of the parts of jstat the core uses (jstat ships no types). */
declare module 'jstat' {
  interface Dist1 { cdf(x: number, ...p: number[]): number; pdf(x: number, ...p: number[]): number; inv(p: number, ...q: number[]): number }
  export const jStat: {
    normal: Dist1;
    studentt: Dist1;
    centralF: Dist1;
    chisquare: Dist1;
    beta: Dist1;
    gammaln(x: number): number;
    ibeta(x: number, a: number, b: number): number;
    ibetainv(p: number, a: number, b: number): number;
    gammap(a: number, x: number): number;
    erfc(x: number): number;
    erf(x: number): number;
    corrcoeff(a: number[], b: number[]): number;
    spearmancoeff(a: number[], b: number[]): number;
  };
}
