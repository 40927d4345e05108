/** Every response of a vessel to one sea state, with spectra for plots (the wave calculator's response panel). */
import { GRID_X_MAX, GRID_X_MIN } from './jonswap';
import { prepareRao, responseLabel, responseUnit, type RaoTable } from './rao';
import {
  mostProbableMaximum,
  OUTSIDE_SHARE_WARNING,
  responseMoments,
  responseSpectrum,
  significantAmplitude,
  zeroCrossingPeriod,
  type ResponseSeaSettings,
  type SeaPartition,
} from './response';

export interface ResponseSummary {
  response: string;
  label: string;
  unit: string;
  /** R_s = 2 sqrt(m0), in the response's unit. */
  significant: number;
  /** R_mpm over 3 h. */
  mpm3h: number;
  /** Tz of the response, s (null when the response is zero). */
  tz: number | null;
  m0: number;
  m2: number;
  /** Share of m0 from periods outside the RAO table (end values held there). */
  outsideShare: number;
  warning: string | null;
  /** S_R(omega) on the summary's omega grid, unit^2 s/rad. */
  spectrum: number[];
}

export interface VesselResponseSummary {
  /** Angular frequencies of the spectra, rad/s. */
  omega: number[];
  /** The sea's spectrum S(omega), m^2 s/rad (all partitions). */
  waveSpectrum: number[];
  responses: ResponseSummary[];
}

const PLOT_POINTS = 200;

/** Every response of the table to the partitions at a vessel heading (deg true). */
export function summariseResponse(
  table: RaoTable,
  vesselHeadingDeg: number,
  partitions: readonly SeaPartition[],
  settings: ResponseSeaSettings,
): VesselResponseSummary {
  const rao = prepareRao(table);
  const live = partitions.filter((p) => p.hsM > 0 && p.tpS > 0);
  const wps = live.map((p) => (2 * Math.PI) / p.tpS);
  const lo = wps.length ? GRID_X_MIN * Math.min(...wps) : 0.1;
  const hi = wps.length ? Math.min(GRID_X_MAX * Math.max(...wps), 4 * Math.max(...wps)) : 3;
  const omega = new Float64Array(PLOT_POINTS);
  for (let q = 0; q < PLOT_POINTS; q++) omega[q] = lo + ((hi - lo) * q) / (PLOT_POINTS - 1);
  let wave: Float64Array = new Float64Array(PLOT_POINTS);
  const responses = rao.names.map((name): ResponseSummary => {
    const m = responseMoments(rao, name, vesselHeadingDeg, partitions, settings);
    const spec = responseSpectrum(rao, name, vesselHeadingDeg, partitions, settings, omega);
    wave = spec.wave;
    const share = m.m0 > 0 ? m.m0Outside / m.m0 : 0;
    const tz = zeroCrossingPeriod(m.m0, m.m2);
    return {
      response: name,
      label: responseLabel(name),
      unit: responseUnit(name),
      significant: significantAmplitude(m.m0),
      mpm3h: mostProbableMaximum(m.m0, m.m2, 3),
      tz: Number.isFinite(tz) ? tz : null,
      m0: m.m0,
      m2: m.m2,
      outsideShare: share,
      warning:
        share > OUTSIDE_SHARE_WARNING
          ? `${(share * 100).toFixed(1)} % of this response comes from periods outside the RAO table (${table.periodsS[0]}-${table.periodsS[table.periodsS.length - 1]} s), where its end values are held`
          : null,
      spectrum: Array.from(spec.response),
    };
  });
  return { omega: Array.from(omega), waveSpectrum: Array.from(wave), responses };
}
