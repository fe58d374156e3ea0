// jstat ships no types; tests use it only as an independent reference for quantiles.
declare module 'jstat' {
  const jStat: {
    beta: { inv(p: number, a: number, b: number): number };
    chisquare: { inv(p: number, dof: number): number; cdf(x: number, dof: number): number };
  };
  export default jStat;
}
