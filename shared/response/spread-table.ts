/**
 * Direction-spread squared RAO for the moment tables (docs/domain.md#vessel-response, "for speed"):
 *   H2(T, theta) = sum over direction bins b of D_b |RAO(T, theta + offset_b)|^2
 * depends on the wave period T and the partition's mean relative direction theta only, not on the
 * partition's Hs, Tp or gamma. It is kept per (vessel table, response, spreading) on a fine grid
 * (the RAO table's period intervals cut to about PERIOD_NODES_WANTED nodes, theta every
 * THETA_STEP_DEG degrees), a theta row worked on first use. moment-table.ts sums it against the
 * JONSWAP weights at its nodes; the tests hold the result within 0.5 % of the direct integration
 * of response.ts, as docs/domain.md#vessel-response requires of a tabulation.
 */
import { GRID_POINTS, GRID_X } from './jonswap';
import { headingPosition, periodSegment, type PreparedRao } from './rao';
import { spreadingBins, type Spreading } from './spreading';

/**
 * Fine period nodes wanted over the table (|RAO|^2 is quadratic between the table's points, so each
 * interval is cut in steps: 8 for a 40-period table, 1 for a table already finer than this).
 */
const PERIOD_NODES_WANTED = 320;
/** Step of the mean relative direction, deg. */
const THETA_STEP_DEG = 1;
const THETA_NODES = 360 / THETA_STEP_DEG + 1;

/** H2 on the fine grid: [thetaIndex * periodNodes + periodNode]; a theta row is worked on first use. */
export interface SpreadTable {
  rao: PreparedRao;
  amp: Float64Array;
  spreading: Spreading;
  /** Sub-intervals per interval of the table's periods. */
  steps: number;
  periodNodes: number;
  values: Float64Array;
  /** 1 for a theta row worked. */
  worked: Uint8Array;
}

const tables = new WeakMap<PreparedRao, Map<string, SpreadTable>>();

/**
 * The spread table of one response and spreading of a prepared RAO table (rows worked on first
 * use). A moment table keeps it, so that its nodes need no lookup by name.
 */
export function spreadTableOf(rao: PreparedRao, name: string, spreading: Spreading): SpreadTable {
  let perRao = tables.get(rao);
  if (!perRao) tables.set(rao, (perRao = new Map()));
  const key = `${name}|${spreading}`;
  const hit = perRao.get(key);
  if (hit) return hit;
  const np = rao.periods.length;
  const steps = Math.max(1, Math.ceil(PERIOD_NODES_WANTED / (np - 1)));
  const periodNodes = (np - 1) * steps + 1;
  const table: SpreadTable = {
    rao,
    amp: rao.amplitudes[name],
    spreading,
    steps,
    periodNodes,
    values: new Float64Array(THETA_NODES * periodNodes),
    worked: new Uint8Array(THETA_NODES),
  };
  perRao.set(key, table);
  return table;
}

const POS = new Float64Array(2);

/** Works theta row t of the table if not yet worked; returns the row's offset in `values`. */
function spreadRow(table: SpreadTable, t: number): number {
  const row = t * table.periodNodes;
  if (table.worked[t]) return row;
  const rao = table.rao;
  const np = rao.periods.length;
  const bins = spreadingBins(table.spreading);
  for (let b = 0; b < bins.weights.length; b++) {
    headingPosition(rao, t * THETA_STEP_DEG + bins.offsetsDeg[b], POS);
    addBin(table.values, row, table.amp, POS[0] * np, np, POS[1], bins.weights[b], table.steps, table.periodNodes);
  }
  table.worked[t] = 1;
  return row;
}

/**
 * Adds one direction bin (weight db) to a theta row: |RAO|^2 on the fine period nodes, the same
 * interpolation as the direct integration (linear in period, then in heading between the RAO
 * rows at rowA and rowA + np, fraction fh). Apart from spreadRow so that the optimiser compiles
 * this loop once, on typed arrays and numbers only.
 */
function addBin(
  values: Float64Array,
  row: number,
  amp: Float64Array,
  rowA: number,
  np: number,
  fh: number,
  db: number,
  steps: number,
  periodNodes: number,
): void {
  const rowB = rowA + np;
  for (let q = 0; q < periodNodes; q++) {
    const i = Math.min(np - 2, Math.floor(q / steps));
    const fp = (q - i * steps) / steps;
    const low = amp[rowA + i] + (amp[rowA + i + 1] - amp[rowA + i]) * fp;
    const high = amp[rowB + i] + (amp[rowB + i + 1] - amp[rowB + i]) * fp;
    const r = low + (high - low) * fh;
    values[row + q] += db * r * r;
  }
}

/**
 * Positions of the frequency grid's periods T_j = Tp / x_j for one partition peak period on the
 * spread table's fine period nodes (node index plus fraction), held at the table's ends as the
 * direct integration holds the RAO: the same for every theta row, so worked once per Tp.
 */
export function spreadPositions(table: SpreadTable, tpS: number, q: Float64Array): void {
  positionsOnNodes(table.rao.periods, table.periodNodes, table.steps, tpS, q);
}

/**
 * The loop of {@link spreadPositions}, on typed arrays and numbers only: optimised once, and not
 * thrown away when the optimiser drops its caller for a new shape of table (measured with
 * --trace-deopt: the tables' building functions were dropped two or three times in a cold run).
 */
function positionsOnNodes(periods: Float64Array, periodNodes: number, steps: number, tpS: number, q: Float64Array): void {
  const np = periods.length;
  const pFirst = periods[0];
  const pLast = periods[np - 1];
  for (let j = 0; j < GRID_POINTS; j++) {
    const T = tpS / GRID_X[j];
    if (T <= pFirst || T >= pLast) {
      q[j] = T <= pFirst ? 0 : periodNodes - 1;
      continue;
    }
    const lo = periodSegment(periods, T);
    q[j] = (lo + (T - periods[lo]) / (periods[lo + 1] - periods[lo])) * steps;
  }
}

/**
 * H2 of the spread table at positions `q` ({@link spreadPositions}) for a whole degree of relative
 * direction (a row of the table: no interpolation in theta), linear between the fine period nodes.
 */
export function spreadAtGrid(table: SpreadTable, thetaDeg: number, q: Float64Array, h2: Float64Array): void {
  if (!Number.isInteger(thetaDeg / THETA_STEP_DEG) || thetaDeg < 0 || thetaDeg >= 360)
    throw new RangeError(`relative direction ${thetaDeg} must be a whole row of the spread table (0-359 deg)`);
  rowAtPositions(table.values, spreadRow(table, thetaDeg / THETA_STEP_DEG), table.periodNodes - 2, q, h2);
}

/** The loop of {@link spreadAtGrid}, on typed arrays and numbers only (as {@link positionsOnNodes}). */
function rowAtPositions(v: Float64Array, row: number, lastLow: number, q: Float64Array, h2: Float64Array): void {
  for (let j = 0; j < GRID_POINTS; j++) {
    const qj = q[j];
    const qi = Math.min(lastLow, Math.floor(qj));
    const a = v[row + qi];
    h2[j] = a + (v[row + qi + 1] - a) * (qj - qi);
  }
}

/**
 * H2 at the RAO table's first and last period for a mean relative direction (linear between the
 * table's theta rows) into `out` [first, last]: the values the direct integration holds beyond the
 * table's periods.
 */
export function spreadAtPeriodEnds(table: SpreadTable, thetaDeg: number, out: Float64Array): void {
  let theta = thetaDeg % 360;
  if (theta < 0) theta += 360;
  const ti = Math.min(THETA_NODES - 2, Math.floor(theta / THETA_STEP_DEG));
  const ft = theta / THETA_STEP_DEG - ti;
  const rowA = spreadRow(table, ti);
  const rowB = spreadRow(table, ti + 1);
  const v = table.values;
  const last = table.periodNodes - 1;
  out[0] = v[rowA] + (v[rowB] - v[rowA]) * ft;
  out[1] = v[rowA + last] + (v[rowB + last] - v[rowA + last]) * ft;
}
