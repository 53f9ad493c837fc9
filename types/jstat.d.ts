// jstat ships no types; only the parts Hilum's tests call are declared here (it is a test-only reference
// library: production code under server/ does not import it).
declare module 'jstat' {
  interface Dist {
    cdf(x: number, ...params: number[]): number;
    pdf(x: number, ...params: number[]): number;
    inv(p: number, ...params: number[]): number;
  }
  export const jStat: {
    beta: Dist;
    normal: Dist;
    chisquare: Dist;
    studentt: Dist;
    binomial: { pdf(k: number, n: number, p: number): number; cdf(k: number, n: number, p: number): number };
    ibeta(x: number, a: number, b: number): number;
    ibetainv(p: number, a: number, b: number): number;
    combinationln(n: number, k: number): number;
    betaln(a: number, b: number): number;
  };
  const _default: typeof jStat;
  export default _default;
}
