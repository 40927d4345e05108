/**
 * The demo's forecast archive and observation (docs/domain.md#forecast-uncertainty): past forecast
 * issues made by the fake service's own generator at past issue times, and an invented "buoy"
 * record at the data point, so the forecast-skill page and the calibrated alpha table show
 * something believable on the first start. Invented, not measured.
 */
import type { ExtraSeries } from '../shared/seadata/extra-columns';
import type { Db } from '../server/db/client';
import { buildFakeForecast, climateForPosition, exchangeToRecords, generateSyntheticSea, truthSeedForPosition } from '../server/forecast';
import { hash01 } from '../server/forecast/seeded-noise';
import { createDataset } from '../server/services/datasets';
import { toSeaSeries } from '../server/services/sea-series';
import { DEMO_GENERATED_DATASET, DEMO_PROJECT } from './scenario';

const HOUR_MS = 3_600_000;
const DAY_MS = 24 * HOUR_MS;

/**
 * Stores one past issue of the fake forecast service as a forecast dataset, as if the planning job
 * had fetched it (records before the issue time dropped).
 */
export async function storeFakeIssue(db: Db, projectId: string, seaSeed: number, issuedAtMs: number, horizonDays: number): Promise<void> {
  const f = buildFakeForecast({
    seed: seaSeed,
    latitude: DEMO_PROJECT.dataPointLatitude,
    longitude: DEMO_PROJECT.dataPointLongitude,
    issuedAtMs,
    horizonDays,
  });
  const r = exchangeToRecords(f);
  const keep = r.timeMs.findIndex((x) => x >= issuedAtMs);
  const cut = (a: Float64Array) => a.slice(keep);
  const issuedAt = new Date(issuedAtMs);
  await createDataset(
    db,
    {
      projectId,
      createdBy: null,
      name: `Forecast issued ${issuedAt.toISOString().slice(0, 16).replace('T', ' ')} UTC`,
      kind: 'forecast',
      dataPointName: DEMO_PROJECT.dataPointName,
      dataPointLatitude: f.position.lat,
      dataPointLongitude: f.position.lon,
      dataPointDepthM: DEMO_PROJECT.dataPointDepthM,
      sourceKind: 'service',
      format: 'fake forecast service (demo)',
      issuedAt,
    },
    toSeaSeries({ timeMs: cut(r.timeMs), hs: cut(r.hs), tp: cut(r.tp), dir: cut(r.dir), wind: cut(r.wind), windDir: cut(r.windDir) }),
    { source: 'fake forecast service (demo)' },
  );
}

export interface SkillArchiveOptions {
  /** Days of archive: one issue a day at 12:00 UTC on each of the last `days` days. */
  days: number;
  /** Forecast length of each issue, days (4: leads up to 96 h, the last skill bin). */
  horizonDays?: number;
}

/**
 * Seeds the archive: the 12:00 UTC issue of each of the last `days` days (4 days long, from the
 * fake's generator, so its error model is the fake's: a few percent at analysis time growing with
 * lead), then an hourly observation at the data point from the first issue to the last full hour:
 * the fake's synthetic truth with a small measurement error (Hs times exp(u), u uniform within
 * +-2 %, rounded to 1 cm as a wave buoy reports), with its wind sea and swells as a directional buoy
 * gives them (each Hs with the same error). Returns the observation dataset's id.
 */
export async function seedSkillArchive(
  db: Db,
  projectId: string,
  seaSeed: number,
  nowMs: number,
  options: SkillArchiveOptions,
): Promise<string> {
  const horizonDays = options.horizonDays ?? 4;
  const todayMs = Math.floor(nowMs / DAY_MS) * DAY_MS;
  const firstIssueMs = todayMs - options.days * DAY_MS + 12 * HOUR_MS;
  for (let k = options.days; k >= 1; k--) await storeFakeIssue(db, projectId, seaSeed, todayMs - k * DAY_MS + 12 * HOUR_MS, horizonDays);

  const lastHourMs = Math.floor(nowMs / HOUR_MS) * HOUR_MS - HOUR_MS;
  const hours = (lastHourMs - firstIssueMs) / HOUR_MS + 1;
  const truthSeed = truthSeedForPosition(seaSeed, DEMO_PROJECT.dataPointLatitude, DEMO_PROJECT.dataPointLongitude);
  const sea = generateSyntheticSea({
    startMs: firstIssueMs,
    hours,
    seed: truthSeed,
    climate: climateForPosition(DEMO_PROJECT.dataPointLatitude),
    partitions: true,
  });
  const error = sea.hsM.map((_, i) => Math.exp(0.04 * (hash01(truthSeed, 7, i) - 0.5)));
  const hs = sea.hsM.map((v, i) => Math.round(v * error[i] * 100) / 100);
  // A directional buoy's partitions (wind sea, two swells), each Hs with the total's error, so
  // their energies still add up to the total's (docs/domain.md#partitions).
  const parts = sea.partitions!;
  const extra: ExtraSeries = {};
  for (const k of ['windSea', 'swell1', 'swell2'] as const) {
    extra[`${k}.hs`] = parts[k].hsM.map((v, i) => Math.round(v * error[i] * 100) / 100);
    extra[`${k}.tp`] = parts[k].tpS;
    extra[`${k}.dir`] = parts[k].dirDeg;
  }
  const row = await createDataset(
    db,
    {
      projectId,
      createdBy: null,
      name: `${DEMO_PROJECT.dataPointName} wave buoy, last ${options.days} days (invented)`,
      kind: 'observation',
      ...DEMO_GENERATED_DATASET,
    },
    toSeaSeries({ timeMs: sea.timeMs, hs, tp: sea.tpS, dir: sea.dirDeg, wind: sea.windMps, windDir: sea.windDirDeg, extra }),
    { note: 'Invented demo observation: the demo sea with a small measurement error; not measured data.' },
  );
  return row.id;
}
