/**
 * The invented forecasts the local fake service answers: synthetic "truth" from
 * {@link generateSyntheticSea} plus a forecast error that grows with lead time and changes a
 * little from one issue to the next, so successive forecasts agree near their start and drift
 * apart further out, and windows open, close and move between issues as they do with a real
 * forecast. Pure: the same (seed, position, issue time, horizon) always gives the same answer.
 *
 * Error model (our own choice, of the order of published wave-forecast skill: a few percent on
 * Hs at analysis time, some 20-30 % scatter at 10 days, much of it from the timing of systems):
 * - timing: the forecast at valid time t shows the truth at t + dt, with dt a smooth function of t
 *   of amplitude 1 h + 1.2 h per day of lead (13 h at 10 days, 20 h at 16 days);
 * - amplitude: Hs and wind multiplied by exp(e), |e| <= 0.03 + 0.035 per day of lead
 *   (wind 0.04 + 0.035 per day); Tp by exp(e/2); directions shifted by up to 4 deg + 3 deg per day.
 * The error fields are value noise in valid time (30-40 h lattices) blended over a 24-hour lattice
 * of issues, so two issues 6 h apart share most of their error.
 *
 * Ensembles (docs/domain.md#forecast-uncertainty): on request the answer also carries members
 * 1..N, each made by the same method with an error seed of its own (member 0, the control, is
 * the forecast above). The members scatter around the truth as another forecast would, so their
 * spread grows with lead time like the error; each is deterministic per (issue, member).
 */
import { EXCHANGE_SERIES_KEYS, type ExchangeMemberSeries, type ExchangeSeriesKey, type SeaStateExchange } from './forecast-schema';
import { mix32, seed32, smoothNoise } from './seeded-noise';
import { generateSyntheticSea, type SeaClimate, type SyntheticPartition } from './synthetic-sea';

const MS_PER_HOUR = 3_600_000;
/** Issues are made every 6 hours, at 00, 06, 12 and 18 UTC. */
export const ISSUE_CYCLE_HOURS = 6;
/** The fake's model grid, deg: positions snap to the nearest node. */
export const FAKE_GRID_DEG = 0.25;
/** Steepness bound kept after the error is applied: Hs/L0 <= 1/16 (see synthetic-sea.ts). */
const L0_PER_TP2 = 9.81 / (2 * Math.PI);
const MAX_STEEPNESS = 1 / 16;
const ISSUE_LATTICE = 4; // issues per node of the issue lattice (24 h)

/** Snaps a coordinate to the fake's grid; result rounded to 1e-6 deg to avoid float noise. */
export function snapToGrid(deg: number): number {
  return Math.round(Math.round(deg / FAKE_GRID_DEG) * FAKE_GRID_DEG * 1e6) / 1e6;
}

/**
 * Seed of the synthetic truth at a grid node: the service seed mixed with the node's indices.
 * @param seed the service seed (any finite number)
 * @param latitude deg north; @param longitude deg east (snapped to the grid here)
 */
export function truthSeedForPosition(seed: number, latitude: number, longitude: number): number {
  const i = Math.round(latitude / FAKE_GRID_DEG);
  const j = Math.round(((((longitude % 360) + 540) % 360) - 180) / FAKE_GRID_DEG);
  return mix32(seed32(seed) ^ mix32(Math.imul(i, 0x2c1b3c6d) ^ mix32(j ^ 0x297a2d39)));
}

/**
 * Climate at a position: seasons follow the hemisphere (roughest mid-January north, mid-July
 * south). Only the season flips: the prevailing direction and the clockwise veering through
 * systems stay those of a northern-hemisphere west coast everywhere (an invented sea, not a model).
 */
export function climateForPosition(latitude: number): Partial<SeaClimate> {
  return latitude < 0 ? { roughestDayOfYear: 197 } : {};
}

/** Latest issue time at or before `nowMs - delayHours`, on the 00/06/12/18 UTC cycle, ms. */
export function latestIssueTimeMs(nowMs: number, delayHours = 0): number {
  const cycleMs = ISSUE_CYCLE_HOURS * MS_PER_HOUR;
  return Math.floor((nowMs - delayHours * MS_PER_HOUR) / cycleMs) * cycleMs;
}

export interface FakeForecastRequest {
  /** Service seed. */
  seed: number;
  /** Requested position, deg north / deg east; the answer is for the nearest grid node. */
  latitude: number;
  longitude: number;
  /** Issue time, ms UTC; must be on the 6-hour cycle. */
  issuedAtMs: number;
  /** Forecast length in days, 1-16 (see {@link fakeForecastLeadHours} for the steps). */
  horizonDays: number;
  /** Ensemble members beside the control, 0 (default) to {@link MAX_FAKE_MEMBERS}. */
  members?: number;
}

/** Most ensemble members the fake makes beside the control. */
export const MAX_FAKE_MEMBERS = 50;

/** Error seed of one member: the control's (member 0) as before, each other member its own. */
export function memberErrorSeed(truthSeed: number, member: number): number {
  const control = mix32(truthSeed ^ 0x5bd1e995);
  return member === 0 ? control : mix32(control ^ mix32(Math.imul(member, 0x3c6ef372) ^ 0x1b873593));
}

/** Lead time up to which the fake forecast is hourly, h; 3-hourly after it, as many real services are. */
export const FAKE_HOURLY_UNTIL_H = 72;

/**
 * Lead times of the fake forecast's records, h: hourly from 0 to +72 h, then 3-hourly to the
 * horizon (+240 h for 10 days), so the plan shows a forecast that changes step part-way
 * (docs/domain.md#weather-windows). Horizons up to 3 days are hourly to the last hour before the
 * horizon, as before.
 */
export function fakeForecastLeadHours(horizonDays: number): number[] {
  const horizonH = horizonDays * 24;
  const leads: number[] = [];
  if (horizonH <= FAKE_HOURLY_UNTIL_H) {
    for (let h = 0; h < horizonH; h++) leads.push(h);
    return leads;
  }
  for (let h = 0; h <= FAKE_HOURLY_UNTIL_H; h++) leads.push(h);
  for (let h = FAKE_HOURLY_UNTIL_H + 3; h <= horizonH; h += 3) leads.push(h);
  return leads;
}

/** ISO 8601 UTC with `Z`, whole seconds. */
function iso(ms: number): string {
  return new Date(ms).toISOString().replace('.000Z', 'Z');
}

/** Smooth error field in [-1, 1] over valid time, blended over the issue lattice. */
function errorField(seed: number, channel: number, issueIndex: number, tH: number, periodH: number): number {
  const x = issueIndex / ISSUE_LATTICE;
  const q = Math.floor(x);
  let f = x - q;
  f = f * f * (3 - 2 * f);
  const a = smoothNoise(mix32(seed ^ mix32(q)), channel, tH, periodH);
  const b = smoothNoise(mix32(seed ^ mix32(q + 1)), channel, tH, periodH);
  return a + (b - a) * f;
}

function wrap360(deg: number): number {
  const r = deg % 360;
  return r < 0 ? r + 360 : r;
}

/**
 * What the fake knows at one record, from which each exchange variable is read (FAKE_VALUES).
 */
interface FakeRecord {
  hs: number;
  tp: number;
  wind: number;
  /** Wave and wind directions from the truth at the nearest record, before the error. */
  dirTrue: number;
  windDirTrue: number;
  /** Direction error, deg. */
  eDir: number;
  /** The partitions with the same errors (Hs 0 = absent; Tp and direction null then). */
  parts: Record<'windSea' | 'swell1' | 'swell2', { hs: number; tp: number | null; dir: number | null }>;
}

/**
 * The fake's value of each exchange variable at one record: one line per variable, so a variable
 * added to EXCHANGE_SERIES gets its invented values here in one line (an optional one may be left out).
 */
const FAKE_VALUES: { [K in ExchangeSeriesKey]?: (r: FakeRecord) => number | null } = {
  hs: (r) => r.hs,
  tp: (r) => r.tp,
  dir: (r) => Math.round(wrap360(r.dirTrue + r.eDir)) % 360,
  wind: (r) => r.wind,
  windDir: (r) => Math.round(wrap360(r.windDirTrue + 1.5 * r.eDir)) % 360,
  'windSea.hs': (r) => r.parts.windSea.hs,
  'windSea.tp': (r) => r.parts.windSea.tp,
  'windSea.dir': (r) => r.parts.windSea.dir,
  'swell1.hs': (r) => r.parts.swell1.hs,
  'swell1.tp': (r) => r.parts.swell1.tp,
  'swell1.dir': (r) => r.parts.swell1.dir,
  'swell2.hs': (r) => r.parts.swell2.hs,
  'swell2.tp': (r) => r.parts.swell2.tp,
  'swell2.dir': (r) => r.parts.swell2.dir,
};

/**
 * One partition of the truth at the shifted time with the record's errors: Hs interpolated and
 * scaled like the total, Tp and direction from the nearest record (docs/domain.md#partitions).
 */
function fakePartition(
  p: SyntheticPartition,
  i0: number,
  f: number,
  near: number,
  scaleHs: number,
  scaleTp: number,
  eDir: number,
): FakeRecord['parts']['windSea'] {
  const a = p.hsM[i0];
  const b = p.hsM[i0 + 1];
  const hs = Math.min(25, Math.round((a * (1 - f) + b * f) * scaleHs * 100) / 100);
  const tpTrue = p.tpS[near] === p.tpS[near] ? p.tpS[near] : a > 0 ? p.tpS[i0] : p.tpS[i0 + 1];
  const dirTrue = p.dirDeg[near] === p.dirDeg[near] ? p.dirDeg[near] : a > 0 ? p.dirDeg[i0] : p.dirDeg[i0 + 1];
  if (!(hs > 0) || tpTrue !== tpTrue) return { hs: 0, tp: null, dir: null };
  return {
    hs,
    tp: Math.min(40, Math.max(0.5, Math.round(tpTrue * scaleTp * 10) / 10)),
    dir: Math.round(wrap360(dirTrue + eDir)) % 360,
  };
}

/**
 * Builds one invented forecast answer in the sea-state exchange (forecast-schema.ts).
 * @throws RangeError for an issue time off the 6-hour cycle or a horizon outside 1-16 days
 */
export function buildFakeForecast(request: FakeForecastRequest): SeaStateExchange {
  const { issuedAtMs, horizonDays } = request;
  const cycleMs = ISSUE_CYCLE_HOURS * MS_PER_HOUR;
  if (!Number.isFinite(issuedAtMs) || issuedAtMs % cycleMs !== 0) throw new RangeError('issuedAtMs must be on the 00/06/12/18 UTC cycle');
  if (!(Number.isInteger(horizonDays) && horizonDays >= 1 && horizonDays <= 16))
    throw new RangeError(`horizonDays must be an integer within 1-16, got ${horizonDays}`);
  const latitude = snapToGrid(request.latitude);
  const longitude = snapToGrid(request.longitude);
  const members = request.members ?? 0;
  if (!(Number.isInteger(members) && members >= 0 && members <= MAX_FAKE_MEMBERS))
    throw new RangeError(`members must be an integer within 0-${MAX_FAKE_MEMBERS}, got ${members}`);
  const truthSeed = truthSeedForPosition(request.seed, latitude, longitude);
  const issueIndex = Math.round(issuedAtMs / cycleMs);
  const leads = fakeForecastLeadHours(horizonDays);
  const n = leads.length;
  const horizonH = leads[n - 1] + 1;

  // Truth over the forecast period with a margin for the timing error (at most 20.2 h).
  const truth = generateSyntheticSea({
    startMs: issuedAtMs - TRUTH_MARGIN_H * MS_PER_HOUR,
    hours: horizonH + 2 * TRUTH_MARGIN_H,
    seed: truthSeed,
    climate: climateForPosition(latitude),
    partitions: true,
  });
  const time = leads.map((h) => iso(issuedAtMs + h * MS_PER_HOUR));
  const control = forecastColumns(truth, memberErrorSeed(truthSeed, 0), issueIndex, issuedAtMs, leads);
  const answer: SeaStateExchange = {
    position: { lat: latitude, lon: longitude },
    issuedAt: iso(issuedAtMs),
    series: { time, ...control } as SeaStateExchange['series'],
  };
  if (members > 0) {
    answer.members = [];
    for (let m = 1; m <= members; m++) {
      const columns = forecastColumns(truth, memberErrorSeed(truthSeed, m), issueIndex, issuedAtMs, leads);
      answer.members.push({ member: m, series: columns as ExchangeMemberSeries });
    }
  }
  // The times carry the change from hourly to 3-hourly (the exchange has no single step).
  return answer;
}

const TRUTH_MARGIN_H = 24;

/** One run of the fake (the control or a member): the truth seen through the error fields of `errSeed`. */
function forecastColumns(
  truth: ReturnType<typeof generateSyntheticSea>,
  errSeed: number,
  issueIndex: number,
  issuedAtMs: number,
  leads: number[],
): Record<string, (number | null)[]> {
  const n = leads.length;
  const marginH = TRUTH_MARGIN_H;
  const columns = new Map<ExchangeSeriesKey, (number | null)[]>();
  for (const key of EXCHANGE_SERIES_KEYS) if (FAKE_VALUES[key]) columns.set(key, new Array<number | null>(n));
  const last = truth.hsM.length - 1;
  const truthParts = truth.partitions!;
  for (let r = 0; r < n; r++) {
    const h = leads[r];
    const tMs = issuedAtMs + h * MS_PER_HOUR;
    const tH = tMs / MS_PER_HOUR;
    const leadDays = h / 24;
    // Timing error: sample the truth at a shifted time (linear interpolation for Hs and wind,
    // nearest record for period and directions, which do not average well).
    const shiftH = (1 + 1.2 * leadDays) * errorField(errSeed, 1, issueIndex, tH, 36);
    const x = Math.min(last, Math.max(0, h + marginH + shiftH));
    const i0 = Math.min(last - 1, Math.floor(x));
    const f = x - i0;
    const near = f < 0.5 ? i0 : i0 + 1;
    const hsTrue = truth.hsM[i0] * (1 - f) + truth.hsM[i0 + 1] * f;
    const windTrue = truth.windMps[i0] * (1 - f) + truth.windMps[i0 + 1] * f;

    const eHs = (0.03 + 0.035 * leadDays) * errorField(errSeed, 2, issueIndex, tH, 30);
    const eWind = (0.04 + 0.035 * leadDays) * errorField(errSeed, 3, issueIndex, tH, 30);
    const eTp = 0.5 * (0.03 + 0.035 * leadDays) * errorField(errSeed, 4, issueIndex, tH, 40);
    const eDir = (4 + 3 * leadDays) * errorField(errSeed, 5, issueIndex, tH, 30);

    const hs = Math.min(25, Math.max(0.05, Math.round(hsTrue * Math.exp(eHs) * 100) / 100));
    let tp = truth.tpS[near] * Math.exp(eTp);
    tp = Math.max(tp, Math.sqrt(hs / (L0_PER_TP2 * MAX_STEEPNESS)));
    tp = Math.min(40, Math.max(0.5, Math.round(tp * 10) / 10));
    const wind = Math.min(99.9, Math.max(0, Math.round(windTrue * Math.exp(eWind) * 10) / 10));

    const sHs = Math.exp(eHs);
    const sTp = Math.exp(eTp);
    const parts = {
      windSea: fakePartition(truthParts.windSea, i0, f, near, sHs, sTp, eDir),
      swell1: fakePartition(truthParts.swell1, i0, f, near, sHs, sTp, eDir),
      swell2: fakePartition(truthParts.swell2, i0, f, near, sHs, sTp, eDir),
    };
    const record: FakeRecord = { hs, tp, wind, dirTrue: truth.dirDeg[near], windDirTrue: truth.windDirDeg[near], eDir, parts };
    for (const [key, column] of columns) column[r] = FAKE_VALUES[key]!(record);
  }
  return Object.fromEntries(columns);
}
