/** The part of jstat (a general-purpose statistics library) that Lullwatch calls. */
declare module 'jstat' {
  export const jStat: {
    normal: {
      /** Quantile (inverse CDF) of the normal distribution with mean and standard deviation. */
      inv(p: number, mean: number, std: number): number;
    };
  };
}
