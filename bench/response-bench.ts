/**
 * Response bench (issue 14): the engine bench's 30 years hourly x 5 worksites x 10 operations, of
 * which 4 get vessel-response limits (docs/domain.md#vessel-response) on the demo's invented RAOs,
 * with two partitions per record (wind sea + swell). Each run is timed cold in a fresh worker
 * thread (its own V8 isolate: nothing compiled or cached before), with the response limits and
 * without them, several times each and alternating, so the ratio compares like with like.
 *
 * Run alone: `npx tsx bench/response-bench.ts`. Aims: under 2 s cold, and at most 2x the time
 * without response limits.
 */
import { pathToFileURL } from 'node:url';
import { once } from 'node:events';
import { isMainThread } from 'node:worker_threads';
import { tsWorker } from '../scripts/lib/ts-worker';
import { DEMO_VESSELS } from '../seed/demo-vessels';
import type { OperationSpec, SiteSeries } from '../shared/engine/index';
import { onePass, OPERATIONS, syntheticSeries } from './engine-bench';
import { median, mulberry32 } from './lib/random';

/** Aims of issue 14, ms and ratio. */
export const RESPONSE_COLD_AIM_MS = 2000;
export const RESPONSE_RATIO_AIM = 2;

const vessel = (key: 'ctv' | 'layBarge', headingDeg: number) => ({ raos: DEMO_VESSELS.find((v) => v.key === key)!.raos, headingDeg });

/** Response limits added to operations 1, 2, 4 and 9 (index: limits and vessel). */
const RESPONSE_OPS: Record<number, Pick<OperationSpec, 'vessel'> & { responses: NonNullable<OperationSpec['limits']['responses']> }> = {
  0: { vessel: vessel('ctv', 250), responses: [{ response: 'vel_z_m_s_per_m@bow_fender', statistic: 'significant', max: 0.8 }] },
  1: { vessel: vessel('ctv', 180), responses: [{ response: 'roll_deg_per_m', statistic: 'mpm', durationH: 3, max: 6 }] },
  3: {
    vessel: vessel('layBarge', 300),
    responses: [
      { response: 'roll_deg_per_m', statistic: 'mpm', max: 4 },
      { response: 'pitch_deg_per_m', statistic: 'significant', max: 2 },
    ],
  },
  8: { vessel: vessel('layBarge', 90), responses: [{ response: 'vel_z_m_s_per_m@lay_chute', statistic: 'mpm', durationH: 1, max: 1.5 }] },
};

/** The bench's operations, with or without the four operations' response limits. */
export function responseBenchOperations(withResponses: boolean): OperationSpec[] {
  return OPERATIONS.map((op, i) => {
    const add = RESPONSE_OPS[i];
    if (!withResponses || !add) return op;
    return { ...op, vessel: add.vessel, limits: { ...op.limits, responses: add.responses } };
  });
}

/**
 * The engine bench's synthetic series with two partitions per record: a wind sea of 0.8 Hs at
 * 0.85 Tp from the south-west, and a swell of 0.6 Hs (energies add to the total: 0.64 + 0.36 = 1)
 * at 10-16 s from the west. Invented, only the ranges matter.
 */
export function partitionedSeries(seed: number): SiteSeries {
  const s = syntheticSeries(seed);
  const rnd = mulberry32(seed + 1);
  const n = s.timeMs.length;
  const wind = { kind: 'windSea' as const, hsM: new Float64Array(n), tpS: new Float64Array(n), dirDeg: new Float64Array(n) };
  const swell = { kind: 'swell' as const, hsM: new Float64Array(n), tpS: new Float64Array(n), dirDeg: new Float64Array(n) };
  let swellTp = 12;
  for (let i = 0; i < n; i++) {
    swellTp = Math.min(16, Math.max(10, swellTp + 0.2 * (rnd() - 0.5)));
    wind.hsM[i] = 0.8 * s.hsM[i];
    wind.tpS[i] = 0.85 * s.tpS[i];
    wind.dirDeg[i] = (200 + 60 * rnd()) % 360;
    swell.hsM[i] = 0.6 * s.hsM[i];
    swell.tpS[i] = swellTp;
    swell.dirDeg[i] = 260 + 15 * rnd();
  }
  return { ...s, responsePartitions: [wind, swell] };
}

/** One worker's answer: its cold pass and the warm passes after it. */
export interface ResponseRun {
  coldMs: number;
  coldCpuMs: number;
  warmMs: number[];
  checksum: number;
  records: number[];
}

/** The work of one worker: build the five worksites (not timed), one cold pass, then warm passes. */
export function responseRunInThisThread(withResponses: boolean, warmRuns: number): ResponseRun {
  const sites = [11, 22, 33, 44, 55].map(partitionedSeries);
  const ops = responseBenchOperations(withResponses);
  const cold = onePass(sites, ops);
  const warm = Array.from({ length: warmRuns }, () => onePass(sites, ops).ms);
  return { coldMs: cold.ms, coldCpuMs: cold.cpuMs, warmMs: warm, checksum: cold.checksum, records: sites.map((s) => s.timeMs.length) };
}

async function inFreshWorker(withResponses: boolean, warmRuns: number): Promise<ResponseRun> {
  const worker = tsWorker(new URL('./response-bench-worker.ts', import.meta.url), { workerData: { withResponses, warmRuns } });
  try {
    const [answer] = (await once(worker, 'message')) as [ResponseRun];
    return answer;
  } finally {
    await worker.terminate();
  }
}

const met = (ok: boolean) => (ok ? 'met' : 'NOT met');

/** The figures of one case: every cold sample, their medians, and the first worker's warm passes. */
export interface ResponseCase {
  coldMs: number[];
  coldCpuMs: number[];
  medianColdMs: number;
  medianColdCpuMs: number;
  warmMs: number[];
  records: number[];
}

function caseOf(runs: ResponseRun[]): ResponseCase {
  const coldMs = runs.map((r) => r.coldMs);
  const coldCpuMs = runs.map((r) => r.coldCpuMs);
  return {
    coldMs,
    coldCpuMs,
    medianColdMs: median(coldMs),
    medianColdCpuMs: median(coldCpuMs),
    warmMs: runs[0].warmMs,
    records: runs[0].records,
  };
}

/**
 * Runs both cases cold in fresh workers, `coldRuns` times each, alternating (without response
 * limits first), so that a passing slow spell of this shared machine falls on both; judges the
 * aims on the medians. Prints and returns the figures.
 */
export async function runResponseBench(warmRuns = 3, coldRuns = 5): Promise<{ without: ResponseCase; with: ResponseCase; ratio: number }> {
  const withoutRuns: ResponseRun[] = [];
  const withRuns: ResponseRun[] = [];
  for (let k = 0; k < coldRuns; k++) {
    withoutRuns.push(await inFreshWorker(false, k === 0 ? warmRuns : 0));
    withRuns.push(await inFreshWorker(true, k === 0 ? warmRuns : 0));
  }
  if (withoutRuns.some((r) => r.checksum !== withoutRuns[0].checksum) || withRuns.some((r) => r.checksum !== withRuns[0].checksum))
    throw new Error('response bench: the cold runs of one case disagree (checksums differ)');
  const without = caseOf(withoutRuns);
  const withR = caseOf(withRuns);
  const ratio = withR.medianColdMs / without.medianColdMs;
  const ms = (v: number[]) => v.map((x) => x.toFixed(0)).join(', ');
  const fmt = (r: ResponseCase) =>
    `cold median ${r.medianColdMs.toFixed(0)} ms (CPU ${r.medianColdCpuMs.toFixed(0)} ms) of ${r.coldMs.length}: ${ms(r.coldMs)} ms; ` +
    `warm median ${median(r.warmMs).toFixed(0)} ms of ${r.warmMs.length}`;
  console.log(
    `response limits: 5 worksites x 10 operations (4 with response limits), two partitions per record, ${withR.records.join('/')} records; ` +
      `each cold pass in a fresh worker, the cases alternating\n` +
      `  without response limits: ${fmt(without)}\n` +
      `  with response limits:    ${fmt(withR)}\n` +
      `  aim under ${RESPONSE_COLD_AIM_MS / 1000} s cold (median): ${met(withR.medianColdMs < RESPONSE_COLD_AIM_MS)} (${(withR.medianColdMs / 1000).toFixed(2)} s)\n` +
      `  aim at most ${RESPONSE_RATIO_AIM}x the time without response limits (cold medians): ${met(ratio <= RESPONSE_RATIO_AIM)} (${ratio.toFixed(2)}x)`,
  );
  return { without, with: withR, ratio };
}

if (isMainThread && process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  runResponseBench().catch((error: unknown) => {
    console.error(error);
    process.exitCode = 1;
  });
}
