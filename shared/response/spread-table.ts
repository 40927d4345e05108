/**
 * Tabulated vessel response for long series (docs/domain.md#vessel-response, "for speed"): the
 * direction-spread squared RAO
 *   H2(T, theta) = sum over direction bins b of D_b |RAO(T, theta + offset_b)|^2
 * depends on the wave period T and the partition's mean relative direction theta only, not on the
 * partition's Hs, Tp or gamma. It is worked once per (vessel table, response, spreading) on a fine
 * grid (the RAO table's period intervals cut to about PERIOD_NODES_WANTED nodes, theta every THETA_STEP_DEG
 * degrees), and a partition's moments are then one sum over the frequency grid of the JONSWAP
 * weights times H2 interpolated bilinearly: about a hundredth of the direct integration's work.
 * A test holds the interpolation error below 0.5 % of m0 against the direct integration of
 * response.ts, as docs/domain.md#vessel-response requires of a tabulation.
 */
import { GRID_POINTS, GRID_X, jonswapWeights } from './jonswap';
import { headingPosition, type PreparedRao } from './rao';
import { partitionGamma, responseMoments, type ResponseMoments, type ResponseSeaSettings, type SeaPartition } from './response';
import { spreadingBins, type Spreading } from './spreading';

/**
 * Fine period nodes wanted over the table (|RAO|^2 is quadratic between the table's points, so each
 * interval is cut in steps: 8 for a 40-period table, 1 for a table already finer than this).
 */
const PERIOD_NODES_WANTED = 320;
/** Step of the mean relative direction, deg. */
const THETA_STEP_DEG = 1;
const THETA_NODES = 360 / THETA_STEP_DEG + 1;

/** H2 on the fine grid: [thetaIndex * periodNodes + periodNode]. */
interface SpreadTable {
  /** Sub-intervals per interval of the table's periods. */
  steps: number;
  periodNodes: number;
  values: Float64Array;
}

const tables = new WeakMap<PreparedRao, Map<string, SpreadTable>>();

/** The spread table of one response and spreading of a prepared RAO table (worked on first use). */
function spreadTable(rao: PreparedRao, name: string, spreading: Spreading): SpreadTable {
  let perRao = tables.get(rao);
  if (!perRao) tables.set(rao, (perRao = new Map()));
  const key = `${name}|${spreading}`;
  const hit = perRao.get(key);
  if (hit) return hit;
  const amp = rao.amplitudes[name];
  const np = rao.periods.length;
  const steps = Math.max(1, Math.ceil(PERIOD_NODES_WANTED / (np - 1)));
  const periodNodes = (np - 1) * steps + 1;
  const bins = spreadingBins(spreading);
  const values = new Float64Array(THETA_NODES * periodNodes);
  const pos = new Float64Array(2);
  for (let t = 0; t < THETA_NODES; t++) {
    const row = t * periodNodes;
    for (let b = 0; b < bins.weights.length; b++) {
      headingPosition(rao, t * THETA_STEP_DEG + bins.offsetsDeg[b], pos);
      const rowA = pos[0] * np;
      const rowB = rowA + np;
      const fh = pos[1];
      const db = bins.weights[b];
      for (let q = 0; q < periodNodes; q++) {
        // The same interpolation as the direct integration: linear in period, then in heading.
        const i = Math.min(np - 2, Math.floor(q / steps));
        const fp = (q - i * steps) / steps;
        const low = amp[rowA + i] + (amp[rowA + i + 1] - amp[rowA + i]) * fp;
        const high = amp[rowB + i] + (amp[rowB + i + 1] - amp[rowB + i]) * fp;
        const r = low + (high - low) * fh;
        values[row + q] += db * r * r;
      }
    }
  }
  const table = { steps, periodNodes, values };
  perRao.set(key, table);
  return table;
}

const Q_IDX = new Int32Array(GRID_POINTS);
const Q_FRAC = new Float64Array(GRID_POINTS);
const Q_OUT = new Uint8Array(GRID_POINTS);
const ONE: ResponseMoments = { m0: 0, m2: 0, m0Outside: 0 };

/**
 * Moments m0, m2 of one response to a list of partitions, as {@link responseMoments} gives them,
 * from the spread tables (interpolation error below 0.5 % of m0, tested). `out` is filled and returned.
 */
export function tabulatedResponseMoments(
  rao: PreparedRao,
  name: string,
  vesselHeadingDeg: number,
  partitions: readonly SeaPartition[],
  settings: ResponseSeaSettings,
  out: ResponseMoments = { m0: 0, m2: 0, m0Outside: 0 },
): ResponseMoments {
  if (!rao.amplitudes[name]) throw new RangeError(`the vessel has no RAO for ${name}`);
  const periods = rao.periods;
  const np = periods.length;
  // A table of one period has nothing to interpolate in period: integrate directly.
  if (np < 2) return responseMoments(rao, name, vesselHeadingDeg, partitions, settings, out);
  const pFirst = periods[0];
  const pLast = periods[np - 1];
  let m0 = 0;
  let m2 = 0;
  let outside = 0;
  for (const p of partitions) {
    const hs = p.hsM;
    if (hs === 0) continue;
    const gamma = partitionGamma(p, settings);
    if (!(hs > 0) || !(p.tpS > 0) || p.dirDeg !== p.dirDeg || gamma !== gamma) {
      out.m0 = NaN;
      out.m2 = NaN;
      out.m0Outside = NaN;
      return out;
    }
    const spreading = p.kind === 'swell' ? settings.swellSpreading : settings.windSeaSpreading;
    if (spreading === 'long-crested') {
      // One direction: the direct integration is as cheap as a table, and exact (|RAO|^2 is
      // quadratic in heading near its zeros, where a linear table would be 4 % out at 1 deg).
      const one = responseMoments(rao, name, vesselHeadingDeg, [p], settings, ONE);
      m0 += one.m0;
      m2 += one.m2;
      outside += one.m0Outside;
      continue;
    }
    const table = spreadTable(rao, name, spreading);
    const weights = jonswapWeights(gamma);
    // Fine period node of every grid point (held at the table's ends, as the direct integration).
    for (let j = 0; j < GRID_POINTS; j++) {
      const T = p.tpS / GRID_X[j];
      if (T <= pFirst || T >= pLast) {
        Q_IDX[j] = T <= pFirst ? 0 : table.periodNodes - 1;
        Q_FRAC[j] = 0;
        Q_OUT[j] = T < pFirst || T > pLast ? 1 : 0;
      } else {
        let lo = 0;
        let hi = np - 1;
        while (hi - lo > 1) {
          const mid = (lo + hi) >> 1;
          if (periods[mid] <= T) lo = mid;
          else hi = mid;
        }
        const q = (lo + (T - periods[lo]) / (periods[hi] - periods[lo])) * table.steps;
        const qi = Math.min(table.periodNodes - 2, Math.floor(q));
        Q_IDX[j] = qi;
        Q_FRAC[j] = q - qi;
        Q_OUT[j] = 0;
      }
    }
    let theta = (p.dirDeg - vesselHeadingDeg) % 360;
    if (theta < 0) theta += 360;
    const ti = Math.min(THETA_NODES - 2, Math.floor(theta / THETA_STEP_DEG));
    const ft = theta / THETA_STEP_DEG - ti;
    const rowA = ti * table.periodNodes;
    const rowB = rowA + table.periodNodes;
    const v = table.values;
    let a0 = 0;
    let a2 = 0;
    let ao = 0;
    for (let j = 0; j < GRID_POINTS; j++) {
      const q = Q_IDX[j];
      const fq = Q_FRAC[j];
      const q1 = fq > 0 ? q + 1 : q;
      const low = v[rowA + q] + (v[rowA + q1] - v[rowA + q]) * fq;
      const high = v[rowB + q] + (v[rowB + q1] - v[rowB + q]) * fq;
      const e = weights[j] * (low + (high - low) * ft);
      const x = GRID_X[j];
      a0 += e;
      a2 += e * x * x;
      if (Q_OUT[j]) ao += e;
    }
    const wp = (2 * Math.PI) / p.tpS;
    const h2 = hs * hs;
    m0 += h2 * a0;
    m2 += h2 * a2 * wp * wp;
    outside += h2 * ao;
  }
  out.m0 = m0;
  out.m2 = m2;
  out.m0Outside = outside;
  return out;
}
