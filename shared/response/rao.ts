/**
 * Response amplitude operators (RAOs) of a vessel and their interpolation
 * (docs/domain.md#vessel-response).
 *
 * Heading convention: relative heading = the direction the waves come from minus the vessel's
 * heading (both degrees true), so 0 deg = waves from ahead (head seas), 90 deg = from starboard,
 * 180 deg = from astern, 270 deg = from port. A table of 0-180 deg only is mirrored to 180-360
 * (a port-starboard symmetric vessel; roll changes sign there, which the squared RAO ignores).
 */

/** Response kinds and their units (per metre of wave amplitude). */
export const RESPONSE_KINDS = {
  heave: { column: 'heave_m_per_m', unit: 'm', label: 'Heave' },
  roll: { column: 'roll_deg_per_m', unit: 'deg', label: 'Roll' },
  pitch: { column: 'pitch_deg_per_m', unit: 'deg', label: 'Pitch' },
  velZ: { column: 'vel_z_m_s_per_m', unit: 'm/s', label: 'Vertical velocity' },
  accZ: { column: 'acc_z_m_s2_per_m', unit: 'm/s²', label: 'Vertical acceleration' },
} as const;
export type ResponseKind = keyof typeof RESPONSE_KINDS;

/** A point name after '@' in a column: letters, digits, '_' and '-', 1-40 characters. */
export const POINT_NAME = /^[A-Za-z0-9_-]{1,40}$/;

/**
 * The response a column names, e.g. 'roll_deg_per_m' -> roll, 'vel_z_m_s_per_m@crane_tip' ->
 * velZ at crane_tip; null when the column is not a response. Velocity and acceleration need a point.
 */
export function parseResponseColumn(column: string): { kind: ResponseKind; point: string | null } | null {
  const at = column.indexOf('@');
  const base = at < 0 ? column : column.slice(0, at);
  const point = at < 0 ? null : column.slice(at + 1);
  for (const [kind, def] of Object.entries(RESPONSE_KINDS) as [ResponseKind, (typeof RESPONSE_KINDS)[ResponseKind]][]) {
    if (def.column !== base) continue;
    const pointed = kind === 'velZ' || kind === 'accZ';
    if (pointed !== (point !== null)) return null;
    if (point !== null && !POINT_NAME.test(point)) return null;
    return { kind, point };
  }
  return null;
}

/** Unit of a response name (its column), e.g. 'deg' for roll_deg_per_m. */
export function responseUnit(name: string): string {
  const r = parseResponseColumn(name);
  return r ? RESPONSE_KINDS[r.kind].unit : '';
}

/** Words for a response name, e.g. "Roll", "Vertical velocity at crane_tip". */
export function responseLabel(name: string): string {
  const r = parseResponseColumn(name);
  if (!r) return name;
  return r.point ? `${RESPONSE_KINDS[r.kind].label} at ${r.point}` : RESPONSE_KINDS[r.kind].label;
}

/** An RAO table: amplitudes per response, heading and period. */
export interface RaoTable {
  /** Wave periods, s, strictly ascending. */
  periodsS: number[];
  /** Relative headings, deg, strictly ascending within [0, 360]. */
  headingsDeg: number[];
  /** Response name (its column) -> amplitude [heading index][period index], per metre of wave amplitude. */
  responses: Record<string, number[][]>;
}

/**
 * An RAO table prepared for interpolation of squared amplitudes: headings unfolded over a full
 * turn (mirrored when the table stops at 180 deg, wrapped at 360 deg).
 */
export interface PreparedRao {
  periods: Float64Array;
  /** Headings of the unfolded table, ascending, the first repeated + 360 at the end. */
  headings: Float64Array;
  /** Amplitudes [headingIndex * periods.length + periodIndex] per response. */
  amplitudes: Record<string, Float64Array>;
  names: string[];
}

const prepared = new WeakMap<RaoTable, PreparedRao>();

/** Prepares (and caches) a table for {@link raoSquaredAt}. */
export function prepareRao(table: RaoTable): PreparedRao {
  const hit = prepared.get(table);
  if (hit) return hit;
  const np = table.periodsS.length;
  const src = table.headingsDeg;
  // Unfold: a table within 0-180 deg is mirrored (h -> 360 - h), skipping 0 and 180's twins.
  const mirrored = src[src.length - 1] <= 180;
  const rows: { h: number; from: number }[] = src.map((h, i) => ({ h: h % 360, from: i }));
  if (mirrored) for (let i = src.length - 1; i >= 0; i--) if (src[i] > 0 && src[i] < 180) rows.push({ h: 360 - src[i], from: i });
  rows.sort((a, b) => a.h - b.h);
  // 0 and 360 given both: keep the first (they are the same heading).
  const uniq = rows.filter((r, i) => i === 0 || r.h !== rows[i - 1].h);
  uniq.push({ h: uniq[0].h + 360, from: uniq[0].from });
  const headings = Float64Array.from(uniq.map((r) => r.h));
  const amplitudes: Record<string, Float64Array> = {};
  for (const [name, values] of Object.entries(table.responses)) {
    const amp = new Float64Array(uniq.length * np);
    uniq.forEach((r, k) => {
      for (let p = 0; p < np; p++) amp[k * np + p] = Math.abs(values[r.from][p]);
    });
    amplitudes[name] = amp;
  }
  const out: PreparedRao = { periods: Float64Array.from(table.periodsS), headings, amplitudes, names: Object.keys(table.responses) };
  prepared.set(table, out);
  return out;
}

/** Wraps an angle to [0, 360). */
export function wrap360(deg: number): number {
  const r = deg % 360;
  return r < 0 ? r + 360 : r;
}

/** Heading position: index k of the lower row and the fraction towards k + 1. */
export function headingPosition(rao: PreparedRao, relDeg: number, out: Float64Array): void {
  const hs = rao.headings;
  let h = wrap360(relDeg);
  if (h < hs[0]) h += 360;
  let k = 0;
  while (k < hs.length - 2 && hs[k + 1] <= h) k++;
  out[0] = k;
  out[1] = (h - hs[k]) / (hs[k + 1] - hs[k]);
}

/**
 * |RAO|^2 at a period and a relative heading: the amplitude interpolated linearly in period and
 * heading between the table's points, then squared; heading periodic; outside the period range
 * the end values are held (docs/domain.md#vessel-response).
 */
export function raoSquaredAt(rao: PreparedRao, name: string, periodS: number, relDeg: number): number {
  const pos = new Float64Array(2);
  headingPosition(rao, relDeg, pos);
  return raoSquaredAtPosition(rao.amplitudes[name], rao.periods, pos[0], pos[1], periodS);
}

/** {@link raoSquaredAt} with the heading position already found. */
export function raoSquaredAtPosition(amp: Float64Array, periods: Float64Array, k: number, fh: number, periodS: number): number {
  const np = periods.length;
  let p: number;
  let fp: number;
  if (periodS <= periods[0]) {
    p = 0;
    fp = 0;
  } else if (periodS >= periods[np - 1]) {
    p = np - 1;
    fp = 0;
  } else {
    p = periodSegment(periods, periodS);
    fp = (periodS - periods[p]) / (periods[p + 1] - periods[p]);
  }
  const a = k * np + p;
  const b = a + np;
  const p1 = fp > 0 ? 1 : 0;
  const lowRow = amp[a] + (amp[a + p1] - amp[a]) * fp;
  const highRow = amp[b] + (amp[b + p1] - amp[b]) * fp;
  const v = lowRow + (highRow - lowRow) * fh;
  return v * v;
}

/** Index lo of the segment periods[lo] <= T < periods[lo + 1] holding T (binary search; periods[0] < T < the last period). */
export function periodSegment(periods: ArrayLike<number>, T: number): number {
  let lo = 0;
  let hi = periods.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (periods[mid] <= T) lo = mid;
    else hi = mid;
  }
  return lo;
}
