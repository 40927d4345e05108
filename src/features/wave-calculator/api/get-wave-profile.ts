import { calculatorQuery, waveQueryString } from './calculator-query';

/** One point of GET /api/wave/profile: elevation z (m), amplitudes u, w (m/s), Kp (dimensionless). */
export interface WaveProfilePoint {
  z: number;
  u: number;
  w: number;
  kp: number;
}

/** Inputs of the profile: T (s), H (m), d (m). */
export interface WaveProfileQuery {
  period: number;
  height: number;
  depth: number;
}

/** u(z), w(z), Kp(z) from the bed (or z = -L/2 in deep water) up to still water level. */
export const waveProfileQuery = calculatorQuery<WaveProfileQuery, WaveProfilePoint[]>('profile', (q) =>
  waveQueryString({ period: q.period, height: q.height, depth: q.depth }),
);
export const useWaveProfile = waveProfileQuery.use;
