/**
 * Per-unit-Hs moment tables for long series (docs/domain.md#vessel-response, "for speed").
 *
 * For one partition of Hs, peak period Tp, mean relative direction theta and JONSWAP gamma the
 * moments are m0 = Hs^2 a0 and m2 = Hs^2 omega_p^2 a2 with
 *   a0(Tp, theta, gamma) = sum_j w_j(gamma) H2(Tp / x_j, theta),
 *   a2(Tp, theta, gamma) = sum_j w_j(gamma) x_j^2 H2(Tp / x_j, theta),
 * w_j the normalised JONSWAP weights on the grid x_j = omega/omega_p and H2 the direction-spread
 * squared RAO of spread-table.ts. a0 and a2 do not depend on Hs, nor on the vessel's heading
 * (theta is relative), so one table per (RAO table, response, spreading, gamma rule) serves every
 * record and every operation of that vessel. A record then costs a few table reads instead of a
 * sum over the frequency grid.
 *
 * The table (MOMENT_GRID): ln Tp every 0.01 (1 %) from TP_MIN_S to TP_MAX_S, theta every 1 deg
 * all round (360 wraps to 0), bilinear in (ln Tp, theta). Nodes are worked lazily on first use (NaN
 * marks a node not yet worked; a theta row is allocated on first use), since a series touches a
 * small part of the table. Gamma:
 *  - a fixed gamma (swell, or a wind sea of fixed gamma): one layer at that gamma;
 *  - the DNV rule (gamma 1-5): layers at 5 Chebyshev-Lobatto nodes in s = ln gamma over
 *    [0, ln 5] and Lagrange interpolation in s. The unnormalised sums N(s) = sum_j g_j(gamma) H2_j
 *    and S(s) = sum_j g_j(gamma), g_j = w_j x_j^-5 exp(-1.25 x_j^-4) exp(r_j s), are sums of
 *    exponentials in s with rates r_j in [0, 1] (smooth: the polynomial interpolation error of
 *    exp(r s) over an interval of 1.61 with 5 nodes is of order 1e-4; 2.5e-4 measured on a0, a2),
 *    so both are interpolated and
 *    a0 = N / (16 S); with a0_k = N_k / (16 S_k) stored per node that is
 *    a0 = sum_k L_k(s) S_k a0_k / sum_k L_k(s) S_k. At gamma 1 and 5 (both nodes) it is exact.
 *    The coefficients are kept in float32 and the sum divided by their sum.
 * The largest error against the direct integration measured by the tests is 0.2 % (from the
 * steps in ln Tp, which also the record path through the hour chain reads).
 * Long-crested partitions, a table of one period, and a Tp outside TP_MIN_S-TP_MAX_S keep the
 * direct integration (a linear table in theta would be several per cent out near an RAO's zero
 * when the sea is long-crested). Tests hold m0 and m2 within 0.5 % of the direct
 * integration, as docs/domain.md#vessel-response requires of a tabulation.
 */
import { GRID_POINTS, GRID_X, jonswapShapeSum, jonswapWeights } from './jonswap';
import type { PreparedRao } from './rao';
import {
  partitionGamma,
  responseMoments,
  type ResponseMoments,
  type ResponseSeaSettings,
  type SeaPartition,
  type SeaPartitionSeries,
} from './response';
import { spreadAtGrid, spreadAtPeriodEnds, spreadPositions } from './spread-table';
import type { Spreading } from './spreading';

/** Shortest and longest peak period of the tables, s (outside: direct integration). */
export const TP_MIN_S = 1;
export const TP_MAX_S = 40;

/** Resolution of a moment table: step of ln Tp, of theta (whole degrees dividing 360), gamma nodes for the DNV rule. */
export interface MomentGrid {
  lnTpStep: number;
  thetaStepDeg: number;
  gammaNodes: number;
}

/** The engine's grid: ln Tp every 0.01 (1 % in Tp), theta every 1 deg, 5 gamma nodes (tested). */
export const MOMENT_GRID: MomentGrid = { lnTpStep: 0.01, thetaStepDeg: 1, gammaNodes: 5 };

/** Lowest and highest gamma of the DNV rule (docs/domain.md#vessel-response). */
const DNV_GAMMA_MIN = 1;
const DNV_GAMMA_MAX = 5;
/**
 * The rule's largest gamma, just above 3.6 where exp(5.75 - 1.15 r) = 5.003 steps down to 5; read
 * at 5 (the moments move by far less than the tabulation's error over that 0.06 %).
 */
const DNV_RULE_MAX = Math.exp(5.75 - 1.15 * 3.6);

/** Values per node and layer: a0, a2. */
const V = 2;

/** One moment table; see the module comment. */
export interface MomentTable {
  rao: PreparedRao;
  name: string;
  spreading: Spreading;
  grid: MomentGrid;
  tpNodes: number;
  thetaNodes: number;
  /** Per layer: its gamma, normalised weights and unnormalised sum. */
  gammas: Float64Array;
  weights: Float64Array[];
  shapeSums: Float64Array;
  /** ln gamma of the layers and the Lagrange denominators (DNV rule only). */
  lnGammas: Float64Array;
  lagrangeDen: Float64Array;
  /** Per Tp node, the grid periods' positions on the spread table (the same for every theta row). */
  positions: (Float64Array | undefined)[];
  /** Per theta node: [tpNode][layer][a0, a2], NaN until worked. */
  rows: (Float64Array | undefined)[];
  /** Coefficients of the layers for the last gamma asked for. */
  lastGamma: number;
  coef: Float32Array;
  /** The one layer those coefficients pick (1 there, 0 elsewhere), or -1. */
  single: number;
}

/** Builds an empty table (`gamma`: a fixed value, or 'dnv' for layers over 1-5). */
export function createMomentTable(
  rao: PreparedRao,
  name: string,
  spreading: Spreading,
  gamma: number | 'dnv',
  grid: MomentGrid = MOMENT_GRID,
): MomentTable {
  if (!rao.amplitudes[name]) throw new RangeError(`the vessel has no RAO for ${name}`);
  if (!(Number.isInteger(grid.thetaStepDeg) && grid.thetaStepDeg >= 1 && 360 % grid.thetaStepDeg === 0))
    throw new RangeError(`theta step ${grid.thetaStepDeg} must be a whole number of degrees dividing 360`);
  if (!(grid.lnTpStep > 0)) throw new RangeError(`ln Tp step ${grid.lnTpStep} must be above 0`);
  const layers = gamma === 'dnv' ? grid.gammaNodes : 1;
  if (!(Number.isInteger(layers) && layers >= 1)) throw new RangeError(`gamma nodes ${grid.gammaNodes} must be a whole number, at least 1`);
  const gammas = new Float64Array(layers);
  const lnGammas = new Float64Array(layers);
  if (gamma === 'dnv') {
    const lnMax = Math.log(DNV_GAMMA_MAX / DNV_GAMMA_MIN);
    for (let k = 0; k < layers; k++) {
      // Chebyshev-Lobatto nodes (the ends included); one node: the middle.
      const s = layers === 1 ? lnMax / 2 : (lnMax * (1 - Math.cos((Math.PI * k) / (layers - 1)))) / 2;
      lnGammas[k] = k === 0 ? 0 : k === layers - 1 ? lnMax : s;
      gammas[k] = k === 0 && layers > 1 ? DNV_GAMMA_MIN : k === layers - 1 && layers > 1 ? DNV_GAMMA_MAX : DNV_GAMMA_MIN * Math.exp(s);
    }
  } else {
    gammas[0] = gamma;
    lnGammas[0] = Math.log(gamma);
  }
  const lagrangeDen = new Float64Array(layers);
  for (let k = 0; k < layers; k++) {
    let d = 1;
    for (let m = 0; m < layers; m++) if (m !== k) d *= lnGammas[k] - lnGammas[m];
    lagrangeDen[k] = d;
  }
  const tpNodes = Math.floor(Math.log(TP_MAX_S / TP_MIN_S) / grid.lnTpStep) + 1;
  return {
    rao,
    name,
    spreading,
    grid,
    tpNodes,
    thetaNodes: 360 / grid.thetaStepDeg,
    gammas,
    weights: Array.from(gammas, (g) => jonswapWeights(g)),
    shapeSums: Float64Array.from(gammas, (g) => jonswapShapeSum(g)),
    lnGammas,
    lagrangeDen,
    positions: new Array<Float64Array | undefined>(tpNodes),
    rows: new Array<Float64Array | undefined>(360 / grid.thetaStepDeg),
    lastGamma: NaN,
    coef: new Float32Array(layers),
    single: -1,
  };
}

const tables = new WeakMap<PreparedRao, Map<string, MomentTable>>();

/**
 * The engine's moment table for partitions of one kind under the settings (shared per RAO table,
 * response, spreading and gamma rule); null where the direct integration is kept (long-crested,
 * a table of one period).
 */
export function momentTableFor(
  rao: PreparedRao,
  name: string,
  kind: SeaPartition['kind'],
  settings: ResponseSeaSettings,
): MomentTable | null {
  const spreading = kind === 'swell' ? settings.swellSpreading : settings.windSeaSpreading;
  if (spreading === 'long-crested' || rao.periods.length < 2 || !rao.amplitudes[name]) return null;
  const gamma = kind === 'swell' ? settings.swellGamma : settings.windSeaGamma;
  let perRao = tables.get(rao);
  if (!perRao) tables.set(rao, (perRao = new Map()));
  const key = `${name}|${spreading}|${gamma}`;
  let t = perRao.get(key);
  if (!t) perRao.set(key, (t = createMomentTable(rao, name, spreading, gamma)));
  return t;
}

const H2 = new Float64Array(GRID_POINTS);

/** Works node (tp node i, theta node k) of every layer into `row`. */
function workNode(t: MomentTable, row: Float64Array, i: number, k: number): void {
  let q = t.positions[i];
  if (!q) {
    t.positions[i] = q = new Float64Array(GRID_POINTS);
    spreadPositions(t.rao, t.name, t.spreading, TP_MIN_S * Math.exp(i * t.grid.lnTpStep), q);
  }
  spreadAtGrid(t.rao, t.name, t.spreading, k * t.grid.thetaStepDeg, q, H2);
  const layers = t.gammas.length;
  for (let l = 0; l < layers; l++) {
    const w = t.weights[l];
    let a0 = 0;
    let a2 = 0;
    for (let j = 0; j < GRID_POINTS; j++) {
      const e = w[j] * H2[j];
      const x = GRID_X[j];
      a0 += e;
      a2 += e * x * x;
    }
    const o = (i * layers + l) * V;
    row[o] = a0;
    row[o + 1] = a2;
  }
}

function rowOf(t: MomentTable, k: number): Float64Array {
  let row = t.rows[k];
  if (!row) t.rows[k] = row = new Float64Array(t.tpNodes * t.gammas.length * V).fill(NaN);
  return row;
}

/**
 * Layer coefficients of the DNV layers at s = ln(gamma / 1), 0 <= s <= ln 5, into c[at..]: one-hot at
 * a node, else the Lagrange weights times the layers' shape sums, normalised (see the module comment).
 */
function lagrangeInto(t: MomentTable, s: number, c: Float32Array, at: number): number {
  const layers = t.gammas.length;
  const nodes = t.lnGammas;
  let hit = -1;
  for (let k = 0; k < layers; k++) if (s === nodes[k]) hit = k;
  if (hit >= 0) {
    for (let k = 0; k < layers; k++) c[at + k] = k === hit ? 1 : 0;
    return hit;
  }
  let all = 1;
  for (let m = 0; m < layers; m++) all *= s - nodes[m];
  let sum = 0;
  for (let k = 0; k < layers; k++) {
    const v = ((all / (s - nodes[k])) * t.shapeSums[k]) / t.lagrangeDen[k];
    c[at + k] = v;
    sum += v;
  }
  // Single precision (float32 arrays), in the record path as in the series path, which keeps them
  // per record: the rounding, 1e-7 relative, is far below the tabulation's error.
  const inv = 1 / sum;
  for (let k = 0; k < layers; k++) c[at + k] *= inv;
  return -1;
}

/** Layer coefficients for a gamma into t.coef; false when the gamma is outside the layers' range. */
function layerCoefficients(t: MomentTable, gamma: number): boolean {
  if (gamma === t.lastGamma) return true;
  if (t.gammas.length === 1) {
    if (gamma !== t.gammas[0]) return false;
    t.coef[0] = 1;
    t.single = 0;
  } else {
    if (!(gamma >= DNV_GAMMA_MIN && gamma <= DNV_RULE_MAX)) return false;
    const sMax = t.lnGammas[t.gammas.length - 1];
    t.single = lagrangeInto(t, gamma >= DNV_GAMMA_MAX ? sMax : Math.min(sMax, Math.log(gamma / DNV_GAMMA_MIN)), t.coef, 0);
  }
  t.lastGamma = gamma;
  return true;
}

/**
 * Per-unit-Hs moments of one partition from the table into `out` [a0, a2] (m0 = Hs^2 a0,
 * m2 = Hs^2 omega_p^2 a2); false, with `out` untouched, when Tp or gamma is outside the table.
 * `thetaDeg` is the mean relative direction, any real number (taken modulo 360).
 */
export function momentTableLookup(t: MomentTable, tpS: number, thetaDeg: number, gamma: number, out: Float64Array): boolean {
  const u = Math.log(tpS / TP_MIN_S) / t.grid.lnTpStep;
  const i = Math.floor(u);
  if (!(i >= 0 && i < t.tpNodes - 1)) return false;
  if (!layerCoefficients(t, gamma)) return false;
  readTable(t, i, u - i, thetaDeg, t.single, t.coef, 0, out);
  return true;
}

/**
 * Reads the table at Tp node i plus fraction fu and at a relative direction (any real number):
 * bilinear over the four nodes (worked if not yet), of layer `single`, or (single -1) summed over
 * the layers with coefficients coef[at..], into out [a0, a2]. Shared by the record and the series
 * paths.
 */
function readTable(
  t: MomentTable,
  i: number,
  fu: number,
  thetaDeg: number,
  single: number,
  coef: Float32Array | null,
  at: number,
  out: Float64Array,
): void {
  // Directions and headings lie in 0-360 as a rule: one turn added or taken (no remainder, slow).
  let theta = thetaDeg;
  if (theta < 0) theta += 360;
  if (theta >= 360) theta -= 360;
  if (!(theta >= 0 && theta < 360)) theta = ((theta % 360) + 360) % 360;
  const thetaNodes = t.thetaNodes;
  const v = theta / t.grid.thetaStepDeg;
  let k = Math.floor(v);
  const fv = v - k;
  if (k >= thetaNodes) k -= thetaNodes;
  const k1 = k + 1 === thetaNodes ? 0 : k + 1;
  const rowA = t.rows[k] ?? rowOf(t, k);
  const rowB = t.rows[k1] ?? rowOf(t, k1);
  const layers = t.gammas.length;
  const oA = i * layers * V;
  const oB = oA + layers * V;
  if (rowA[oA] !== rowA[oA]) workNode(t, rowA, i, k);
  if (rowA[oB] !== rowA[oB]) workNode(t, rowA, i + 1, k);
  if (rowB[oA] !== rowB[oA]) workNode(t, rowB, i, k1);
  if (rowB[oB] !== rowB[oB]) workNode(t, rowB, i + 1, k1);
  const wAA = (1 - fu) * (1 - fv);
  const wBA = fu * (1 - fv);
  const wAB = (1 - fu) * fv;
  const wBB = fu * fv;
  if (single >= 0 || coef === null) {
    const pA = oA + (single > 0 ? single * V : 0);
    const pB = oB + (single > 0 ? single * V : 0);
    out[0] = wAA * rowA[pA] + wBA * rowA[pB] + wAB * rowB[pA] + wBB * rowB[pB];
    out[1] = wAA * rowA[pA + 1] + wBA * rowA[pB + 1] + wAB * rowB[pA + 1] + wBB * rowB[pB + 1];
    return;
  }
  let a0 = 0;
  let a2 = 0;
  let cs = 0;
  for (let l = 0; l < layers; l++) {
    const cl = coef[at + l];
    if (cl === 0) continue;
    cs += cl;
    const pA = oA + l * V;
    const pB = oB + l * V;
    a0 += cl * (wAA * rowA[pA] + wBA * rowA[pB] + wAB * rowB[pA] + wBB * rowB[pB]);
    a2 += cl * (wAA * rowA[pA + 1] + wBA * rowA[pB + 1] + wAB * rowB[pA + 1] + wBB * rowB[pB + 1]);
  }
  // Divided by the coefficients' sum, which float32 leaves a few 1e-8 off 1 (an RAO of 1 gives
  // m0 = Hs^2/16 exactly again).
  out[0] = a0 / cs;
  out[1] = a2 / cs;
}

const UNIT = new Float64Array(V);
const ONE: ResponseMoments = { m0: 0, m2: 0, m0Outside: 0 };
const ENDS = new Float64Array(2);

/**
 * Per unit Hs^2, the part of a0 from grid periods outside the RAO table's periods, where the
 * direct integration holds the table's end values: the JONSWAP weights of those grid points times
 * H2 at the first (last) period. Worked directly: it jumps as grid points cross the table's ends.
 */
function outsidePerUnit(t: MomentTable, tpS: number, thetaDeg: number, gamma: number): number {
  const periods = t.rao.periods;
  const pFirst = periods[0];
  const pLast = periods[periods.length - 1];
  // T_j = Tp / x_j grows as j falls: short periods at the grid's top, long ones at its bottom.
  if (tpS / GRID_X[GRID_POINTS - 1] >= pFirst && tpS / GRID_X[0] <= pLast) return 0;
  const w = jonswapWeights(gamma);
  let below = 0;
  let above = 0;
  for (let j = 0; j < GRID_POINTS; j++) {
    const T = tpS / GRID_X[j];
    if (T < pFirst) below += w[j];
    else if (T > pLast) above += w[j];
  }
  spreadAtPeriodEnds(t.rao, t.name, t.spreading, thetaDeg, ENDS);
  return below * ENDS[0] + above * ENDS[1];
}

/**
 * Adds one partition's moments to `acc` [m0, m2, m0Outside], from `table` (its kind's table from
 * {@link momentTableFor}, or null) where it covers the partition, else by direct integration.
 * Returns false when the partition makes the record "no data" (a missing Hs, Tp, direction or
 * gamma); a partition of Hs 0 adds nothing. `acc[2]` receives m0Outside only `withOutside`.
 */
export function addPartitionMoments(
  rao: PreparedRao,
  name: string,
  vesselHeadingDeg: number,
  p: SeaPartition,
  settings: ResponseSeaSettings,
  table: MomentTable | null,
  acc: Float64Array,
  withOutside: boolean,
): boolean {
  const hs = p.hsM;
  if (hs === 0) return true;
  const gamma = partitionGamma(p, settings);
  if (!(hs > 0) || !(p.tpS > 0) || p.dirDeg !== p.dirDeg || gamma !== gamma) return false;
  const h2 = hs * hs;
  const theta = p.dirDeg - vesselHeadingDeg;
  if (table && momentTableLookup(table, p.tpS, theta, gamma, UNIT)) {
    const wp = (2 * Math.PI) / p.tpS;
    acc[0] += h2 * UNIT[0];
    acc[1] += h2 * wp * wp * UNIT[1];
    if (withOutside) acc[2] += h2 * outsidePerUnit(table, p.tpS, theta, gamma);
    return true;
  }
  const one = responseMoments(rao, name, vesselHeadingDeg, [p], settings, ONE);
  acc[0] += one.m0;
  acc[1] += one.m2;
  acc[2] += one.m0Outside;
  return true;
}

const ACC = new Float64Array(3);

/**
 * Moments m0, m2 of one response to a list of partitions, as {@link responseMoments} gives them,
 * from the moment tables (interpolation error below 0.5 %, tested). `out` is filled and returned.
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
  ACC.fill(0);
  for (const p of partitions) {
    if (!addPartitionMoments(rao, name, vesselHeadingDeg, p, settings, momentTableFor(rao, name, p.kind, settings), ACC, true)) {
      out.m0 = NaN;
      out.m2 = NaN;
      out.m0Outside = NaN;
      return out;
    }
  }
  out.m0 = ACC[0];
  out.m2 = ACC[1];
  out.m0Outside = ACC[2];
  return out;
}

/**
 * What a partition series needs for every table of its kind, worked once per series and gamma
 * rule: per record the Tp node (-1: outside the tables or missing, so the record is integrated
 * directly) and its fraction, and the gamma layers' coefficients (DNV rule only).
 */
interface SeriesPrep {
  tpNode: Int32Array;
  tpFrac: Float64Array;
  /** [record * layers + layer]; null for a fixed gamma (one layer, coefficient 1). */
  coef: Float32Array | null;
  /** Per record, the one layer its coefficients pick, or -1 (DNV rule only). */
  single: Int8Array | null;
}

const preps = new WeakMap<SeaPartitionSeries, Map<string, SeriesPrep>>();

function seriesPrep(p: SeaPartitionSeries, t: MomentTable, settings: ResponseSeaSettings): SeriesPrep {
  let perSeries = preps.get(p);
  if (!perSeries) preps.set(p, (perSeries = new Map()));
  const dnv = p.kind === 'windSea' && settings.windSeaGamma === 'dnv';
  const key = `${t.grid.lnTpStep}|${t.gammas.length}|${dnv ? 'dnv' : 'fixed'}`;
  const hit = perSeries.get(key);
  if (hit) return hit;
  const n = p.hsM.length;
  const layers = t.gammas.length;
  const tpNode = new Int32Array(n);
  const tpFrac = new Float64Array(n);
  const coef = dnv ? new Float32Array(n * layers) : null;
  const single = dnv ? new Int8Array(n) : null;
  const step = t.grid.lnTpStep;
  const lnDnvMax = t.lnGammas[layers - 1];
  for (let i = 0; i < n; i++) {
    const u = Math.log(p.tpS[i] / TP_MIN_S) / step;
    let node = Math.floor(u);
    if (!(node >= 0 && node < t.tpNodes - 1)) node = -1;
    if (coef && node >= 0) {
      // The DNV rule in s = ln gamma: 5.75 - 1.15 r, held at ln 5 (r <= 3.6) and 0 (r >= 5).
      const hs = p.hsM[i];
      const r = p.tpS[i] / Math.sqrt(hs);
      if (!(hs >= 0)) node = -1;
      // At the band's ends one layer (the array starts at 0), as lagrangeInto gives it.
      else if (r <= 3.6) {
        coef[i * layers + layers - 1] = 1;
        single![i] = layers - 1;
      } else if (r >= 5) {
        coef[i * layers] = 1;
        single![i] = 0;
      } else single![i] = lagrangeInto(t, Math.min(lnDnvMax, 5.75 - 1.15 * r), coef, i * layers);
    }
    tpNode[i] = node;
    tpFrac[i] = u - node;
  }
  const prep = { tpNode, tpFrac, coef, single };
  perSeries.set(key, prep);
  return prep;
}

const REC: SeaPartition = { kind: 'windSea', hsM: 0, tpS: 0, dirDeg: 0 };

/**
 * The table part of {@link tabulatedMomentSeries} for one partition series (kept small, so that it
 * is compiled quickly): adds each record's moments from the table, and lists in `pending` the
 * records the table does not cover (outside it or missing data).
 */
function addFromTableSeries(
  tab: MomentTable,
  prep: SeriesPrep,
  p: SeaPartitionSeries,
  vesselHeadingDeg: number,
  m0: Float64Array,
  m2: Float64Array,
  pending: number[],
): void {
  const { hsM, tpS, dirDeg } = p;
  const { tpNode, tpFrac, coef, single } = prep;
  const layers = tab.gammas.length;
  const n = m0.length;
  const unit = new Float64Array(V);
  for (let i = 0; i < n; i++) {
    const hs = hsM[i];
    if (hs === 0) continue;
    const node = tpNode[i];
    if (node < 0 || !(hs > 0) || dirDeg[i] !== dirDeg[i]) {
      pending.push(i);
      continue;
    }
    readTable(tab, node, tpFrac[i], dirDeg[i] - vesselHeadingDeg, single ? single[i] : 0, coef, i * layers, unit);
    const h2 = hs * hs;
    const wp = (2 * Math.PI) / tpS[i];
    m0[i] += h2 * unit[0];
    m2[i] += h2 * wp * wp * unit[1];
  }
}

/**
 * Moments of one response per record of a partition series into m0 and m2 (filled), as
 * {@link tabulatedResponseMoments} gives them record by record (the same tables, the same
 * arithmetic), one partition after the other: a record missing any partition's data is NaN.
 */
export function tabulatedMomentSeries(
  rao: PreparedRao,
  name: string,
  vesselHeadingDeg: number,
  parts: readonly SeaPartitionSeries[],
  settings: ResponseSeaSettings,
  m0: Float64Array,
  m2: Float64Array,
): void {
  if (!rao.amplitudes[name]) throw new RangeError(`the vessel has no RAO for ${name}`);
  m0.fill(0);
  m2.fill(0);
  const n = m0.length;
  const acc = new Float64Array(3);
  for (const p of parts) {
    const t = momentTableFor(rao, name, p.kind, settings);
    let pending: number[] | null = null;
    if (t) {
      pending = [];
      addFromTableSeries(t, seriesPrep(p, t, settings), p, vesselHeadingDeg, m0, m2, pending);
    }
    // Outside the table, long-crested or missing: record by record, as tabulatedResponseMoments.
    const count = pending ? pending.length : n;
    for (let r = 0; r < count; r++) {
      const i = pending ? pending[r] : r;
      const hs = p.hsM[i];
      if (hs === 0) continue;
      REC.kind = p.kind;
      REC.hsM = hs;
      REC.tpS = p.tpS[i];
      REC.dirDeg = p.dirDeg[i];
      acc[0] = 0;
      acc[1] = 0;
      if (addPartitionMoments(rao, name, vesselHeadingDeg, REC, settings, t, acc, false)) {
        m0[i] += acc[0];
        m2[i] += acc[1];
      } else {
        m0[i] = NaN;
        m2[i] = NaN;
      }
    }
  }
}
