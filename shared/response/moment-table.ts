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
 * The table (MOMENT_GRID): ln Tp every 0.01 (1 %) from TP_MIN_S to TP_MAX_S, theta every 2 deg
 * all round (360 wraps to 0; our choice, docs/domain.md#vessel-response), read bilinearly: linear
 * in Tp between its two nodes (the interval found by a lookup, not a logarithm) and in theta.
 * Nodes are worked lazily on first use, layer by layer (`worked` holds a node's layers worked; a
 * Tp node's row is allocated on first use and only the parts of it worked are ever written, so
 * the rest never costs a page of fresh memory), since a series touches a small part of the table.
 * Gamma:
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
 * The largest error against the direct integration measured on 3,000 random seas is 0.32 % (0.25 %
 * with a 1 deg theta step, from the steps in Tp, which also the record path through the hour chain
 * reads).
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
import { spreadAtGrid, spreadAtPeriodEnds, spreadPositions, spreadTableOf, type SpreadTable } from './spread-table';
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

/**
 * The engine's grid: ln Tp every 0.01 (1 % in Tp), theta every 2 deg, 5 gamma nodes (tested). The
 * 2 deg step halves the nodes a series works against 1 deg, for a largest error of 0.32 % instead
 * of 0.25 % (bound 0.5 %; docs/domain.md#vessel-response says why we took it).
 */
export const MOMENT_GRID: MomentGrid = { lnTpStep: 0.01, thetaStepDeg: 2, gammaNodes: 5 };

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

/**
 * The Tp axis of the tables of one ln Tp step: the nodes' periods, the inverse widths of their
 * intervals, and a uniform lookup (cells no wider than the narrowest interval, so a cell holds at
 * most one node) that finds a period's interval without a logarithm.
 */
interface TpAxis {
  nodeS: Float64Array;
  invWidth: Float64Array;
  cellInv: number;
  cellNode: Int32Array;
}

const axes = new Map<number, TpAxis>();

function tpAxis(lnTpStep: number): TpAxis {
  const hit = axes.get(lnTpStep);
  if (hit) return hit;
  const nodes = Math.floor(Math.log(TP_MAX_S / TP_MIN_S) / lnTpStep) + 1;
  const nodeS = Float64Array.from({ length: nodes }, (_, i) => TP_MIN_S * Math.exp(i * lnTpStep));
  const invWidth = new Float64Array(nodes);
  for (let i = 0; i + 1 < nodes; i++) invWidth[i] = 1 / (nodeS[i + 1] - nodeS[i]);
  // The narrowest interval is the first; a cell a little narrower still.
  const cellS = 0.999 * (nodeS[1] - nodeS[0]);
  const cellNode = new Int32Array(Math.ceil((nodeS[nodes - 1] - TP_MIN_S) / cellS) + 1);
  for (let c = 0, i = 0; c < cellNode.length; c++) {
    const start = TP_MIN_S + c * cellS;
    while (i + 1 < nodes && nodeS[i + 1] <= start) i++;
    cellNode[c] = i;
  }
  const axis = { nodeS, invWidth, cellInv: 1 / cellS, cellNode };
  axes.set(lnTpStep, axis);
  return axis;
}

/**
 * The interval of a peak period on the axis: its lower node (-1 outside Tp_0 <= Tp < Tp_last, or
 * a missing Tp) and, into `frac[0]`, the fraction of the interval, linear in Tp.
 */
function tpInterval(axis: TpAxis, tpS: number, frac: Float64Array): number {
  const c = Math.floor((tpS - TP_MIN_S) * axis.cellInv);
  const cells = axis.cellNode;
  if (!(c >= 0 && c < cells.length)) return -1;
  const nodeS = axis.nodeS;
  let i = cells[c];
  // Rounding in the cell's index may put the period a node either side.
  if (tpS < nodeS[i] && i > 0) i--;
  else if (tpS >= nodeS[i + 1]) i++;
  if (!(tpS >= nodeS[i] && i + 1 < nodeS.length)) return -1;
  frac[0] = (tpS - nodeS[i]) * axis.invWidth[i];
  return i;
}

/** One moment table; see the module comment. */
export interface MomentTable {
  rao: PreparedRao;
  name: string;
  spreading: Spreading;
  /** The spread table it sums (the same response and spreading). */
  spread: SpreadTable;
  grid: MomentGrid;
  tpNodes: number;
  tpAxis: TpAxis;
  thetaNodes: number;
  /** Per layer: its gamma, normalised weights and unnormalised sum. */
  gammas: Float64Array;
  weights: Float64Array[];
  /** The weights times x_j^2 (the m2 sums). */
  weightsX2: Float64Array[];
  shapeSums: Float64Array;
  /** ln gamma of the layers and the Lagrange denominators (DNV rule only). */
  lnGammas: Float64Array;
  lagrangeDen: Float64Array;
  /** Per Tp node, the grid periods' positions on the spread table (the same for every theta node). */
  positions: (Float64Array | undefined)[];
  /** Per Tp node: [thetaNode][layer][a0, a2], read only once worked (a record's neighbours in time share Tp nodes). */
  rows: (Float32Array | undefined)[];
  /** Per node [tpNode * thetaNodes + thetaNode]: the layers worked there, bit l for layer l. */
  worked: Uint8Array;
  /**
   * Per cell [tpNode * thetaNodes + thetaNode]: the layers worked at all four of its corner nodes,
   * bit l for layer l (a record's neighbours in time share Tp nodes: nearby bytes).
   */
  cells: Uint8Array;
  /** Bits of every layer. */
  allLayers: number;
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
  if (!(Number.isInteger(layers) && layers >= 1 && layers <= 8))
    throw new RangeError(`gamma nodes ${grid.gammaNodes} must be a whole number from 1 to 8`);
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
  const axis = tpAxis(grid.lnTpStep);
  const tpNodes = axis.nodeS.length;
  const weights = Array.from(gammas, (g) => jonswapWeights(g));
  return {
    rao,
    name,
    spreading,
    spread: spreadTableOf(rao, name, spreading),
    grid,
    tpNodes,
    tpAxis: axis,
    thetaNodes: 360 / grid.thetaStepDeg,
    gammas,
    weights,
    weightsX2: weights.map((w) => w.map((wj, j) => wj * GRID_X[j] * GRID_X[j])),
    shapeSums: Float64Array.from(gammas, (g) => jonswapShapeSum(g)),
    lnGammas,
    lagrangeDen,
    positions: new Array<Float64Array | undefined>(tpNodes),
    rows: new Array<Float32Array | undefined>(tpNodes),
    cells: new Uint8Array((360 / grid.thetaStepDeg) * tpNodes),
    worked: new Uint8Array((360 / grid.thetaStepDeg) * tpNodes),
    allLayers: (1 << layers) - 1,
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

/**
 * Works the layers `need` (bit l: layer l) of node (tp node i, theta node k) not yet worked into
 * `row` (Tp node i's). A series of wind sea mostly reads one layer (gamma 1 or 5 outside the DNV
 * rule's band), so the others are worked only when a record asks for them.
 */
function workNode(t: MomentTable, row: Float32Array, i: number, k: number, need: number): void {
  const at = i * t.thetaNodes + k;
  const missing = need & ~t.worked[at];
  if (missing === 0) return;
  let q = t.positions[i];
  if (!q) {
    t.positions[i] = q = new Float64Array(GRID_POINTS);
    spreadPositions(t.spread, t.tpAxis.nodeS[i], q);
  }
  spreadAtGrid(t.spread, k * t.grid.thetaStepDeg, q, H2);
  const layers = t.gammas.length;
  for (let l = 0; l < layers; l++)
    if ((missing & (1 << l)) !== 0) layerMoments(t.weights[l], t.weightsX2[l], H2, row, (k * layers + l) * V);
  t.worked[at] |= missing;
}

/**
 * One layer's node: a0 = sum w_j H2_j and a2 = sum w_j x_j^2 H2_j into row[o], row[o + 1]. Apart
 * from workNode so that the optimiser compiles this loop once, on typed arrays only.
 */
function layerMoments(w: Float64Array, wx2: Float64Array, h2: Float64Array, row: Float32Array, o: number): void {
  let a0 = 0;
  let a2 = 0;
  for (let j = 0; j < GRID_POINTS; j++) {
    const h = h2[j];
    a0 += w[j] * h;
    a2 += wx2[j] * h;
  }
  row[o] = a0;
  row[o + 1] = a2;
}

function rowOf(t: MomentTable, i: number): Float32Array {
  let row = t.rows[i];
  if (!row) t.rows[i] = row = new Float32Array(t.thetaNodes * t.gammas.length * V); // zeros, untouched until worked
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

const FRAC = new Float64Array(1);

/**
 * Per-unit-Hs moments of one partition from the table into `out` [a0, a2] (m0 = Hs^2 a0,
 * m2 = Hs^2 omega_p^2 a2); false, with `out` untouched, when Tp or gamma is outside the table.
 * `thetaDeg` is the mean relative direction, any real number (taken modulo 360).
 */
export function momentTableLookup(t: MomentTable, tpS: number, thetaDeg: number, gamma: number, out: Float64Array): boolean {
  const i = tpInterval(t.tpAxis, tpS, FRAC);
  if (i < 0) return false;
  if (!layerCoefficients(t, gamma)) return false;
  readTable(t, i, FRAC[0], thetaDeg, t.single, t.coef, 0, out);
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
  const need = single >= 0 ? 1 << single : coef === null ? 1 : t.allLayers;
  if ((t.cells[i * thetaNodes + k] & need) !== need) workCell(t, i, k, k1, need);
  const rowLo = t.rows[i]!;
  const rowHi = t.rows[i + 1]!;
  const layers = t.gammas.length;
  // Theta nodes k and k1 within the rows of Tp nodes i and i + 1.
  const oA = k * layers * V;
  const oB = k1 * layers * V;
  const wAA = (1 - fu) * (1 - fv);
  const wBA = fu * (1 - fv);
  const wAB = (1 - fu) * fv;
  const wBB = fu * fv;
  if (single >= 0 || coef === null) {
    const pA = oA + (single > 0 ? single * V : 0);
    const pB = oB + (single > 0 ? single * V : 0);
    out[0] = wAA * rowLo[pA] + wBA * rowHi[pA] + wAB * rowLo[pB] + wBB * rowHi[pB];
    out[1] = wAA * rowLo[pA + 1] + wBA * rowHi[pA + 1] + wAB * rowLo[pB + 1] + wBB * rowHi[pB + 1];
    return;
  }
  CORNERS[0] = wAA;
  CORNERS[1] = wBA;
  CORNERS[2] = wAB;
  CORNERS[3] = wBB;
  layerSum(rowLo, rowHi, oA, oB, CORNERS, coef, at, layers, out);
}

/** Bilinear weights of the four corners: (Tp i, theta k), (i + 1, k), (i, k1), (i + 1, k1). */
const CORNERS = new Float64Array(4);

/**
 * The layers' bilinear reads (corner weights w) weighted by coef[at..] into out [a0, a2], divided
 * by the coefficients' sum, which float32 leaves a few 1e-8 off 1 (an RAO of 1 gives m0 = Hs^2/16
 * exactly again). Shared by the record and the series paths (DNV gamma inside its band).
 */
function layerSum(
  rowLo: Float32Array,
  rowHi: Float32Array,
  oA: number,
  oB: number,
  w: Float64Array,
  coef: Float32Array,
  at: number,
  layers: number,
  out: Float64Array,
): void {
  let a0 = 0;
  let a2 = 0;
  let cs = 0;
  for (let l = 0; l < layers; l++) {
    const cl = coef[at + l];
    if (cl === 0) continue;
    cs += cl;
    const pA = oA + l * V;
    const pB = oB + l * V;
    a0 += cl * (w[0] * rowLo[pA] + w[1] * rowHi[pA] + w[2] * rowLo[pB] + w[3] * rowHi[pB]);
    a2 += cl * (w[0] * rowLo[pA + 1] + w[1] * rowHi[pA + 1] + w[2] * rowLo[pB + 1] + w[3] * rowHi[pB + 1]);
  }
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
  spreadAtPeriodEnds(t.spread, thetaDeg, ENDS);
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
  if (partitionMissing(p, settings)) return false;
  const gamma = partitionGamma(p, settings);
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

/**
 * True when a partition of Hs other than 0 misses what its spectrum needs (Hs, Tp, direction or
 * gamma): the record is "no data" (docs/domain.md#vessel-response).
 */
export function partitionMissing(p: SeaPartition, settings: ResponseSeaSettings): boolean {
  const hs = p.hsM;
  if (hs === 0) return false;
  const gamma = partitionGamma(p, settings);
  return !(hs > 0) || !(p.tpS > 0) || p.dirDeg !== p.dirDeg || gamma !== gamma;
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

const REC: SeaPartition = { kind: 'windSea', hsM: 0, tpS: 0, dirDeg: 0 };

/** Works the layers `need` at the four corner nodes of cell (tp node i, theta nodes k, k1) where not yet, and marks the cell. */
function workCell(t: MomentTable, i: number, k: number, k1: number, need: number): void {
  const rowLo = rowOf(t, i);
  const rowHi = rowOf(t, i + 1);
  workNode(t, rowLo, i, k, need);
  workNode(t, rowHi, i + 1, k, need);
  workNode(t, rowLo, i, k1, need);
  workNode(t, rowHi, i + 1, k1, need);
  t.cells[i * t.thetaNodes + k] |= need;
}

/**
 * Keeps in open[0..count) the records whose m0 is at most `above` (or NaN), in order, and gives the
 * others class `from`; returns how many are kept.
 */
function keepUnder(open: Int32Array, count: number, m0: Float64Array, above: number, classes: Uint8Array, from: number): number {
  let kept = 0;
  for (let r = 0; r < count; r++) {
    const i = open[r];
    open[kept] = i;
    if (m0[i] > above) classes[i] = from;
    else kept++;
  }
  return kept;
}

/** Records of a partition series with a missing value, by its arrays and the gamma that applies. */
interface MissingRecords {
  tpS: Float64Array;
  dirDeg: Float64Array;
  key: string;
  records: Int32Array;
}

/**
 * Kept per partition series (by its Hs array, then the Tp and direction arrays and the gamma
 * setting), since every operation with response limits on a worksite asks for the same. A new
 * series, or new contents in a reused buffer, comes as new arrays (the engine's rule for caches
 * keyed by array).
 */
const missingCache = new WeakMap<Float64Array, MissingRecords[]>();

/** The records of `p` where a partition of Hs other than 0 misses what its spectrum needs ({@link partitionMissing}), ascending. */
export function missingPartitionRecords(p: SeaPartitionSeries, settings: ResponseSeaSettings): Int32Array {
  const gamma = p.kind === 'swell' ? settings.swellGamma : settings.windSeaGamma;
  const key = `${p.kind}|${gamma}`;
  let list = missingCache.get(p.hsM);
  if (!list) missingCache.set(p.hsM, (list = []));
  const hit = list.find((m) => m.tpS === p.tpS && m.dirDeg === p.dirDeg && m.key === key);
  if (hit) return hit.records;
  const { hsM, tpS, dirDeg } = p;
  const found: number[] = [];
  const n = hsM.length;
  for (let i = nextSuspect(hsM, tpS, dirDeg, 0); i < n; i = nextSuspect(hsM, tpS, dirDeg, i + 1)) {
    const hs = hsM[i];
    REC.kind = p.kind;
    REC.hsM = hs;
    REC.tpS = tpS[i];
    REC.dirDeg = dirDeg[i];
    if (partitionMissing(REC, settings)) found.push(i);
  }
  const records = Int32Array.from(found);
  // A few entries per Hs array at most (the settings of the operations on it).
  if (list.length >= 8) list.shift();
  list.push({ tpS, dirDeg, key, records });
  return records;
}

/**
 * The first record from `from` on whose partition values may be missing, or the series' length: a
 * record of Hs 0, or of Hs, Tp and direction all present, is never missing (a fixed gamma always
 * is there, the DNV rule's only where Hs or Tp is), and the rest go to partitionMissing. A loop of
 * its own on typed arrays only, so that it is optimised once (inside its caller, which meets new
 * shapes, it was thrown away and run slowly again: about 30 ms of a cold bench pass, measured).
 */
function nextSuspect(hsM: Float64Array, tpS: Float64Array, dirDeg: Float64Array, from: number): number {
  const n = hsM.length;
  for (let i = from; i < n; i++) {
    const hs = hsM[i];
    if (!(hs === 0 || (hs > 0 && tpS[i] > 0 && dirDeg[i] === dirDeg[i] && hs < Infinity))) return i;
  }
  return n;
}

/**
 * Gives class `noData` to every record where a partition of Hs other than 0 misses what its
 * spectrum needs, as {@link partitionMissing} judges it (docs/domain.md#vessel-response).
 */
export function markMissingPartitions(
  parts: readonly SeaPartitionSeries[],
  settings: ResponseSeaSettings,
  classes: Uint8Array,
  noData: number,
): void {
  for (const p of parts) {
    const records = missingPartitionRecords(p, settings);
    for (let r = 0; r < records.length; r++) if (records[r] < classes.length) classes[records[r]] = noData;
  }
}

/**
 * The table part of {@link tabulatedMomentSeries} for one partition series: adds each record's
 * moments from the table with the record path's arithmetic (readTable, lagrangeInto), worked in
 * the loop rather than kept per record (fresh memory costs more here than a logarithm), with one
 * check per cell instead of four per node. Works the records open[0..count) (all `count` from 0
 * when `open` is null); lists in `pending` those the table does not cover (Tp outside it, missing
 * data).
 */
function addFromTableSeries(
  tab: MomentTable,
  p: SeaPartitionSeries,
  dnv: boolean,
  vesselHeadingDeg: number,
  m0: Float64Array,
  m2: Float64Array,
  pending: number[],
  open: Int32Array | null,
  count: number,
  overwrite: boolean,
): void {
  // The reading loop stops at a record whose cell lacks a layer it needs; the cell is worked here
  // and the loop goes on from that record. So the loop stays small and apart from the table's
  // building: the optimiser compiles it sooner, and does not throw it away when the building code
  // changes (measured: a third of the compiling it took in a cold run, and fewer fresh pages).
  let r = 0;
  while ((r = readFromTable(tab, p, dnv, vesselHeadingDeg, m0, m2, pending, open, r, count, overwrite)) < count)
    workCell(tab, MISS[0], MISS[1], MISS[2], MISS[3]);
}

/** Where {@link readFromTable} stopped: the cell's Tp node, its theta nodes k and k1, and the layers needed. */
const MISS = new Int32Array(4);

/**
 * The loop of {@link addFromTableSeries} from position `start`: returns the position of the first
 * record whose cell lacks a layer it needs (that cell in MISS, the record not yet read), or
 * `count` when all are read.
 */
function readFromTable(
  tab: MomentTable,
  p: SeaPartitionSeries,
  dnv: boolean,
  vesselHeadingDeg: number,
  m0: Float64Array,
  m2: Float64Array,
  pending: number[],
  open: Int32Array | null,
  start: number,
  count: number,
  overwrite: boolean,
): number {
  const { hsM, tpS, dirDeg } = p;
  const layers = tab.gammas.length;
  const stride = layers * V;
  const thetaNodes = tab.thetaNodes;
  const axis = tab.tpAxis;
  const frac = new Float64Array(1);
  const thetaStep = tab.grid.thetaStepDeg;
  const lnDnvMax = tab.lnGammas[layers - 1];
  const cells = tab.cells;
  const allLayers = tab.allLayers;
  const rows = tab.rows;
  const coef = LAYER_COEF.length >= layers ? LAYER_COEF : new Float32Array(layers);
  for (let r = start; r < count; r++) {
    const i = open === null ? r : open[r];
    const hs = hsM[i];
    const tp = tpS[i];
    if (hs === 0) {
      if (overwrite) m0[i] = m2[i] = 0;
      continue;
    }
    const node = tpInterval(axis, tp, frac);
    if (!(node >= 0 && hs > 0 && dirDeg[i] === dirDeg[i])) {
      if (overwrite) m0[i] = m2[i] = 0;
      pending.push(i);
      continue;
    }
    // As readTable: one turn added or taken, the remainder only for the rare rest.
    let theta = dirDeg[i] - vesselHeadingDeg;
    if (theta < 0) theta += 360;
    if (theta >= 360) theta -= 360;
    if (!(theta >= 0 && theta < 360)) theta = ((theta % 360) + 360) % 360;
    const v = theta / thetaStep;
    let k = Math.floor(v);
    const fv = v - k;
    if (k >= thetaNodes) k -= thetaNodes;
    const k1 = k + 1 === thetaNodes ? 0 : k + 1;
    // The DNV rule in s = ln gamma: 5.75 - 1.15 r, held at ln 5 (r <= 3.6) and 0 (r >= 5); at the
    // band's ends one layer, as lagrangeInto gives it.
    let one = 0;
    if (dnv) {
      const r = tp / Math.sqrt(hs);
      one = r <= 3.6 ? layers - 1 : r >= 5 ? 0 : lagrangeInto(tab, Math.min(lnDnvMax, 5.75 - 1.15 * r), coef, 0);
    }
    const need = one >= 0 ? 1 << one : allLayers;
    if ((cells[node * thetaNodes + k] & need) !== need) {
      MISS[0] = node;
      MISS[1] = k;
      MISS[2] = k1;
      MISS[3] = need;
      return r;
    }
    const rowLo = rows[node]!;
    const rowHi = rows[node + 1]!;
    const fu = frac[0];
    const wAA = (1 - fu) * (1 - fv);
    const wBA = fu * (1 - fv);
    const wAB = (1 - fu) * fv;
    const wBB = fu * fv;
    const oA = k * stride;
    const oB = k1 * stride;
    let a0: number;
    let a2: number;
    if (one >= 0) {
      const pA = oA + one * V;
      const pB = oB + one * V;
      a0 = wAA * rowLo[pA] + wBA * rowHi[pA] + wAB * rowLo[pB] + wBB * rowHi[pB];
      a2 = wAA * rowLo[pA + 1] + wBA * rowHi[pA + 1] + wAB * rowLo[pB + 1] + wBB * rowHi[pB + 1];
    } else {
      CORNERS[0] = wAA;
      CORNERS[1] = wBA;
      CORNERS[2] = wAB;
      CORNERS[3] = wBB;
      layerSum(rowLo, rowHi, oA, oB, CORNERS, coef, 0, layers, SUM);
      a0 = SUM[0];
      a2 = SUM[1];
    }
    // The record path's products: Hs^2 a0 and ((Hs^2 omega_p) omega_p) a2.
    const h2 = hs * hs;
    const wp = (2 * Math.PI) / tp;
    if (overwrite) {
      m0[i] = h2 * a0;
      m2[i] = h2 * wp * wp * a2;
    } else {
      m0[i] += h2 * a0;
      m2[i] += h2 * wp * wp * a2;
    }
  }
  return count;
}

/** The layers' sums of one record. */
const SUM = new Float64Array(2);

/** Layer coefficients of one record (float32, as the record path keeps them). */
const LAYER_COEF = new Float32Array(16);

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
  momentsOfRecords(rao, name, vesselHeadingDeg, parts, settings, m0, m2, null, m0.length, null, 0, Infinity);
}

/**
 * The status path's {@link tabulatedMomentSeries}: works only the records open[0..count), whose
 * moments it writes into m0 and m2 (the rest are left as they were), and returns how many of them
 * stay open. After each partition but the last, a record whose m0 so far is above `breakAboveM0`
 * gets class `from` in `classes` and leaves the list: partitions only add to m0, so the caller
 * sets the bound where m0 above it surely breaks its limit whatever the rest of the sea
 * (Infinity: none). The list is compacted in place, in order.
 */
export function tabulatedMomentsOfOpen(
  rao: PreparedRao,
  name: string,
  vesselHeadingDeg: number,
  parts: readonly SeaPartitionSeries[],
  settings: ResponseSeaSettings,
  m0: Float64Array,
  m2: Float64Array,
  open: Int32Array,
  count: number,
  classes: Uint8Array,
  from: number,
  breakAboveM0: number,
): number {
  return momentsOfRecords(rao, name, vesselHeadingDeg, parts, settings, m0, m2, open, count, classes, from, breakAboveM0);
}

function momentsOfRecords(
  rao: PreparedRao,
  name: string,
  vesselHeadingDeg: number,
  parts: readonly SeaPartitionSeries[],
  settings: ResponseSeaSettings,
  m0: Float64Array,
  m2: Float64Array,
  open: Int32Array | null,
  count: number,
  classes: Uint8Array | null,
  from: number,
  breakAboveM0: number,
): number {
  if (!rao.amplitudes[name]) throw new RangeError(`the vessel has no RAO for ${name}`);
  const acc = new Float64Array(3);
  const pending: number[] = [];
  let written = false;
  for (let q = 0; q < parts.length; q++) {
    const p = parts[q];
    const t = momentTableFor(rao, name, p.kind, settings);
    pending.length = 0;
    // The first partition writes every record worked (zeros first when it is not read from a table).
    const overwrite = !written;
    if (overwrite && !t) zeroRecords(m0, m2, open, count);
    written = true;
    if (t)
      addFromTableSeries(
        t,
        p,
        p.kind === 'windSea' && settings.windSeaGamma === 'dnv',
        vesselHeadingDeg,
        m0,
        m2,
        pending,
        open,
        count,
        overwrite,
      );
    // Outside the table, long-crested or missing: record by record, as tabulatedResponseMoments.
    const worked = t ? pending.length : count;
    for (let r = 0; r < worked; r++) {
      const i = t ? pending[r] : open === null ? r : open[r];
      const hs = p.hsM[i];
      if (hs === 0) continue;
      REC.kind = p.kind;
      REC.hsM = hs;
      REC.tpS = p.tpS[i];
      REC.dirDeg = p.dirDeg[i];
      if (partitionMissing(REC, settings)) {
        m0[i] = NaN;
        m2[i] = NaN;
        continue;
      }
      acc[0] = 0;
      acc[1] = 0;
      addPartitionMoments(rao, name, vesselHeadingDeg, REC, settings, t, acc, false);
      m0[i] += acc[0];
      m2[i] += acc[1];
    }
    if (open !== null && classes !== null && breakAboveM0 < Infinity && q < parts.length - 1)
      count = keepUnder(open, count, m0, breakAboveM0, classes, from);
  }
  if (!written) zeroRecords(m0, m2, open, count);
  return count;
}

/** Zeros m0 and m2 at the records open[0..count) (the first `count` when `open` is null). */
function zeroRecords(m0: Float64Array, m2: Float64Array, open: Int32Array | null, count: number): void {
  if (open === null) {
    m0.fill(0, 0, count);
    m2.fill(0, 0, count);
    return;
  }
  for (let r = 0; r < count; r++) m0[open[r]] = m2[open[r]] = 0;
}
