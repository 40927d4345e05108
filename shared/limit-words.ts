/** A limit named in words, as crews read it in alerts and e-mails. */
const LIMIT_WORDS: Record<string, string> = {
  hs: 'wave height (Hs)',
  hsTpCurve: 'the Hs–Tp limit curve',
  tpMin: 'a peak period below the minimum',
  tpMax: 'a peak period above the maximum',
  tpBand: 'a peak period in an excluded band',
  bedVelocity: 'near-bed orbital velocity',
  wind: 'wind speed',
  minDepth: 'too little water (below the minimum depth)',
  maxDepth: 'too much water (above the maximum depth)',
  current: 'current speed',
  tideWindow: 'outside the tide window',
  hsTarget: 'wave height of a sea partition (swell or wind sea)',
  noData: 'missing sea data',
};

export const limitWords = (name: string | null | undefined) => (name ? (LIMIT_WORDS[name] ?? name) : null);
