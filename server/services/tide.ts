/**
 * Tide at a worksite (docs/domain.md#tide): predictions by the harmonic method with
 * @neaps/tide-predictor, from the coordinator's constants or the nearest station of
 * @neaps/tide-database.
 *
 * eta(t) = Z0 + sum_i f_i*H_i*cos(V0_i + u_i + omega_i*(t - t0) - g_i) (Schureman 1958, "Manual of
 * Harmonic Analysis and Prediction of Tides"). The package computes the astronomical arguments and
 * the nodal factors f, u; we ask it for Schureman's nodal corrections (`nodeCorrections:
 * 'schureman'`, the package's other choice is the IHO table) and take them as it computes them.
 * The package (0.11.0) takes V0 at a span's start and renews f and u every 24 hours within the span
 * (at each day's middle), so they follow the 18.6-year cycle; long spans are predicted in chunks of
 * at most 31 days, which keeps each call's list of points short.
 *
 * Cautions to show with every prediction: predicted tide excludes surge; not for navigation.
 */
import { constituents as knownConstituents, createTidePredictor, useStation } from '@neaps/tide-predictor';
import { near, stationsById } from '@neaps/tide-database';
import type { TideExtremes } from '../../shared/engine';
import type { CurrentStationInfo, TideAnswer, TideStationInfo } from '../../shared/api-types-sites';
import type { WorksiteTideInput } from '../../shared/schemas/sites';
import { HttpError } from '../http/errors';

export type { CurrentStationInfo, TideAnswer, TideStationInfo };

/** Nodal corrections the predictions use (named in docs/domain.md#tide). */
export const TIDE_NODE_CORRECTIONS = 'schureman' as const;
/** A station farther than this from the worksite gets a warning, km (docs/domain.md#tide). */
export const TIDE_STATION_FAR_KM = 20;
/** The main constituents a table should have; a station without one of them is "incomplete". */
export const TIDE_MAIN_CONSTITUENTS = ['M2', 'S2', 'K1', 'O1'] as const;
/** How far around a worksite to look for stations, km. */
export const TIDE_STATION_SEARCH_KM = 200;
/** Words shown beside every tide figure. */
export const TIDE_CAUTIONS = [
  'Predicted astronomical tide: storm surge and other weather effects are not included.',
  'Not for navigation: decision support only; the master decides on under-keel clearance.',
] as const;

const HOUR_MS = 3_600_000;
const CHUNK_MS = 31 * 86_400_000;

interface LevelPoint {
  time: Date;
  level: number;
}
interface ExtremePoint {
  time: Date;
  level: number;
  high: boolean;
}

/** One worksite's predictor, whichever source it has. */
export interface TidePredictor {
  /** Levels on a regular grid from start to end inclusive, m above chart datum. */
  timeline(startMs: number, endMs: number, stepS: number): LevelPoint[];
  /** High and low waters between start and end. */
  extremes(startMs: number, endMs: number): ExtremePoint[];
  station: TideStationInfo | null;
  /** A key that changes whenever the prediction would (for caches). */
  key: string;
}

const toRad = Math.PI / 180;
/** Great-circle distance, km (haversine, mean Earth radius 6371.0 km). */
function distanceKm(lat1: number, lon1: number, lat2: number, lon2: number): number {
  const a =
    Math.sin(((lat2 - lat1) * toRad) / 2) ** 2 +
    Math.cos(lat1 * toRad) * Math.cos(lat2 * toRad) * Math.sin(((lon2 - lon1) * toRad) / 2) ** 2;
  return 2 * 6371.0 * Math.asin(Math.min(1, Math.sqrt(a)));
}

type DbStation = NonNullable<ReturnType<typeof stationsById.get>>;

function stationInfo(s: DbStation, km: number | null): TideStationInfo {
  const warnings: string[] = [];
  if (km !== null && km > TIDE_STATION_FAR_KM)
    warnings.push(
      `The station is ${km.toFixed(1)} km away (over ${TIDE_STATION_FAR_KM} km): the tide at the worksite may differ in time and height.`,
    );
  const names = new Set(s.harmonic_constituents.map((c) => c.name.toUpperCase()));
  const missing = TIDE_MAIN_CONSTITUENTS.filter((m) => !names.has(m));
  if (s.type === 'subordinate')
    warnings.push(`A subordinate station: its tide is its reference station's, shifted by time and height offsets.`);
  else if (missing.length > 0) warnings.push(`Incomplete constants: ${missing.join(', ')} missing.`);
  if (!s.chart_datum) warnings.push('The station names no chart datum: levels are referred to its mean sea level.');
  return {
    id: s.id,
    name: s.name,
    distanceKm: km,
    datum: s.chart_datum ?? null,
    latitude: s.latitude,
    longitude: s.longitude,
    kind: s.kind,
    type: s.type,
    constituents: s.harmonic_constituents.length,
    source: s.source.name,
    attribution: s.attribution,
    warnings,
  };
}

/** Tide stations within {@link TIDE_STATION_SEARCH_KM} of a position, nearest first. */
export function nearbyTideStations(
  latitude: number,
  longitude: number,
  maxResults = 5,
  kind: 'tide' | 'current' = 'tide',
): TideStationInfo[] {
  return near({ lat: latitude, lon: longitude, maxDistance: TIDE_STATION_SEARCH_KM, maxResults, filter: (s) => s.kind === kind }).map(
    ([s, km]) => stationInfo(s, km),
  );
}

/**
 * Checks a worksite's tide against the package: every constituent name known (400 naming
 * `tide.constituents.<i>.name`), the station id in the database (400 naming `tide.stationId`).
 */
export function checkTideInput(tide: WorksiteTideInput | null | undefined): void {
  if (!tide) return;
  if (tide.source === 'constants') {
    (tide.constituents ?? []).forEach((c, i) => {
      if (!(c.name in knownConstituents) && !(c.name.toUpperCase() in knownConstituents)) {
        const field = `tide.constituents.${i}.name`;
        throw new HttpError('validation', `Invalid body: ${field}: unknown constituent ${c.name}`, [
          { field, message: `Unknown constituent ${c.name} (use names such as M2, S2, N2, K1, O1)` },
        ]);
      }
    });
  }
  if (tide.source === 'station' && !stationsById.has(tide.stationId ?? '')) {
    throw new HttpError('validation', `Invalid body: tide.stationId: no tide station ${tide.stationId}`, [
      { field: 'tide.stationId', message: `No tide station with the id ${tide.stationId}` },
    ]);
  }
}

/** The package's spelling of a constituent name ('m2' -> 'M2'). */
function packageName(name: string): string {
  if (name in knownConstituents) return name;
  return name.toUpperCase() in knownConstituents ? name.toUpperCase() : name;
}

/**
 * The predictor of a worksite's tide, or null for none. `position` gives the station's distance.
 * @throws HttpError 400 for an unknown constituent or station (see {@link checkTideInput}).
 */
export function tidePredictor(
  tide: WorksiteTideInput | null | undefined,
  position?: { latitude: number | null; longitude: number | null },
): TidePredictor | null {
  if (!tide || tide.source === 'none') return null;
  checkTideInput(tide);
  if (tide.source === 'constants') {
    const list = (tide.constituents ?? []).map((c) => ({ name: packageName(c.name), amplitude: c.amplitude, phase: c.phase }));
    const p = createTidePredictor(list, { offset: tide.z0 ?? 0, nodeCorrections: TIDE_NODE_CORRECTIONS });
    return {
      timeline: (a, b, stepS) => p.getTimelinePrediction({ start: new Date(a), end: new Date(b), timeFidelity: stepS }),
      extremes: (a, b) => p.getExtremesPrediction({ start: new Date(a), end: new Date(b) }),
      station: null,
      key: `c:${tide.z0}:${list.map((c) => `${c.name}/${c.amplitude}/${c.phase}`).join(',')}:${TIDE_NODE_CORRECTIONS}`,
    };
  }
  const s = stationsById.get(tide.stationId ?? '')!;
  const km =
    position?.latitude != null && position.longitude != null
      ? distanceKm(position.latitude, position.longitude, s.latitude, s.longitude)
      : null;
  // The database's station is the predictor's station type (same fields); the cast bridges the two packages' declarations.
  const sp = useStation(s as unknown as Parameters<typeof useStation>[0]);
  return {
    timeline: (a, b, stepS) =>
      sp.getTimelinePrediction({ start: new Date(a), end: new Date(b), timeFidelity: stepS, nodeCorrections: TIDE_NODE_CORRECTIONS })
        .timeline,
    extremes: (a, b) => sp.getExtremesPrediction({ start: new Date(a), end: new Date(b), nodeCorrections: TIDE_NODE_CORRECTIONS }).extremes,
    station: stationInfo(s, km),
    key: `s:${s.id}:${TIDE_NODE_CORRECTIONS}`,
  };
}

/**
 * Predicted level at each time, m above chart datum (NaN never: every time gets a level).
 *
 * Chunks of at most 31 days, each a span of its own (the package takes V0 at a span's start and
 * renews the nodal factors f, u every 24 hours within it); within a chunk, times all on whole hours take an hourly timeline, other times a 5-minute one with linear
 * interpolation between its points (the straight line misses a sine of amplitude A by at most
 * A*(omega*dt)^2/8: 0.7 mm for an M2 amplitude of 3 m).
 */
export function predictLevels(p: TidePredictor, timeMs: Float64Array): Float64Array {
  const n = timeMs.length;
  const out = new Float64Array(n);
  let i = 0;
  while (i < n) {
    const end = timeMs[i] + CHUNK_MS;
    let j = i;
    let onHour = true;
    while (j < n && timeMs[j] < end) {
      if (timeMs[j] % HOUR_MS !== 0) onHour = false;
      j++;
    }
    const stepMs = onHour ? HOUR_MS : 300_000;
    const g0 = Math.floor(timeMs[i] / stepMs) * stepMs;
    const g1 = Math.max(g0 + stepMs, Math.ceil(timeMs[j - 1] / stepMs) * stepMs);
    const line = p.timeline(g0, g1, stepMs / 1000);
    for (let k = i; k < j; k++) {
      const x = (timeMs[k] - g0) / stepMs;
      const a = Math.floor(x);
      const f = x - a;
      const la = line[a]?.level ?? NaN;
      out[k] = f === 0 ? la : la * (1 - f) + (line[a + 1]?.level ?? la) * f;
    }
    i = j;
  }
  return out;
}

/** Predicted high and low waters from `fromMs` to `toMs`, for the engine's tide windows. */
export function predictExtremes(p: TidePredictor, fromMs: number, toMs: number): TideExtremes {
  const high: number[] = [];
  const low: number[] = [];
  for (let a = fromMs; a < toMs; a += CHUNK_MS) {
    const b = Math.min(toMs, a + CHUNK_MS);
    for (const e of p.extremes(a, b)) {
      const t = e.time.getTime();
      const list = e.high ? high : low;
      // Chunks meet at one instant: an extreme found by both is kept once.
      if (list.length === 0 || t > list[list.length - 1]) list.push(t);
    }
  }
  return { highMs: Float64Array.from(high), lowMs: Float64Array.from(low), fromMs, toMs };
}

/**
 * Levels every 15 min (spans up to 7 days) or every hour (longer), and the extremes, from `fromMs`
 * to `toMs`; null when the worksite has no tide.
 */
export function tideAnswer(
  tide: WorksiteTideInput | null,
  position: { latitude: number | null; longitude: number | null },
  fromMs: number,
  toMs: number,
): TideAnswer | null {
  const p = tidePredictor(tide, position);
  if (!p || !tide) return null;
  const stepMs = toMs - fromMs <= 7 * 86_400_000 ? 15 * 60_000 : HOUR_MS;
  const start = Math.ceil(fromMs / stepMs) * stepMs;
  const count = Math.max(0, Math.floor((toMs - start) / stepMs) + 1);
  const times = new Float64Array(count);
  for (let k = 0; k < count; k++) times[k] = start + k * stepMs;
  const levels = predictLevels(p, times);
  const extremes = p
    .extremes(fromMs, toMs)
    .map((e) => ({ time: e.time.toISOString(), level: e.level, kind: e.high ? ('high' as const) : ('low' as const) }));
  return {
    times: Array.from(times, (t) => new Date(t).toISOString()),
    waterLevel: Array.from(levels),
    extremes,
    datum: p.station?.datum ?? tide.datum,
    station: p.station,
    stepMinutes: stepMs / 60_000,
    cautions: TIDE_CAUTIONS,
  };
}

/**
 * A current station farther than this from the worksite gets a warning, km (docs/domain.md#tide):
 * tidal streams change over far shorter distances than the tide's height (a channel, a headland, a
 * bank), so the limit is a quarter of the tide station's (common practice, no source).
 */
export const CURRENT_STATION_FAR_KM = 5;
/** One international knot, m/s: 1852 m per hour (the international nautical mile of 1929). */
export const KNOT_MPS = 1852 / 3600;
/** Words shown beside every predicted current. */
export const CURRENT_CAUTIONS = [
  'Predicted tidal current only: wind-driven current, storm surge current and river flow are not included.',
  'Not for navigation: decision support only; the master decides.',
  'The station gives the current at its own place and depth; the worksite may differ.',
] as const;

/** A current station the app can predict: a reference current station with harmonic constituents. */
function predictableCurrent(s: DbStation): boolean {
  return s.kind === 'current' && s.type === 'reference' && s.harmonic_constituents.length > 0;
}

function currentStationInfo(s: DbStation, km: number | null): CurrentStationInfo {
  const base = stationInfo(s, null);
  const warnings = base.warnings.filter((w) => !w.startsWith('The station names no chart datum'));
  if (km !== null && km > CURRENT_STATION_FAR_KM)
    warnings.unshift(
      `The current station is ${km.toFixed(1)} km away (over ${CURRENT_STATION_FAR_KM} km): tidal streams change over short distances, the current at the worksite may differ in speed, direction and time.`,
    );
  const c = s.current;
  if (c?.flood_direction == null || c.ebb_direction == null)
    warnings.push('Incomplete: the station gives no flood or ebb direction, so the current has a speed but no direction.');
  return {
    ...base,
    distanceKm: km,
    datum: null,
    kind: 'current',
    floodDir: c?.flood_direction ?? null,
    ebbDir: c?.ebb_direction ?? null,
    meanFlowMps: (c?.mean_flow ?? 0) * KNOT_MPS,
    warnings,
  };
}

/**
 * Current stations of the database within {@link TIDE_STATION_SEARCH_KM} of a position that the
 * app can predict (reference stations with harmonic constituents; subordinate stations, given as
 * offsets from another, are left out), nearest first.
 */
export function nearbyCurrentStations(latitude: number, longitude: number, maxResults = 5): CurrentStationInfo[] {
  return near({ lat: latitude, lon: longitude, maxDistance: TIDE_STATION_SEARCH_KM, maxResults, filter: predictableCurrent }).map(
    ([s, km]) => currentStationInfo(s, km),
  );
}

/** 400 naming `currentStationId` unless it is a current station the app can predict (or null). */
export function checkCurrentStation(stationId: string | null | undefined): void {
  if (stationId == null) return;
  const s = stationsById.get(stationId);
  const why = !s
    ? `No station with the id ${stationId}`
    : s.kind !== 'current'
      ? `${s.name} is a tide station, not a current station`
      : !predictableCurrent(s)
        ? `${s.name} has no harmonic constituents of its own (a subordinate station): choose a reference current station`
        : null;
  if (why) throw new HttpError('validation', `Invalid body: currentStationId: ${why}`, [{ field: 'currentStationId', message: why }]);
}

/** A worksite's predicted tidal current (docs/domain.md#tide). */
export interface CurrentPredictor {
  station: CurrentStationInfo;
  /** Changes whenever the prediction would (for caches). */
  key: string;
  /**
   * Speed (m/s, never negative) and direction (degrees true the water flows towards: the flood
   * direction while the signed velocity along the axis is positive, the ebb direction while it is
   * negative, NaN without directions) at each time.
   */
  predict(timeMs: Float64Array): { speedMps: Float64Array; dirDeg: Float64Array };
}

/**
 * The predictor of a current station's tidal stream, or null for none. The database gives the
 * stream along the station's flood-ebb axis as harmonic constituents in knots (positive towards
 * the flood direction) and a mean flow in knots added to their sum; the tide package predicts that
 * signed sum like a water level (same nodal corrections as the tide), converted here to m/s.
 * @throws HttpError 400 for an id that is no predictable current station.
 */
export function currentPredictor(
  stationId: string | null | undefined,
  position?: { latitude: number | null; longitude: number | null },
): CurrentPredictor | null {
  if (stationId == null) return null;
  checkCurrentStation(stationId);
  const s = stationsById.get(stationId)!;
  const km =
    position?.latitude != null && position.longitude != null
      ? distanceKm(position.latitude, position.longitude, s.latitude, s.longitude)
      : null;
  const p = createTidePredictor(s.harmonic_constituents, { offset: s.current?.mean_flow ?? 0, nodeCorrections: TIDE_NODE_CORRECTIONS });
  // The signed stream in knots through the same chunked, interpolated reader as the tide's levels.
  const along: TidePredictor = {
    timeline: (a, b, stepS) => p.getTimelinePrediction({ start: new Date(a), end: new Date(b), timeFidelity: stepS }),
    extremes: () => [],
    station: null,
    key: '',
  };
  const flood = s.current?.flood_direction ?? NaN;
  const ebb = s.current?.ebb_direction ?? NaN;
  return {
    station: currentStationInfo(s, km),
    key: `cur:${s.id}:${TIDE_NODE_CORRECTIONS}`,
    predict(timeMs) {
      const knots = predictLevels(along, timeMs);
      const speedMps = new Float64Array(knots.length);
      const dirDeg = new Float64Array(knots.length);
      for (let i = 0; i < knots.length; i++) {
        speedMps[i] = Math.abs(knots[i]) * KNOT_MPS;
        dirDeg[i] = knots[i] >= 0 ? flood : ebb;
      }
      return { speedMps, dirDeg };
    },
  };
}
