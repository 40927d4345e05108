/**
 * Field-by-field differences between an audit entry's "before" and "after" snapshots.
 *
 * Objects are walked down to their leaves (so a change of `limits.hsMax` shows as that one field,
 * not the whole limits object); arrays are compared whole and shown whole (an Hs-Tp curve, a band
 * list or a transfer table is one value to the reader). A field present on one side only counts as
 * a change from or to "not set". On create and import (`before` null) every field of `after` is
 * listed, on delete (`after` null) every field of `before`.
 */
export interface FieldChange {
  /** path of the field, e.g. ['limits', 'hsMax'] */
  path: string[];
  /** undefined = not set on that side */
  before: unknown;
  after: unknown;
}

const isPlainObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);

/** Deep equality of JSON values. */
export function sameJson(a: unknown, b: unknown): boolean {
  if (a === b) return true;
  if (Array.isArray(a) && Array.isArray(b)) return a.length === b.length && a.every((x, i) => sameJson(x, b[i]));
  if (isPlainObject(a) && isPlainObject(b)) {
    const keys = new Set([...Object.keys(a), ...Object.keys(b)]);
    for (const k of keys) if (!sameJson(a[k], b[k])) return false;
    return true;
  }
  return false;
}

/**
 * @param isLeaf paths to compare whole even when they hold objects (a transfer table, an alpha
 *   table); by default only arrays and primitives are leaves.
 */
export function auditChanges(before: unknown, after: unknown, isLeaf: (path: string[]) => boolean = () => false): FieldChange[] {
  const out: FieldChange[] = [];
  walk([], before ?? undefined, after ?? undefined, out, isLeaf);
  return out;
}

function walk(path: string[], before: unknown, after: unknown, out: FieldChange[], isLeaf: (path: string[]) => boolean): void {
  const bObj = isPlainObject(before);
  const aObj = isPlainObject(after);
  const absent = (v: unknown) => v === undefined || v === null;
  // Descend when both sides are objects, or one is and the other is absent (created, deleted).
  if ((bObj || aObj) && (bObj || absent(before)) && (aObj || absent(after)) && (path.length === 0 || !isLeaf(path))) {
    const b = bObj ? before : {};
    const a = aObj ? after : {};
    // Key order: the "after" snapshot's, then keys only "before" had.
    const keys = [...Object.keys(a), ...Object.keys(b).filter((k) => !(k in a))];
    for (const k of keys) walk([...path, k], b[k], a[k], out, isLeaf);
    return;
  }
  if (!sameJson(before ?? undefined, after ?? undefined)) out.push({ path, before, after });
}
