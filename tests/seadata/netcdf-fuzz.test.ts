// Damaged NetCDF files: cut short at many lengths, or with bytes overwritten at random, every
// fixture must either read or fail with a clear 400 (HttpError 'bad_file' or 'validation' naming
// what is wrong), never another error, and within a time bound. Fixtures: tests/fixtures/netcdf
// (written by Python's netCDF4). Random damage is seeded (fast-check), so a failure replays.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { HttpError } from '../../server/http/errors';
import { describeNetcdfUpload, readNetcdfPoint, readNetcdfPointUpload, withNetcdf } from '../../server/services/netcdf-import';

const DIR = path.resolve(import.meta.dirname, '../fixtures/netcdf');
const TMP = fs.mkdtempSync(path.join(os.tmpdir(), 'lullwatch-ncfuzz-'));
afterAll(() => fs.rmSync(TMP, { recursive: true, force: true }));

/**
 * Longest a damaged small file may take to read or fail (common practice, no source): generous,
 * as the test machine's two cores are shared; a hang or a runaway allocation takes far longer.
 */
const BOUND_MS = 5000;

/** Time limit of an isolated read in these tests (NETCDF_TIME_LIMIT_MS), ms. */
const ISOLATED_LIMIT_MS = 2000;
/** Bound for an isolated read: its limit plus a worker's start-up on a loaded machine (common practice, no source). */
const ISOLATED_BOUND_MS = ISOLATED_LIMIT_MS + 30_000;

let n = 0;
/**
 * Reads `bytes` as an upload's chosen point: on this thread, or `isolated` on a worker thread that
 * the server stops after its time limit (the way an upload is read), for damage that can make HDF5
 * loop without end.
 */
async function attempt(bytes: Uint8Array, isolated = false): Promise<'read' | 'refused'> {
  const file = path.join(TMP, `f${n++}.nc`);
  fs.writeFileSync(file, bytes);
  const args = { dataPoint: { lat: 50.041, lon: -5.988 }, waterLevelOffsetM: 0 };
  const t0 = performance.now();
  try {
    if (isolated) await readNetcdfPointUpload({ path: file, size: bytes.length }, args);
    else await withNetcdf(file, (f) => readNetcdfPoint(f, args));
    return 'read';
  } catch (err) {
    if (!(err instanceof HttpError) || (err.status !== 400 && err.status !== 413)) {
      throw new Error(`not a clear refusal: ${(err as Error)?.stack ?? String(err)}`, { cause: err });
    }
    expect(err.message.length).toBeGreaterThan(20);
    return 'refused';
  } finally {
    expect(performance.now() - t0, 'time to read or refuse').toBeLessThan(isolated ? ISOLATED_BOUND_MS : BOUND_MS);
    fs.rmSync(file, { force: true });
  }
}

const FILES = ['classic.nc', 'packed.nc', 'grid-3x3.nc', 'point-partitions.nc', 'point-groups.nc', 'grid-group.nc'];

describe('cut-short and damaged NetCDF files', () => {
  for (const name of FILES) {
    const whole = new Uint8Array(fs.readFileSync(path.join(DIR, name)));
    it(`${name} cut short at 40 lengths fails clearly`, async () => {
      let refused = 0;
      for (let k = 1; k <= 40; k++) {
        const cut = Math.floor((whole.length * k) / 41);
        if ((await attempt(whole.subarray(0, cut))) === 'refused') refused++;
      }
      // A file cut anywhere before its last data byte cannot be read whole.
      expect(refused).toBeGreaterThan(30);
    });

    // grid-group.nc: some damage makes HDF5 loop without end (see KNOWN HANG below), so its damaged
    // copies are read as an upload is, on a worker thread stopped after its time limit; the others
    // on this thread. A refusal for the time limit is a clear refusal. Each isolated read starts a
    // worker (seconds on a loaded machine), so it runs 6 seeded cases, not 60.
    const isolated = name === 'grid-group.nc';
    it(`${name} with random bytes overwritten reads or fails clearly`, async () => {
      const saved = process.env.NETCDF_TIME_LIMIT_MS;
      process.env.NETCDF_TIME_LIMIT_MS = String(ISOLATED_LIMIT_MS);
      try {
        await fc.assert(
          fc.asyncProperty(
            fc.array(fc.tuple(fc.nat({ max: whole.length - 1 }), fc.nat({ max: 255 })), { minLength: 1, maxLength: 16 }),
            async (edits) => {
              const copy = whole.slice();
              for (const [at, b] of edits) copy[at] = b;
              await attempt(copy, isolated);
            },
          ),
          { numRuns: isolated ? 6 : 60, seed: 20261203 },
        );
      } finally {
        if (saved === undefined) delete process.env.NETCDF_TIME_LIMIT_MS;
        else process.env.NETCDF_TIME_LIMIT_MS = saved;
      }
    }, 600_000);
  }

  // Found by the seeded run above on 2026-12-03: one byte changed in the group grid makes HDF5's
  // dimension-scale lookup (h5wasm's get_attached_scales, and reading the DIMENSION_LIST attribute
  // alike) loop without end inside WebAssembly. An upload is therefore read on a worker thread that
  // is terminated after NETCDF_TIME_LIMIT_MS (here 2 s), while this thread keeps running.
  it('KNOWN HANG: grid-group.nc with byte 6,660 set to 111 fails clearly within the time limit', async () => {
    const copy = new Uint8Array(fs.readFileSync(path.join(DIR, 'grid-group.nc')));
    copy[6660] = 111;
    const file = path.join(TMP, 'hang.nc');
    fs.writeFileSync(file, copy);
    const saved = process.env.NETCDF_TIME_LIMIT_MS;
    process.env.NETCDF_TIME_LIMIT_MS = '2000';
    try {
      // This thread stays free meanwhile: a 50 ms timer keeps firing while the worker loops.
      let ticks = 0;
      const timer = setInterval(() => ticks++, 50);
      const t0 = performance.now();
      const err = await describeNetcdfUpload({ path: file, size: copy.length }, { name: 'P', lat: 50.041, lon: -5.988 }).then(
        () => null,
        (e: unknown) => e,
      );
      clearInterval(timer);
      expect(err).toBeInstanceOf(HttpError);
      expect((err as HttpError).status).toBe(400);
      expect((err as HttpError).message).toMatch(/^The NetCDF file could not be read within 2 s: it may be damaged/);
      // The limit counts from the worker's start-up (generous for a loaded machine: common practice, no source).
      expect(performance.now() - t0).toBeLessThan(2000 + 60_000);
      expect(ticks).toBeGreaterThan(10);
    } finally {
      if (saved === undefined) delete process.env.NETCDF_TIME_LIMIT_MS;
      else process.env.NETCDF_TIME_LIMIT_MS = saved;
    }
  }, 120_000);
});
