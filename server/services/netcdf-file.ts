/**
 * NetCDF files on disk as the pure reader's `NcFile` (shared/seadata/netcdf-cf.ts):
 * - NetCDF-4 (HDF5) through h5wasm, which reads the file from disk as it goes (only the
 *   hyperslabs asked for, chunk by chunk);
 * - classic NetCDF (CDF-1, 64-bit offset CDF-2) through netcdfjs for the header only; values are
 *   read here at their byte offsets (big-endian, CF "classic" layout), so a large file is never
 *   in memory whole.
 * See docs/domain.md#netcdf.
 */
import fs from 'node:fs';
import h5wasm from 'h5wasm/node';
import { NetCDFReader } from 'netcdfjs';
import { ImportError, netcdfKind, type NcAttr, type NcFile, type NcVar } from '../../shared/seadata';

export { netcdfKind };

/** An open NetCDF file; `close()` releases it. */
export interface OpenNcFile extends NcFile {
  close(): void;
}

function bad(reason: string): ImportError {
  return new ImportError([{ line: 0, column: '', value: '', reason }], 1, `The NetCDF file cannot be read: ${reason}`);
}

/** What `byName` holds for the variable `name`; refused as a bad file when there is no such variable. */
function variableOf<T>(byName: Map<string, T>, name: string): T {
  const found = byName.get(name);
  if (found === undefined) throw bad(`no variable ${name}`);
  return found;
}

/** Opens a NetCDF file of either kind; errors of a damaged file become an ImportError. */
export async function openNetcdf(path: string): Promise<OpenNcFile> {
  const head = Buffer.alloc(8);
  const fd = fs.openSync(path, 'r');
  try {
    fs.readSync(fd, head, 0, 8, 0);
  } finally {
    fs.closeSync(fd);
  }
  const kind = netcdfKind(head);
  if (kind === 'classic') return openClassic(path);
  if (kind === 'netcdf4') return openNetcdf4(path);
  throw bad('it does not start with a NetCDF signature (CDF or HDF5)');
}

// ---------------------------------------------------------------------------------------------
// NetCDF-4 (HDF5)

const NOT_A_VARIABLE = 'This is a netCDF dimension but not a netCDF variable';
/** Deepest group nesting read (sea-state files use one or two levels). */
const MAX_GROUP_DEPTH = 16;
/** Most groups and variables listed (a damaged or hostile file could link a group into itself). */
const MAX_HDF5_NODES = 20_000;

function toAttr(value: unknown): NcAttr | undefined {
  if (typeof value === 'string') return value;
  if (typeof value === 'number') return [value];
  if (typeof value === 'bigint') return [Number(value)];
  if (ArrayBuffer.isView(value) && !(value instanceof DataView)) {
    return Array.from(value as unknown as ArrayLike<number | bigint>, (x) => Number(x));
  }
  if (Array.isArray(value)) {
    if (value.every((x) => typeof x === 'string')) return value.join(' ');
    if (value.every((x) => typeof x === 'number' || typeof x === 'bigint')) return value.map((x) => Number(x));
  }
  return undefined;
}

function toFloat64(value: unknown, name: string): Float64Array {
  if (value instanceof Float64Array) return value;
  if (typeof value === 'number' || typeof value === 'bigint') return Float64Array.of(Number(value));
  if (ArrayBuffer.isView(value) && !(value instanceof DataView)) {
    const src = value as unknown as ArrayLike<number | bigint>;
    const out = new Float64Array(src.length);
    for (let i = 0; i < src.length; i++) out[i] = Number(src[i]);
    return out;
  }
  throw bad(`variable ${name} does not hold numbers`);
}

let h5Ready: Promise<unknown> | null = null;

async function openNetcdf4(path: string): Promise<OpenNcFile> {
  h5Ready ??= h5wasm.ready;
  await h5Ready;
  let f: InstanceType<typeof h5wasm.File>;
  try {
    f = new h5wasm.File(path, 'r');
  } catch (err) {
    throw bad(`HDF5 structure is damaged or cut short (${(err as Error).message ?? String(err)})`);
  }
  try {
    const variables: NcVar[] = [];
    const datasets = new Map<string, InstanceType<typeof h5wasm.Dataset>>();
    // NetCDF-4 groups (docs/domain.md#netcdf): every group is walked, parents before children, and
    // a variable in a group is named by its path without the leading '/' ("waves/hs"); a dimension
    // is named by its dimension scale's path the same way, so a variable in /waves that runs along
    // the root's time has the dimension "time", and one along /model/time has "model/time".
    let nodes = 0;
    const walk = (
      group: InstanceType<typeof h5wasm.Group>,
      prefix: string,
      depth: number,
      groups: [string, InstanceType<typeof h5wasm.Group>][],
    ) => {
      for (const key of group.keys()) {
        if (++nodes > MAX_HDF5_NODES) {
          throw bad(`it holds more than ${MAX_HDF5_NODES.toLocaleString('en-US')} groups and variables, which is not a sea-state file`);
        }
        const node = group.get(key);
        const path = prefix + key;
        if (node instanceof h5wasm.Group) {
          if (depth >= MAX_GROUP_DEPTH) throw bad(`group ${path} is nested deeper than ${MAX_GROUP_DEPTH} levels`);
          groups.push([path, node]);
          continue;
        }
        if (node instanceof h5wasm.Dataset) addDataset(path, node);
      }
    };
    const addDataset = (key: string, node: InstanceType<typeof h5wasm.Dataset>) => {
      if (datasets.has(key)) return;
      const attrs: Record<string, NcAttr> = {};
      for (const [name, a] of Object.entries(node.attrs)) {
        if (name === 'DIMENSION_LIST' || name === 'REFERENCE_LIST' || name.startsWith('_Netcdf4') || name === 'CLASS') continue;
        let v: unknown;
        try {
          v = a.value;
        } catch {
          continue;
        }
        const t = toAttr(v);
        if (t !== undefined) attrs[name] = t;
      }
      if (typeof attrs.NAME === 'string' && attrs.NAME.startsWith(NOT_A_VARIABLE)) return;
      delete attrs.NAME;
      const shape = (node.shape ?? []).map(Number);
      const isScale = (() => {
        try {
          return node.attrs.CLASS?.value === 'DIMENSION_SCALE';
        } catch {
          return false;
        }
      })();
      const dims = shape.map((_, k) => {
        if (isScale && shape.length === 1) return key; // a coordinate variable is its own dimension
        let scales: string[];
        try {
          scales = node.get_attached_scales(k);
        } catch {
          scales = [];
        }
        const s = scales[0];
        return s ? s.replace(/^\//, '') : `${key}_dim${k}`;
      });
      variables.push({ name: key, dims, shape, attrs });
      datasets.set(key, node);
    };
    // Breadth first: the root's variables, then each group's, then theirs.
    let level: [string, InstanceType<typeof h5wasm.Group>][] = [['', f]];
    for (let depth = 0; level.length > 0; depth++) {
      const next: [string, InstanceType<typeof h5wasm.Group>][] = [];
      for (const [path, g] of level) walk(g, path === '' ? '' : `${path}/`, depth, next);
      level = next;
    }
    return {
      format: 'netcdf4',
      variables,
      readRaw(name, start, count) {
        const d = variableOf(datasets, name);
        try {
          if (start.length === 0) return toFloat64(d.value, name);
          const ranges = start.map((s, k) => [s, s + count[k]] as [number, number]);
          return toFloat64(d.slice(ranges), name);
        } catch (err) {
          if (err instanceof ImportError) throw err;
          throw bad(`variable ${name} cannot be read: the file is damaged or cut short (${(err as Error).message ?? String(err)})`);
        }
      },
      close() {
        f.close();
      },
    };
  } catch (err) {
    try {
      f.close();
    } catch {
      /* already closed */
    }
    if (err instanceof ImportError) throw err;
    throw bad(`HDF5 structure is damaged or cut short (${(err as Error).message ?? String(err)})`);
  }
}

// ---------------------------------------------------------------------------------------------
// Classic NetCDF

const CLASSIC_TYPES: Record<string, { size: number; get: (dv: DataView, o: number) => number }> = {
  byte: { size: 1, get: (dv, o) => dv.getInt8(o) },
  char: { size: 1, get: (dv, o) => dv.getUint8(o) },
  short: { size: 2, get: (dv, o) => dv.getInt16(o, false) },
  int: { size: 4, get: (dv, o) => dv.getInt32(o, false) },
  float: { size: 4, get: (dv, o) => dv.getFloat32(o, false) },
  double: { size: 8, get: (dv, o) => dv.getFloat64(o, false) },
};

/** Largest classic header read while looking for its end. */
const MAX_HEADER_BYTES = 64 * 1024 * 1024;

interface ClassicVar {
  name: string;
  dimensions: number[];
  attributes: { name: string; type: string; value: unknown }[];
  type: string;
  size: number;
  offset: number;
  record: boolean;
}

function openClassic(path: string): OpenNcFile {
  const fd = fs.openSync(path, 'r');
  const fileSize = fs.fstatSync(fd).size;
  let reader: NetCDFReader | null = null;
  let lastError = '';
  for (let bytes = 64 * 1024; ; bytes *= 4) {
    const n = Math.min(bytes, fileSize, MAX_HEADER_BYTES);
    const buf = Buffer.alloc(n);
    fs.readSync(fd, buf, 0, n, 0);
    try {
      reader = new NetCDFReader(buf);
      break;
    } catch (err) {
      lastError = (err as Error).message ?? String(err);
      if (n >= fileSize || n >= MAX_HEADER_BYTES) break;
    }
  }
  if (!reader) {
    fs.closeSync(fd);
    throw bad(`the classic header is damaged or cut short (${lastError})`);
  }
  const header = reader;
  // A header with no dimensions or variables (their lists ABSENT) reads as undefined lists.
  const dims = (header.dimensions ?? []) as { name: string; size: number }[];
  const recDim = (header.recordDimension ?? { length: 0 }) as { length: number; id?: number; recordStep?: number };
  const records = Number(recDim.length ?? 0);
  const recordStep = Number(recDim.recordStep ?? 0);
  const raw = (header.variables ?? []) as unknown as ClassicVar[];
  const variables: NcVar[] = [];
  const layout = new Map<string, { v: ClassicVar; shape: number[] }>();
  for (const v of raw) {
    const shape = v.dimensions.map((id, k) => (v.record && k === 0 ? records : Number(dims[id]?.size ?? 0)));
    const attrs: Record<string, NcAttr> = {};
    for (const a of v.attributes) {
      const t = toAttr(a.value);
      if (t !== undefined) attrs[a.name] = typeof t === 'string' ? t.replace(/\0+$/, '') : t;
    }
    // Every value must lie inside the file: a damaged header (a huge dimension) or a cut file is
    // refused here rather than by a giant allocation later.
    const typeSize = CLASSIC_TYPES[v.type]?.size ?? 1;
    const inner = shape.slice(v.record ? 1 : 0).reduce((a, b) => a * b, 1);
    const end = v.record ? v.offset + Math.max(0, records - 1) * recordStep + inner * typeSize : v.offset + inner * typeSize;
    if (!Number.isFinite(end) || v.offset < 0 || (shape.every((x) => x > 0) && end > fileSize)) {
      fs.closeSync(fd);
      throw bad(
        `variable ${v.name} would end at byte ${end.toLocaleString('en-US')} but the file has ${fileSize.toLocaleString('en-US')} bytes: the file is cut short or its header is damaged`,
      );
    }
    variables.push({ name: v.name, dims: v.dimensions.map((id) => dims[id]?.name ?? `dim${id}`), shape, attrs });
    layout.set(v.name, { v, shape });
  }

  const readBytes = (offset: number, length: number): DataView => {
    if (offset < 0 || offset + length > fileSize) {
      throw bad(`a value lies beyond the end of the file (byte ${offset + length} of ${fileSize}): the file is cut short`);
    }
    const b = Buffer.alloc(length);
    fs.readSync(fd, b, 0, length, offset);
    return new DataView(b.buffer, b.byteOffset, b.byteLength);
  };

  return {
    format: 'classic',
    variables,
    readRaw(name, start, count) {
      const l = variableOf(layout, name);
      const type = CLASSIC_TYPES[l.v.type];
      if (!type) throw bad(`variable ${name} has type ${l.v.type}, which is not read`);
      const { shape } = l;
      const total = count.reduce((a, b) => a * b, 1);
      const out = new Float64Array(total);
      if (total === 0) return out;
      // Byte offset of an element: record variables step by recordStep along the first axis.
      const inner = shape.slice(l.v.record ? 1 : 0);
      const strides = new Array<number>(inner.length);
      for (let k = inner.length - 1, s = type.size; k >= 0; k--) {
        strides[k] = s;
        s *= inner[k];
      }
      const elementOffset = (idx: number[]) => {
        let o = l.v.offset;
        const rest = l.v.record ? idx.slice(1) : idx;
        if (l.v.record) o += idx[0] * recordStep;
        for (let k = 0; k < rest.length; k++) o += rest[k] * strides[k];
        return o;
      };
      // Walk the hyperslab; consecutive elements along the last axis are read in one block, and
      // runs of records are read in blocks of up to 8 MB.
      const last = count.length - 1;
      const rowLen = last >= 0 ? count[last] : 1;
      const rows = total / rowLen;
      const idx = start.slice();
      const BLOCK = 8 << 20;
      let cache: { from: number; to: number; dv: DataView } | null = null;
      const fetch = (o: number, len: number) => {
        if (!cache || o < cache.from || o + len > cache.to) {
          const want = Math.max(len, Math.min(BLOCK, fileSize - o));
          cache = { from: o, to: o + want, dv: readBytes(o, want) };
        }
        return { dv: cache.dv, at: o - cache.from };
      };
      for (let r = 0, w = 0; r < rows; r++) {
        const o = elementOffset(idx);
        const rowStride = last >= 0 ? (l.v.record && last === 0 ? recordStep : strides[l.v.record ? last - 1 : last]) : type.size;
        if (rowStride === type.size) {
          const { dv, at } = fetch(o, rowLen * type.size);
          for (let k = 0; k < rowLen; k++) out[w++] = type.get(dv, at + k * type.size);
        } else {
          for (let k = 0; k < rowLen; k++) {
            const { dv, at } = fetch(o + k * rowStride, type.size);
            out[w++] = type.get(dv, at);
          }
        }
        // Next row: advance the axes before the last one.
        for (let k = last - 1; k >= 0; k--) {
          idx[k]++;
          if (idx[k] < start[k] + count[k]) break;
          idx[k] = start[k];
        }
      }
      return out;
    },
    close() {
      fs.closeSync(fd);
    },
  };
}
