import { evaluateStatusMany, createStatusManyScratch } from './evaluate-status-many';
import { goStarts } from './go-starts';
import { STATUS, type AlphaTable, type OperationSpec, type SiteSeries } from './types';

/**
 * Chances from an ensemble forecast (docs/domain.md#forecast-uncertainty): the runs (the control
 * and its perturbed members) are each a full series at the worksite; the spread stands for the
 * forecast's uncertainty, so they are judged on OPLIM (no alpha).
 *
 * - per record, the chance of workable: the share of runs in which the record is workable;
 * - per record, the start chance: the share of runs in which [t, t + TR) is wholly workable
 *   (the run's go-start, go-starts.ts, with the same local steps as the plan).
 *
 * A run without data at a record counts there as not workable (it cannot show the hour workable).
 * The deterministic plan (the control with alpha) still decides go/no-go; these are shown beside it.
 */
export interface EnsembleChances {
  /** Share of runs workable at each record, 0-1. */
  hour: Float64Array;
  /** Share of runs with a go-start at each record, 0-1. */
  start: Float64Array;
}

/** Reusable buffers for {@link ensembleChancesMany}. */
export interface EnsembleScratch {
  go: Uint8Array;
}

/**
 * Chances of one operation from its runs' STATUS codes.
 * @param timeMs the shared record times, UTC epoch ms
 * @param runStatus one STATUS array per run, each as long as timeMs
 * @param stepMs fallback dt, ms (as the plan's)
 * @param trH TR = TPOP + TC, h
 * @throws RangeError for no runs, unequal lengths, or a non-positive TR or dt
 */
export function ensembleChances(
  timeMs: Float64Array,
  runStatus: readonly Uint8Array[],
  stepMs: number,
  trH: number,
  scratch?: EnsembleScratch,
): EnsembleChances {
  const n = timeMs.length;
  const m = runStatus.length;
  if (m === 0) throw new RangeError('ensembleChances: no runs');
  const hour = new Float64Array(n);
  const start = new Float64Array(n);
  const go = scratch && scratch.go.length === n ? scratch.go : new Uint8Array(n);
  for (const status of runStatus) {
    if (status.length !== n) throw new RangeError('ensembleChances: a run has another length than the times');
    for (let i = 0; i < n; i++) if (status[i] === STATUS.WORKABLE) hour[i] += 1;
    goStarts(timeMs, status, stepMs, trH, go);
    for (let i = 0; i < n; i++) start[i] += go[i];
  }
  for (let i = 0; i < n; i++) {
    hour[i] /= m;
    start[i] /= m;
  }
  return { hour, start };
}

/**
 * Chances of several operations at one worksite: every run is evaluated once for all operations
 * on OPLIM through evaluateStatusMany's bit masks (operations with limit kinds it does not know
 * fall back to the general path there), then counted per operation.
 * @param runs the worksite series of every run (control and members), sharing one times array
 * @returns one EnsembleChances per operation, in the operations' order
 */
export function ensembleChancesMany(
  runs: readonly SiteSeries[],
  ops: readonly OperationSpec[],
  alphaTable: AlphaTable,
  stepMs: number,
): EnsembleChances[] {
  if (runs.length === 0) throw new RangeError('ensembleChancesMany: no runs');
  const timeMs = runs[0].timeMs;
  const n = timeMs.length;
  const perOp: Uint8Array[][] = ops.map(() => []);
  const msScratch = createStatusManyScratch(n);
  for (const run of runs) {
    if (run.timeMs.length !== n) throw new RangeError('ensembleChancesMany: runs of unequal length');
    const status = evaluateStatusMany(run, ops, { alpha: false, alphaTable, scratch: msScratch });
    status.forEach((s, o) => perOp[o].push(s));
  }
  const scratch: EnsembleScratch = { go: new Uint8Array(n) };
  return ops.map((op, o) => ensembleChances(timeMs, perOp[o], stepMs, op.tpopH + op.tcH, scratch));
}
