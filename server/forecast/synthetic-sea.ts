/**
 * Invented, realistic sea states for any position and period: the demo hindcast and the "truth"
 * behind the fake forecast service.
 *
 * Model (our own; the numbers are choices of a careful engineer, not fitted to any site):
 * - Season: a scale S(t) in metres that follows a cosine of the day of the year, largest on
 *   `roughestDayOfYear`. Every wave height below is proportional to S, so the long-run mean Hs of a
 *   season equals the climate's target for it (a northern-hemisphere temperate coast, offshore at
 *   about 40 m depth: about 1.0 m in June-August and 2.2 m in December-February by default).
 * - Weather systems: one per slot of (min + max spacing)/2 hours (5 days by default), its centre
 *   jittered by a quarter of (max - min) either way, so successive systems are 3-7 days apart.
 *   Each system's peak Hs is lognormal around the season's level (3-7 m in winter); a share of them
 *   (`calmShare`) are weak, which leaves calm spells. Hs rises over a Gaussian flank of 8-20 h and
 *   decays over 14-40 h. Its peak period follows from a peak steepness Hs/L0 between 1/34 and 1/22
 *   (L0 = g Tp^2 / 2 pi = 1.56 Tp^2); while growing the sea keeps that steepness (Tp ~ sqrt(Hs)),
 *   while decaying it keeps most of its period and turns swell-like. Its direction starts in the
 *   prevailing sector and veers clockwise through the system (1-2.5 deg/h, at most +-36 h of veer),
 *   as the wind does when a depression passes poleward of a northern-hemisphere site.
 *   Its wind peaks 2-7 h before the waves, at 1.0-1.3 times the wind whose fully developed
 *   Pierson-Moskowitz sea has the system's peak Hs (Hs = 0.21 U^2 / g, i.e. U = sqrt(Hs / 0.0214);
 *   fetch- and duration-limited seas need more wind than that).
 * - Swell events from distant storms: one per 4-day slot, long periods (11-16 s, shortening as the
 *   event passes, by dispersion), from west of the prevailing direction.
 * - A weak background swell and a local breeze (2-6 m/s) with its small wind sea.
 * - Components add by energy: Hs = sqrt(sum Hs_i^2); Tp is the peak period of the most energetic
 *   component (so Tp jumps between swell and wind sea as real peak periods do); the wave direction
 *   is the energy-weighted vector mean. Small hour-to-hour noise is added.
 * - Tp is raised where needed so that Hs/L0 <= 1/16, which keeps the rounded values within the
 *   sea-state steepness limit of 1/15 (DNV-RP-C205: Sp = 2 pi Hs / (g Tp^2) <= 1/15 for Tp <= 8 s,
 *   from memory).
 * - Partitions on request (docs/domain.md#partitions): wind sea = the breeze's sea and the weather
 *   systems' seas, swell 1 = the distant swell events, swell 2 = the background swell, each with its
 *   own Tp (its dominant component's) and energy-weighted direction.
 * - Values are rounded like real data: Hs to 0.01 m, Tp to 0.1 s, wind to 0.1 m/s, directions to 1 deg.
 *
 * Purity: every random draw is a hash of (seed, channel, storm or lattice index) and every value
 * is a function of the UTC time alone, so the value at a given instant never depends on the
 * `startMs`/`hours` of the call.
 */
import { hash01, normalFromUniforms, seed32, smoothNoise } from './seeded-noise';

/** Climate of the invented site; every field has a default (see {@link DEFAULT_SEA_CLIMATE}). */
export interface SeaClimate {
  /** Target mean Hs in m over the three months centred on the calmest day of the year (> 0). */
  summerMeanHsM: number;
  /** Target mean Hs in m over the three months centred on `roughestDayOfYear` (>= summerMeanHsM). */
  winterMeanHsM: number;
  /** Day of the year (0 = 1 January) with the roughest seas; about 15 for the northern hemisphere, 197 for the southern. */
  roughestDayOfYear: number;
  /** Centre of the prevailing direction sector, nautical coming-from, deg. */
  prevailingDirDeg: number;
  /** Standard deviation of the weather systems' directions about the prevailing one, deg. */
  directionSpreadDeg: number;
  /** Shortest time between the peaks of successive weather systems, h. */
  stormSpacingMinH: number;
  /** Longest time between the peaks of successive weather systems, h (> stormSpacingMinH). */
  stormSpacingMaxH: number;
  /** Share of weather systems that stay weak (0-1), which leaves calm spells. */
  calmShare: number;
}

/** A northern-hemisphere temperate coast facing south-west, offshore at about 40 m depth. */
export const DEFAULT_SEA_CLIMATE: Readonly<SeaClimate> = Object.freeze({
  summerMeanHsM: 1.0,
  winterMeanHsM: 2.2,
  roughestDayOfYear: 15,
  prevailingDirDeg: 245,
  directionSpreadDeg: 28,
  stormSpacingMinH: 72,
  stormSpacingMaxH: 168,
  calmShare: 0.15,
});

export interface SyntheticSeaRequest {
  /** First record time, ms since 1970-01-01T00:00Z (UTC). */
  startMs: number;
  /** Length of the period in hours (>= 0); the series has floor(hours * 60 / stepMinutes) records. */
  hours: number;
  /** Time step in minutes (> 0), default 60. */
  stepMinutes?: number;
  /** Any finite number; equal seeds give equal seas. */
  seed: number;
  /** Overrides of {@link DEFAULT_SEA_CLIMATE}. */
  climate?: Partial<SeaClimate>;
  /** Also give the sea's partitions (docs/domain.md#partitions); the totals are the same either way. */
  partitions?: boolean;
}

/** One partition over the series: Hs (m, 0.01 m; 0 = absent), Tp (s, 0.1 s; NaN when absent), direction (deg, whole; NaN when absent). */
export interface SyntheticPartition {
  hsM: Float64Array;
  tpS: Float64Array;
  dirDeg: Float64Array;
}

/**
 * The partitions of the invented sea (docs/domain.md#partitions): the wind sea is the local
 * breeze's sea and the weather systems' seas (they follow the wind), swell 1 the long-period
 * swell from distant storms (11-16 s, from west of the prevailing direction), swell 2 the weak
 * background swell (8-11 s). Each partition's Hs carries the same short-term noise factor as the
 * total, so sqrt(sum Hs_i^2) equals the total Hs up to the 0.01 m rounding of each.
 */
export interface SyntheticPartitions {
  windSea: SyntheticPartition;
  swell1: SyntheticPartition;
  swell2: SyntheticPartition;
}

/** Columnar sea-state series; all arrays have the same length. */
export interface SyntheticSeaSeries {
  /** Record times, ms since 1970-01-01T00:00Z. */
  timeMs: Float64Array;
  /** Significant wave height Hm0, m (0.01 m resolution). */
  hsM: Float64Array;
  /** Peak period, s (0.1 s resolution). */
  tpS: Float64Array;
  /** Mean wave direction, nautical coming-from, deg in [0, 360), whole degrees. */
  dirDeg: Float64Array;
  /** Wind speed at 10 m, m/s (0.1 m/s resolution), 2-20 m/s. */
  windMps: Float64Array;
  /** Wind direction, nautical coming-from, deg in [0, 360), whole degrees. */
  windDirDeg: Float64Array;
  /** The partitions, when the request asked for them. */
  partitions?: SyntheticPartitions;
}

function partitionArrays(n: number): SyntheticPartition {
  return { hsM: new Float64Array(n), tpS: new Float64Array(n), dirDeg: new Float64Array(n) };
}

/** One partition accumulated over its components: energy, the dominant component's Tp, the energy-weighted direction vector. */
class PartitionSum {
  e = 0;
  domE = 0;
  tp = NaN;
  dx = 0;
  dy = 0;
  reset(): void {
    this.e = 0;
    this.domE = 0;
    this.tp = NaN;
    this.dx = 0;
    this.dy = 0;
  }
  add(e: number, tp: number, dirDeg: number): void {
    this.e += e;
    if (e > this.domE) {
      this.domE = e;
      this.tp = tp;
    }
    this.dx += e * Math.sin(dirDeg * DEG);
    this.dy += e * Math.cos(dirDeg * DEG);
  }
  /** Writes the partition at record i with the total's noise factor; below 0.01 m it is absent. */
  write(out: SyntheticPartition, i: number, factor: number, noiseTp: number): void {
    const hs = Math.round(Math.sqrt(this.e) * factor * 100) / 100;
    if (!(hs >= 0.01)) {
      out.hsM[i] = 0;
      out.tpS[i] = NaN;
      out.dirDeg[i] = NaN;
      return;
    }
    out.hsM[i] = hs;
    const tp = Math.max(this.tp * noiseTp, Math.sqrt(hs / (L0_PER_TP2 * MAX_STEEPNESS)), 2.5);
    out.tpS[i] = Math.min(20, Math.round(tp * 10) / 10);
    out.dirDeg[i] = Math.round(wrap360(Math.atan2(this.dx, this.dy) / DEG)) % 360;
  }
}

const MS_PER_HOUR = 3_600_000;
const DAYS_PER_YEAR = 365.2425;
/** Deep-water wavelength factor g / (2 pi) with g = 9.81 m/s2: L0 = 1.5613 * Tp^2 (m). */
const L0_PER_TP2 = 9.81 / (2 * Math.PI);
/** Steepness the generator enforces, Hs/L0 <= 1/16, leaving room for rounding below 1/15. */
const MAX_STEEPNESS = 1 / 16;
/** Pierson-Moskowitz fully developed sea: Hs = 0.21 U^2 / g = 0.0214 U^2 (U in m/s, Hs in m). */
const PM_HS_PER_U2 = 0.21 / 9.81;
/**
 * Divides the unit model so that its long-run mean Hs is 1 when the seasonal scale is 1. Found by
 * running the model with summer = winter = 1 over 200 years and several seeds (mean 1.00 +- 0.01).
 */
const UNIT_MEAN_HS = 1.152;
const DEG = Math.PI / 180;

/** Seeded hash channels: one per independent quantity. */
const Ch = {
  StormJitter: 1,
  StormPeak1: 2,
  StormPeak2: 3,
  StormCalm: 4,
  StormRise: 5,
  StormDecay: 6,
  StormSteep: 7,
  StormDir1: 8,
  StormDir2: 9,
  StormVeer: 10,
  StormLag: 11,
  StormWind: 12,
  SwellJitter: 13,
  SwellPeak: 14,
  SwellWidth: 15,
  SwellTp: 16,
  SwellDir: 17,
  BgSwellHs: 18,
  BgSwellTp: 19,
  BgSwellDir: 20,
  BreezeSpeed: 21,
  BreezeDirX: 22,
  BreezeDirY: 23,
  FastHs: 24,
  FastTp: 25,
  FastDir: 26,
  FastWind: 27,
  FastWindDir: 28,
} as const;

const SWELL_SLOT_H = 96;
const SWELL_JITTER_H = 30;
/** Gaussian flanks are cut at 4 sigma: exp(-8) = 3e-4 of the peak. */
const CUT_SIGMAS = 4;
const STORM_RISE_MIN_H = 8;
const STORM_RISE_MAX_H = 20;
const STORM_DECAY_MIN_H = 14;
const STORM_DECAY_MAX_H = 40;
const STORM_LAG_MAX_H = 7;
const SWELL_WIDTH_MIN_H = 18;
const SWELL_WIDTH_MAX_H = 42;
const VEER_CLAMP_H = 36;

function checkClimate(c: SeaClimate): void {
  const positive = (name: keyof SeaClimate) => {
    if (!(Number.isFinite(c[name]) && c[name] > 0)) throw new RangeError(`climate.${name} must be a positive number, got ${c[name]}`);
  };
  positive('summerMeanHsM');
  positive('winterMeanHsM');
  positive('stormSpacingMinH');
  positive('stormSpacingMaxH');
  if (c.winterMeanHsM < c.summerMeanHsM) throw new RangeError('climate.winterMeanHsM must not be below climate.summerMeanHsM');
  if (c.stormSpacingMaxH <= c.stormSpacingMinH) throw new RangeError('climate.stormSpacingMaxH must exceed climate.stormSpacingMinH');
  for (const name of ['roughestDayOfYear', 'prevailingDirDeg', 'directionSpreadDeg'] as const) {
    if (!Number.isFinite(c[name])) throw new RangeError(`climate.${name} must be a finite number, got ${c[name]}`);
  }
  if (!(c.calmShare >= 0 && c.calmShare <= 1)) throw new RangeError(`climate.calmShare must be within 0-1, got ${c.calmShare}`);
}

/**
 * Seasonal scale S(t) in metres. With s(t) = (1 + cos(2 pi (day - roughestDay) / 365.2425)) / 2,
 * S = a + b s. The mean of s over the 91.3 days centred on its peak is (1 + sinc)/2 with
 * sinc = sin(x)/x, x = pi * 91.3 / 365.2425 = pi/4, i.e. 0.9502; over the 3 months centred on the trough it
 * is 0.0498. a and b are solved so those two 3-month means hit the climate's targets.
 */
function seasonalScale(c: SeaClimate): (timeH: number) => number {
  const x = Math.PI / 4;
  const hi = (1 + Math.sin(x) / x) / 2;
  const lo = 1 - hi;
  const b = (c.winterMeanHsM - c.summerMeanHsM) / (hi - lo);
  const a = c.summerMeanHsM - b * lo;
  const w = (2 * Math.PI) / DAYS_PER_YEAR;
  return (timeH) => a + (b * (1 + Math.cos(w * (timeH / 24 - c.roughestDayOfYear)))) / 2;
}

/** A lognormal multiplier with median 1 and log-standard deviation sigma from two uniforms. */
function lognormal(u1: number, u2: number, sigma: number): number {
  return Math.exp(sigma * normalFromUniforms(u1, u2));
}

function wrap360(deg: number): number {
  const r = deg % 360;
  return r < 0 ? r + 360 : r;
}

/**
 * Generates an invented hourly (or other step) sea-state series.
 *
 * @param request start time (ms UTC), length (h), step (min, default 60), seed and climate overrides
 * @returns columnar series, see {@link SyntheticSeaSeries}; value ranges: Hs 0.05-~10 m,
 *   Tp 2.5-20 s with Hs / (1.56 Tp^2) <= 1/15, wind 2-20 m/s, directions [0, 360)
 * @throws RangeError for a non-finite start, a negative or non-finite length, a step that is not
 *   positive, more than 10 million records, or an invalid climate
 * @example generateSyntheticSea({ startMs: Date.UTC(2025, 0, 1), hours: 24, seed: 1 }).hsM.length // 24
 */
export function generateSyntheticSea(request: SyntheticSeaRequest): SyntheticSeaSeries {
  const { startMs, hours } = request;
  const stepMinutes = request.stepMinutes ?? 60;
  if (!Number.isFinite(startMs)) throw new RangeError(`startMs must be a finite number, got ${startMs}`);
  if (!(Number.isFinite(hours) && hours >= 0)) throw new RangeError(`hours must be a finite number >= 0, got ${hours}`);
  if (!(Number.isFinite(stepMinutes) && stepMinutes > 0)) throw new RangeError(`stepMinutes must be a positive number, got ${stepMinutes}`);
  const n = Math.floor((hours * 60) / stepMinutes + 1e-9);
  if (n > 10_000_000) throw new RangeError(`too many records requested (${n}); at most 10,000,000`);
  const climate: SeaClimate = { ...DEFAULT_SEA_CLIMATE, ...request.climate };
  checkClimate(climate);
  const seed = seed32(request.seed);
  const scale = seasonalScale(climate);
  const hsNorm = 1 / UNIT_MEAN_HS;

  const out: SyntheticSeaSeries = {
    timeMs: new Float64Array(n),
    hsM: new Float64Array(n),
    tpS: new Float64Array(n),
    dirDeg: new Float64Array(n),
    windMps: new Float64Array(n),
    windDirDeg: new Float64Array(n),
  };
  const parts: SyntheticPartitions | null = request.partitions
    ? { windSea: partitionArrays(n), swell1: partitionArrays(n), swell2: partitionArrays(n) }
    : null;
  if (parts) out.partitions = parts;
  const windSea = new PartitionSum();
  const swell1 = new PartitionSum();
  const swell2 = new PartitionSum();
  if (n === 0) return out;

  const stepMs = stepMinutes * 60_000;
  const firstH = startMs / MS_PER_HOUR;
  const lastH = (startMs + (n - 1) * stepMs) / MS_PER_HOUR;

  // --- Weather systems, indexed by slot k; parameters drawn from hash(seed, channel, k). ---
  const slotH = (climate.stormSpacingMinH + climate.stormSpacingMaxH) / 2;
  const jitterH = (climate.stormSpacingMaxH - climate.stormSpacingMinH) / 4;
  const backH = CUT_SIGMAS * STORM_DECAY_MAX_H + jitterH + STORM_LAG_MAX_H;
  const aheadH = CUT_SIGMAS * STORM_RISE_MAX_H + jitterH + STORM_LAG_MAX_H;
  const kFirst = Math.floor((firstH - backH) / slotH) - 1;
  const kLast = Math.floor((lastH + aheadH) / slotH) + 1;
  const ns = kLast - kFirst + 1;
  const sCentre = new Float64Array(ns);
  const sPeak = new Float64Array(ns);
  const sRise = new Float64Array(ns);
  const sDecay = new Float64Array(ns);
  const sTp = new Float64Array(ns);
  const sDir = new Float64Array(ns);
  const sVeer = new Float64Array(ns);
  const sLag = new Float64Array(ns);
  const sWind = new Float64Array(ns);
  for (let j = 0; j < ns; j++) {
    const k = kFirst + j;
    const centre = (k + 0.5) * slotH + jitterH * (2 * hash01(seed, Ch.StormJitter, k) - 1);
    const calm = hash01(seed, Ch.StormCalm, k) < climate.calmShare ? 0.3 : 1;
    // Peak level: lognormal (log-sd 0.25) around the season's scale; the calibration constant makes
    // the long-run mean come out at the target.
    const unitPeak = 2.35 * lognormal(hash01(seed, Ch.StormPeak1, k), hash01(seed, Ch.StormPeak2, k), 0.25) * calm;
    const peakM = unitPeak * scale(centre) * hsNorm;
    const steep = 1 / (22 + 12 * hash01(seed, Ch.StormSteep, k));
    sCentre[j] = centre;
    sPeak[j] = peakM;
    sRise[j] = STORM_RISE_MIN_H + (STORM_RISE_MAX_H - STORM_RISE_MIN_H) * hash01(seed, Ch.StormRise, k);
    sDecay[j] = STORM_DECAY_MIN_H + (STORM_DECAY_MAX_H - STORM_DECAY_MIN_H) * hash01(seed, Ch.StormDecay, k);
    sTp[j] = Math.sqrt(peakM / (L0_PER_TP2 * steep));
    const z = normalFromUniforms(hash01(seed, Ch.StormDir1, k), hash01(seed, Ch.StormDir2, k));
    sDir[j] = climate.prevailingDirDeg + climate.directionSpreadDeg * Math.max(-3, Math.min(3, z));
    sVeer[j] = 1 + 1.5 * hash01(seed, Ch.StormVeer, k);
    sLag[j] = 2 + (STORM_LAG_MAX_H - 2) * hash01(seed, Ch.StormLag, k);
    sWind[j] = Math.sqrt(peakM / PM_HS_PER_U2) * (1 + 0.3 * hash01(seed, Ch.StormWind, k));
  }

  // --- Distant swell events, one per 4-day slot. ---
  const wFirst = Math.floor((firstH - CUT_SIGMAS * SWELL_WIDTH_MAX_H - SWELL_JITTER_H) / SWELL_SLOT_H) - 1;
  const wLast = Math.floor((lastH + CUT_SIGMAS * SWELL_WIDTH_MAX_H + SWELL_JITTER_H) / SWELL_SLOT_H) + 1;
  const nw = wLast - wFirst + 1;
  const wCentre = new Float64Array(nw);
  const wPeak = new Float64Array(nw);
  const wWidth = new Float64Array(nw);
  const wTp = new Float64Array(nw);
  const wDir = new Float64Array(nw);
  for (let j = 0; j < nw; j++) {
    const k = wFirst + j;
    const centre = (k + 0.5) * SWELL_SLOT_H + SWELL_JITTER_H * (2 * hash01(seed, Ch.SwellJitter, k) - 1);
    const u = hash01(seed, Ch.SwellPeak, k);
    wCentre[j] = centre;
    wPeak[j] = (0.25 + 0.75 * u * u) * scale(centre) * hsNorm;
    wWidth[j] = SWELL_WIDTH_MIN_H + (SWELL_WIDTH_MAX_H - SWELL_WIDTH_MIN_H) * hash01(seed, Ch.SwellWidth, k);
    wTp[j] = 11 + 5 * hash01(seed, Ch.SwellTp, k);
    wDir[j] = climate.prevailingDirDeg + 20 + 12 * (2 * hash01(seed, Ch.SwellDir, k) - 1);
  }

  for (let i = 0; i < n; i++) {
    const tMs = startMs + i * stepMs;
    const tH = tMs / MS_PER_HOUR;
    const seasonM = scale(tH) * hsNorm;

    // Background swell: weak, slowly varying (2.5-day lattice).
    const bgHs = seasonM * (0.3 + 0.12 * smoothNoise(seed, Ch.BgSwellHs, tH, 60));
    const bgTp = 9.5 + 1.5 * smoothNoise(seed, Ch.BgSwellTp, tH, 72);
    const bgDir = climate.prevailingDirDeg + 10 + 15 * smoothNoise(seed, Ch.BgSwellDir, tH, 96);
    // Local breeze 2-6 m/s and its small, short fetch-limited sea.
    const breeze = 4 + 2 * smoothNoise(seed, Ch.BreezeSpeed, tH, 9);
    const breezeDir = Math.atan2(smoothNoise(seed, Ch.BreezeDirX, tH, 20), smoothNoise(seed, Ch.BreezeDirY, tH, 20)) / DEG;
    const locHs = 0.35 * PM_HS_PER_U2 * breeze * breeze;
    const locTp = 2.2 + 0.35 * breeze;
    if (parts) {
      windSea.reset();
      swell1.reset();
      swell2.reset();
      windSea.add(locHs * locHs, locTp, breezeDir);
      swell2.add(bgHs * bgHs, bgTp, bgDir);
    }

    let energy = bgHs * bgHs + locHs * locHs;
    let domE = bgHs * bgHs;
    let domTp = bgTp;
    if (locHs * locHs > domE) {
      domE = locHs * locHs;
      domTp = locTp;
    }
    let dx = bgHs * bgHs * Math.sin(bgDir * DEG) + locHs * locHs * Math.sin(breezeDir * DEG);
    let dy = bgHs * bgHs * Math.cos(bgDir * DEG) + locHs * locHs * Math.cos(breezeDir * DEG);
    let wind2 = breeze * breeze;
    let wx = breeze * breeze * Math.sin(breezeDir * DEG);
    let wy = breeze * breeze * Math.cos(breezeDir * DEG);

    // Weather systems near t (the index range depends on t only, never on the call window).
    const k0 = Math.floor((tH - backH) / slotH) - kFirst;
    const k1 = Math.floor((tH + aheadH) / slotH) + 1 - kFirst;
    for (let j = Math.max(0, k0); j <= k1 && j < ns; j++) {
      const s = tH - sCentre[j];
      const sigma = s < 0 ? sRise[j] : sDecay[j];
      if (Math.abs(s) < CUT_SIGMAS * sigma) {
        const g = Math.exp(-0.5 * (s / sigma) * (s / sigma));
        const hs = sPeak[j] * g;
        const e = hs * hs;
        const tp = s < 0 ? sTp[j] * Math.sqrt(Math.max(g, 0.36)) : sTp[j] * (0.88 + 0.12 * g);
        const dir = sDir[j] + sVeer[j] * Math.max(-VEER_CLAMP_H, Math.min(VEER_CLAMP_H, s));
        energy += e;
        if (e > domE) {
          domE = e;
          domTp = tp;
        }
        dx += e * Math.sin(dir * DEG);
        dy += e * Math.cos(dir * DEG);
        if (parts) windSea.add(e, tp, dir);
      }
      // The wind leads the waves by sLag hours and falls off a little faster than they do.
      const sw = s + sLag[j];
      const sigmaW = sw < 0 ? 0.9 * sRise[j] : 0.8 * sDecay[j];
      if (Math.abs(sw) < CUT_SIGMAS * sigmaW) {
        const u = sWind[j] * Math.exp(-0.5 * (sw / sigmaW) * (sw / sigmaW));
        const u2 = u * u;
        const wdir = sDir[j] + sVeer[j] * Math.max(-VEER_CLAMP_H, Math.min(VEER_CLAMP_H, sw));
        wind2 += u2;
        wx += u2 * Math.sin(wdir * DEG);
        wy += u2 * Math.cos(wdir * DEG);
      }
    }

    // Distant swell events; the period shortens by 1 s per day as the event passes (dispersion:
    // the longest waves arrive first), within +-2 s.
    const w0 = Math.floor((tH - CUT_SIGMAS * SWELL_WIDTH_MAX_H - SWELL_JITTER_H) / SWELL_SLOT_H) - wFirst;
    const w1 = Math.floor((tH + CUT_SIGMAS * SWELL_WIDTH_MAX_H + SWELL_JITTER_H) / SWELL_SLOT_H) + 1 - wFirst;
    for (let j = Math.max(0, w0); j <= w1 && j < nw; j++) {
      const s = tH - wCentre[j];
      if (Math.abs(s) >= CUT_SIGMAS * wWidth[j]) continue;
      const hs = wPeak[j] * Math.exp(-0.5 * (s / wWidth[j]) * (s / wWidth[j]));
      const e = hs * hs;
      energy += e;
      if (e > domE) {
        domE = e;
        domTp = wTp[j] - Math.max(-2, Math.min(2, s / 24));
      }
      dx += e * Math.sin(wDir[j] * DEG);
      dy += e * Math.cos(wDir[j] * DEG);
      if (parts) swell1.add(e, wTp[j] - Math.max(-2, Math.min(2, s / 24)), wDir[j]);
    }

    // Small short-term variability (3-5 h lattices), then rounding like real data.
    const hsNoise = 1 + 0.05 * smoothNoise(seed, Ch.FastHs, tH, 3);
    let hsOut = Math.sqrt(energy) * hsNoise;
    hsOut = Math.max(0.05, Math.round(hsOut * 100) / 100);
    const tpNoise = 1 + 0.03 * smoothNoise(seed, Ch.FastTp, tH, 4);
    let tpOut = domTp * tpNoise;
    tpOut = Math.max(tpOut, Math.sqrt(hsOut / (L0_PER_TP2 * MAX_STEEPNESS)), 2.5);
    tpOut = Math.min(20, Math.round(tpOut * 10) / 10);
    const dirOut = Math.atan2(dx, dy) / DEG + 4 * smoothNoise(seed, Ch.FastDir, tH, 3);
    // Wind speeds combine as root-sum-square, then a soft cap keeps them at or below 20 m/s.
    let windOut = Math.sqrt(wind2) * (1 + 0.06 * smoothNoise(seed, Ch.FastWind, tH, 3));
    if (windOut > 14) windOut = 14 + 6 * Math.tanh((windOut - 14) / 6);
    windOut = Math.min(20, Math.max(2, Math.round(windOut * 10) / 10));
    const windDirOut = Math.atan2(wx, wy) / DEG + 6 * smoothNoise(seed, Ch.FastWindDir, tH, 3);

    if (parts) {
      windSea.write(parts.windSea, i, hsNoise, tpNoise);
      swell1.write(parts.swell1, i, hsNoise, tpNoise);
      swell2.write(parts.swell2, i, hsNoise, tpNoise);
    }
    out.timeMs[i] = tMs;
    out.hsM[i] = hsOut;
    out.tpS[i] = tpOut;
    out.dirDeg[i] = Math.round(wrap360(dirOut)) % 360;
    out.windMps[i] = windOut;
    out.windDirDeg[i] = Math.round(wrap360(windDirOut)) % 360;
  }
  return out;
}
