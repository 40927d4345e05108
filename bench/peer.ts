// `npm run bench:peer`: Lullwatch's engine against the NumPy peer on the same input, in the same run.
//
// The peer is a vectorised NumPy script, the company's own baseline, kept in this repository
// (bench/numpy-peer/bench_numpy.py; `--peer PATH` or LULLWATCH_NUMPY_PEER=PATH names another copy).
// This script:
// 1. has the peer write its synthetic input as CSV (`--write-csv`, 30 years hourly at a 60 m data
//    point) and reads the peer's SITES, OPS and data point depth from the script itself;
// 2. runs our transform (data point -> each worksite), hourly status (every operation at every
//    worksite) and hindcast statistics (every monthly and year-month figure) on exactly that input:
//    a cold run in a fresh process, then four more; the figure is the best of the five;
// 3. runs the peer with `--full --unique-tp` (a cold run: `--repeat 1` in its own process; then
//    `--repeat 5`, whose best it prints);
// 4. prints both sides per stage and in total, the ratio, and whether the aim (ours at least 3x
//    faster) is met.
// Exit code: 0 whatever the figures (a measurement); 2 when python3, NumPy/SciPy or the peer script
// is missing (with how to install them); 1 when the run itself failed.
//
// Options: --peer PATH, --runs N (default 5), --cpu (both sides on one thread, in process CPU time),
// --threads N (worker threads that split each worksite's records for the transform and the status,
// and its operations for the statistics; default the number of cores, at most 5; 1 runs everything
// on the main thread).
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { spawnSync } from 'node:child_process';
import type { OperationSpec } from '../shared/engine/index';
import type { SiteGeometry } from '../shared/waves/index';
import { EnginePool, runHindcastAllSites, type HindcastInput, type StageTimes } from './peer-engine';

const ROOT = path.resolve(import.meta.dirname, '..');
const DEFAULT_PEER = path.join('bench', 'numpy-peer', 'bench_numpy.py');
const AIM_RATIO = 3;

const { values: args } = parseArgs({
  options: {
    peer: { type: 'string' },
    runs: { type: 'string', default: '5' },
    threads: { type: 'string' },
    cpu: { type: 'boolean', default: false },
  },
});

function fail(code: number, message: string): never {
  console.error(message);
  process.exit(code);
}

const RUNS = Number(args.runs);
if (!Number.isInteger(RUNS) || RUNS < 1 || RUNS > 50) fail(1, `--runs must be a whole number from 1 to 50 (got ${args.runs})`);
// --cpu: both sides on one thread, timed in process CPU time instead of wall time (a figure that a
// busy machine disturbs far less: time spent waiting for a core does not count).
const CPU = args.cpu === true;
if (CPU && args.threads !== undefined && args.threads !== '1') fail(1, '--cpu runs ours on one thread: leave out --threads');
const THREADS = CPU ? 1 : args.threads === undefined ? Math.min(os.availableParallelism(), 5) : Number(args.threads);
if (!Number.isInteger(THREADS) || THREADS < 1 || THREADS > 16)
  fail(1, `--threads must be a whole number from 1 to 16 (got ${args.threads})`);

const peerPath = path.resolve(ROOT, args.peer ?? process.env.LULLWATCH_NUMPY_PEER ?? DEFAULT_PEER);
const peerDir = path.dirname(peerPath);

// The peer's README: these two variables slow current NumPy on these machines; unset them for it only.
const pyEnv: NodeJS.ProcessEnv = { ...process.env };
delete pyEnv.OPENBLAS_CORETYPE;
delete pyEnv.OPENBLAS_L2_SIZE;

function python(argv: string[], what: string): string {
  const r = spawnSync('python3', argv, { cwd: peerDir, env: pyEnv, encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
  if (r.error) throw r.error;
  if (r.status !== 0) throw new Error(`${what} failed (exit ${r.status}):\n${r.stderr}`);
  return r.stdout;
}

function checkTools(): void {
  const v = spawnSync('python3', ['--version'], { encoding: 'utf8' });
  if (v.error || v.status !== 0) {
    fail(2, 'python3 is not installed. Install it with:\n  apt-get install -y python3 python3-numpy python3-scipy');
  }
  const np = spawnSync('python3', ['-c', 'import numpy, scipy; print(numpy.__version__, scipy.__version__)'], {
    env: pyEnv,
    encoding: 'utf8',
  });
  if (np.status !== 0) {
    fail(
      2,
      `python3 cannot import NumPy and SciPy (the peer needs both). Install them with:\n  apt-get install -y python3-numpy python3-scipy\n${np.stderr.trim()}`,
    );
  }
  if (!fs.existsSync(peerPath)) {
    fail(
      2,
      `The NumPy peer script is missing: ${peerPath}\n` +
        `Put bench_numpy.py (and its synthetic_sea.py) there, or name it with --peer PATH or LULLWATCH_NUMPY_PEER=PATH.`,
    );
  }
  console.log(
    `python3 ${v.stdout.trim().replace(/^Python /, '')}, NumPy and SciPy ${np.stdout.trim()}; peer ${path.relative(ROOT, peerPath) || peerPath}`,
  );
}

interface PeerSetup {
  sites: [number, number | null, number][];
  ops: { tpop_h: number; tc_h: number; limits: Record<string, unknown> }[];
  d_src: number;
}

/** SITES, OPS and D_SRC as the peer script defines them (read from it, not copied). */
function peerSetup(): PeerSetup {
  const code = [
    'import json, sys',
    `sys.path.insert(0, ${JSON.stringify(peerDir)})`,
    `import importlib.util as u`,
    `spec = u.spec_from_file_location("peer", ${JSON.stringify(peerPath)})`,
    'm = u.module_from_spec(spec); spec.loader.exec_module(m)',
    'print(json.dumps({"sites": m.SITES, "ops": m.OPS, "d_src": m.D_SRC}))',
  ].join('\n');
  return JSON.parse(python(['-c', code], "reading the peer's SITES and OPS")) as PeerSetup;
}

/** The peer's operations in our terms. Every one is weather-restricted (the peer applies alpha where the table covers it). */
function toOperation(op: PeerSetup['ops'][number], index: number): OperationSpec {
  const L = op.limits as {
    hs_max?: number;
    tp_min?: number;
    tp_max?: number;
    tp_exclude?: [number, number][];
    hs_tp_curve?: [number, number][];
    ubed_max?: number;
    ubed_method?: 'linear' | 'soulsby';
    wind_max?: number;
  };
  const known = new Set(['hs_max', 'tp_min', 'tp_max', 'tp_exclude', 'hs_tp_curve', 'ubed_max', 'ubed_method', 'wind_max']);
  for (const k of Object.keys(L)) if (!known.has(k)) throw new Error(`peer operation ${index + 1}: unknown limit ${k}`);
  return {
    tpopH: op.tpop_h,
    tcH: op.tc_h,
    weatherRestricted: true,
    limits: {
      hsMax: L.hs_max ?? null,
      tpMin: L.tp_min ?? null,
      tpMax: L.tp_max ?? null,
      tpExcluded: L.tp_exclude ?? null,
      hsTpCurve: L.hs_tp_curve ?? null,
      bedVelocityMax: L.ubed_max ?? null,
      bedVelocityMethod: L.ubed_method ?? 'linear',
      windMax: L.wind_max ?? null,
    },
  };
}

/** Reads the peer's CSV (time,hs,tp,dir,wind; ISO UTC times; empty cell = missing). Not timed. */
function readPeerCsv(file: string): Omit<HindcastInput, 'sites' | 'operations' | 'sourceDepthM'> {
  const text = fs.readFileSync(file, 'utf8');
  const lines = text.split('\n');
  if (lines[0].trim() !== 'time,hs,tp,dir,wind') throw new Error(`${file}: unexpected header ${lines[0]}`);
  const n = lines.length - 1 - (lines[lines.length - 1] === '' ? 1 : 0);
  const timeMs = new Float64Array(n);
  const hs = new Float64Array(n);
  const tp = new Float64Array(n);
  const dir = new Float64Array(n);
  const wind = new Float64Array(n);
  const num = (s: string) => (s === '' ? NaN : Number(s));
  for (let i = 0; i < n; i++) {
    const c = lines[i + 1].split(',');
    if (c.length !== 5) throw new Error(`${file} line ${i + 2}: expected 5 fields, got ${c.length}`);
    timeMs[i] = Date.parse(c[0]);
    hs[i] = num(c[1]);
    tp[i] = num(c[2]);
    dir[i] = num(c[3]);
    wind[i] = num(c[4]);
    if (!Number.isFinite(timeMs[i])) throw new Error(`${file} line ${i + 2}: bad time ${c[0]}`);
  }
  return { timeMs, hs, tp, dir, wind };
}

interface PeerFigures {
  transform: number;
  status: number;
  statistics: number;
  total: number;
}

/**
 * Runs the peer with --full --unique-tp and the given --repeat; returns its best per stage, ms.
 * With --cpu its clock (time.perf_counter) is replaced by time.process_time for that run, so the
 * figures it prints are process CPU time; the script itself is not changed.
 */
function runPeer(repeat: number): PeerFigures {
  const argv = ['--full', '--unique-tp', '--repeat', String(repeat)];
  const code = [
    'import runpy, sys, time',
    'time.perf_counter = time.process_time',
    `sys.path.insert(0, ${JSON.stringify(peerDir)})`,
    `sys.argv = ${JSON.stringify([peerPath, ...argv])}`,
    `runpy.run_path(${JSON.stringify(peerPath)}, run_name="__main__")`,
  ].join('\n');
  const out = python(CPU ? ['-c', code] : [peerPath, ...argv], 'the NumPy peer');
  const best = (stage: string) => {
    const m = new RegExp(`^\\s*${stage}\\s+best\\s+([\\d.]+) ms`, 'm').exec(out);
    if (!m) throw new Error(`the peer printed no ${stage} figure:\n${out}`);
    return Number(m[1]);
  };
  return { transform: best('transform'), status: best('status'), statistics: best('statistics'), total: best('total') };
}

const STAGES = ['transform', 'status', 'statistics', 'total'] as const;

/** Process CPU time (user + system, every thread of the process), ms. */
function cpuClockMs(): number {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
}

async function main(): Promise<void> {
  const cpus = os.cpus();
  console.log(
    `Lullwatch against the NumPy peer on ${cpus.length} cores (${cpus[0]?.model ?? 'unknown CPU'}), Node ${process.version}, load average ${os
      .loadavg()
      .map((x) => x.toFixed(1))
      .join(' ')}`,
  );
  checkTools();
  const setup = peerSetup();
  const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'lullwatch-peer-'));
  try {
    const csv = path.join(tmp, 'peer-30y.csv');
    python([peerPath, '--write-csv', csv], "writing the peer's CSV");
    const data = readPeerCsv(csv);
    const sites: SiteGeometry[] = setup.sites.map(([depthM, shoreNormalDeg, breakerIndex]) => ({ depthM, shoreNormalDeg, breakerIndex }));
    const operations = setup.ops.map(toOperation);
    const input: HindcastInput = { ...data, sourceDepthM: setup.d_src, sites, operations };
    console.log(
      `Input: the peer's CSV, ${data.timeMs.length.toLocaleString('en')} hourly records (${new Date(data.timeMs[0]).toISOString().slice(0, 10)} to ${new Date(
        data.timeMs[data.timeMs.length - 1],
      )
        .toISOString()
        .slice(
          0,
          10,
        )}), data point ${setup.d_src} m; ${sites.length} worksites x ${operations.length} operations (the peer's SITES and OPS)`,
    );
    if (CPU) console.log('--cpu: every figure below is process CPU time (both sides on one thread), not wall time');
    console.log(
      `Ours: transform + status + statistics (months in UTC), ${THREADS === 1 ? 'on the main thread' : `${THREADS} worker threads splitting each worksite's records (transform, status) and operations (statistics)`}; ${RUNS} runs, the first cold\n`,
    );

    // Ours: the first run is the cold one (fresh process, and fresh workers when threads are used).
    const pool = THREADS > 1 ? await EnginePool.start(THREADS) : null;
    const ours: StageTimes[] = [];
    try {
      for (let r = 0; r < RUNS; r++)
        ours.push(pool ? await pool.run(input) : runHindcastAllSites(input, undefined, CPU ? cpuClockMs : undefined));
    } finally {
      await pool?.close();
    }
    if (ours.some((o) => o.checksum !== ours[0].checksum)) throw new Error('our runs gave different statistics (checksums differ)');
    const oursCold = ours[0];
    const oursBest = Object.fromEntries(STAGES.map((s) => [s, Math.min(...ours.map((o) => o[s]))])) as unknown as StageTimes;

    // The peer: a cold run in its own process, then the best of RUNS.
    const peerCold = runPeer(1);
    const peerBest = runPeer(RUNS);

    const f = (x: number) => `${x.toFixed(1).padStart(8)} ms`;
    console.log(
      `${'stage'.padEnd(11)} ${'ours cold'.padStart(11)} ${'peer cold'.padStart(11)} ${'ratio'.padStart(6)}   ${`ours best/${RUNS}`.padStart(11)} ${`peer best/${RUNS}`.padStart(11)} ${'ratio'.padStart(6)}`,
    );
    for (const s of STAGES) {
      console.log(
        `${s.padEnd(11)} ${f(oursCold[s])} ${f(peerCold[s])} ${(peerCold[s] / oursCold[s]).toFixed(2).padStart(5)}x   ${f(oursBest[s])} ${f(peerBest[s])} ${(peerBest[s] / oursBest[s]).toFixed(2).padStart(5)}x`,
      );
    }
    if (pool) {
      const bestRun = ours.reduce((a, b) => (b.total < a.total ? b : a));
      console.log(
        `(ours with worker threads: per-stage figures are the slowest worker's; the total is wall time, including handing the input over;
` +
          ` of the status time, the slowest thread waited at the barriers ${oursCold.waitMs.toFixed(1)} ms in the cold run, ${bestRun.waitMs.toFixed(1)} ms in the fastest)`,
      );
    }
    const ratioBest = peerBest.total / oursBest.total;
    const ratioCold = peerCold.total / oursCold.total;
    const mark = (ok: boolean) => (ok ? 'met' : 'NOT met');
    console.log(`\nAim: ours at least ${AIM_RATIO}x faster than the peer in total`);
    console.log(`  best of ${RUNS}: ${ratioBest.toFixed(2)}x: ${mark(ratioBest >= AIM_RATIO)}`);
    console.log(`  cold:      ${ratioCold.toFixed(2)}x: ${mark(ratioCold >= AIM_RATIO)}`);
    console.log(
      `Load average at the end ${os
        .loadavg()
        .map((x) => x.toFixed(1))
        .join(' ')} (both sides share the machine with whatever else runs)`,
    );
  } finally {
    fs.rmSync(tmp, { recursive: true, force: true });
  }
}

try {
  await main();
} catch (err) {
  console.error(`\nThe peer bench failed: ${err instanceof Error ? (err.stack ?? err.message) : String(err)}`);
  process.exitCode = 1;
}
