/** The part of jstat (a general-purpose statistics library, CommonJS: one default export) that Lullwatch calls. */
declare module 'jstat' {
  const jstat: {
    normal: {
      /** Quantile (inverse CDF) of the normal distribution with mean and standard deviation. */
      inv(p: number, mean: number, std: number): number;
    };
  };
  export default jstat;
}
