/**
 * Ensemble bench (issue 15): what an ensemble of 21 runs (control + 20 members) x 240 hourly
 * records adds to a cold plan of 10 operations at 5 worksites: every member transformed to every
 * worksite and all operations judged on OPLIM through evaluateStatusMany, then the chances counted
 * (the same function the plan calls, server/services/plans.ts). Aim: under 150 ms.
 *
 * Each timed run gets fresh arrays, so no cache (record steps, tide) carries over between runs.
 * Reading the members from the database is not in this figure (one query of a few chunks).
 * Run alone: `npx tsx bench/ensemble-bench.ts`.
 */
import { pathToFileURL } from 'node:url';
import { mulberry32 } from './lib/random';
import { performance } from 'node:perf_hooks';
import { DEFAULT_ALPHA_TABLE } from '../shared/engine/index';
import { generateSyntheticSea } from '../server/forecast/synthetic-sea';
import { toSeaSeries } from '../server/services/sea-series';
import type { SeaSeries } from '../server/services/series-store';
import { ensembleChancesPerPair } from '../server/services/plans';
import { transformForSite, type OperationRow, type ProjectSetup, type WorksiteRow } from '../server/services/site-context';

const AIM_MS = 150;
const RUNS = 21;
const HOURS = 240;
const SITES = 5;
const OPERATIONS = 10;

/** The control and 20 members whose Hs and wind scatter more with lead time (fresh arrays each call). */
function ensemble(): { control: SeaSeries; members: SeaSeries[] } {
  const sea = generateSyntheticSea({ startMs: Date.UTC(2026, 11, 1), hours: HOURS, seed: 42 });
  const timeMs = Float64Array.from(sea.timeMs);
  const run = (k: number): SeaSeries => {
    const rnd = mulberry32(1000 + k);
    let e = 0;
    const f = (i: number) => (k === 0 ? 1 : Math.exp((0.03 + 0.035 * (i / 24)) * e));
    const hs = new Float64Array(HOURS);
    const wind = new Float64Array(HOURS);
    for (let i = 0; i < HOURS; i++) {
      e = Math.max(-1, Math.min(1, 0.9 * e + 0.3 * (rnd() - 0.5)));
      hs[i] = sea.hsM[i] * f(i);
      wind[i] = sea.windMps[i] * f(i);
    }
    return toSeaSeries({
      timeMs,
      hs,
      tp: Float64Array.from(sea.tpS),
      dir: Float64Array.from(sea.dirDeg),
      wind,
      windDir: Float64Array.from(sea.windDirDeg),
    });
  };
  return { control: run(0), members: Array.from({ length: RUNS - 1 }, (_, k) => run(k + 1)) };
}

/** Five worksites from deep to shallow water, one with a transfer-free shore normal; ten operations of mixed limits. */
function setup(): ProjectSetup {
  const sites = Array.from(
    { length: SITES },
    (_, s) =>
      ({
        id: `site-${s}`,
        name: `Site ${s}`,
        depthM: [40, 20, 12, 8, 5][s],
        shoreNormalDeg: s % 2 === 0 ? 250 : null,
        breakerIndex: 0.6,
        transferTable: null,
        tide: null,
        latitude: 50,
        longitude: -5,
      }) as unknown as WorksiteRow,
  );
  const operations = Array.from(
    { length: OPERATIONS },
    (_, o) =>
      ({
        id: `op-${o}`,
        name: `Operation ${o}`,
        tpopH: 2 + 3 * o,
        tcH: 2,
        weatherRestricted: true,
        siteIds: [],
        limits:
          o % 3 === 0
            ? { hsMax: 1 + 0.25 * o, windMax: 15 }
            : o % 3 === 1
              ? {
                  hsTpCurve: [
                    [4, 1.0 + 0.1 * o],
                    [10, 2.0 + 0.1 * o],
                    [16, 1.5],
                  ],
                  tpMax: 18,
                }
              : { hsMax: 2, bedVelocityMax: 0.5, bedVelocityMethod: 'soulsby' },
      }) as unknown as OperationRow,
  );
  return { sites, operations, vessels: [], alphaTable: DEFAULT_ALPHA_TABLE, alphaIsDefault: true };
}

/** One cold run: the control's worksite series (which the plan has anyway, not timed) and the added ensemble work (timed). */
function once(): number {
  const { control, members } = ensemble();
  const s = setup();
  const perSite = new Map(s.sites.map((site) => [site.id, transformForSite(control, null, site)]));
  const t0 = performance.now();
  const chances = ensembleChancesPerPair(control, members, null, s, perSite, 3_600_000);
  const ms = performance.now() - t0;
  if (chances.size !== SITES * OPERATIONS) throw new Error(`ensemble bench: ${chances.size} pairs, expected ${SITES * OPERATIONS}`);
  return ms;
}

export async function runEnsembleBench(): Promise<void> {
  const first = once();
  const times: number[] = [];
  for (let k = 0; k < 10; k++) times.push(once());
  times.sort((a, b) => a - b);
  const median = (times[4] + times[5]) / 2;
  const verdict = median < AIM_MS ? 'met' : 'NOT met';
  console.log(
    `ensemble ${RUNS} members x ${HOURS} h x ${OPERATIONS} operations x ${SITES} worksites: added cold plan time ${median.toFixed(1)} ms ` +
      `(median of 10; first run, JIT cold, ${first.toFixed(1)} ms; aim < ${AIM_MS} ms: ${verdict})`,
  );
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) await runEnsembleBench();
