import { ImportError, NdbcParser, type ImportIssue, type SeaRecords } from '../../../../shared/seadata';
import { formatUtc, formatValue, previewColumns } from './format';

export interface NdbcPreview {
  /** The first records, oldest first. */
  records: SeaRecords | null;
  notes: string[];
  issues: ImportIssue[];
  /** Set when the text could not be read at all. */
  error: string | null;
}

/**
 * Reads the leading text of an NDBC file as the import will (bad rows skipped here only so the
 * preview shows the rest); `head` must end at a line break.
 */
export function previewNdbc(head: string, anemometerHeightM: number | undefined, windExponent?: number): NdbcPreview {
  try {
    const p = new NdbcParser({ onBadRows: 'skip', anemometerHeightM, windExponent });
    p.push(head);
    const { records, report } = p.end();
    return { records, notes: report.notes, issues: report.issues, error: null };
  } catch (e) {
    if (e instanceof ImportError) return { records: null, notes: [], issues: e.issues, error: e.message };
    if (e instanceof RangeError) return { records: null, notes: [], issues: [], error: e.message };
    throw e;
  }
}

const COLS = previewColumns<keyof Omit<SeaRecords, 'timeMs' | 'extra'>>([
  ['hs', 2],
  ['tp', 2],
  ['tz', 2],
  ['dir', 0],
  ['wind', 1],
  ['windDir', 0],
]);

/** The first records of an NDBC file as they will be stored. */
export function NdbcPreviewTable({ preview, rows = 12 }: { preview: NdbcPreview; rows?: number }) {
  const r = preview.records;
  if (!r) return null;
  const n = Math.min(rows, r.timeMs.length);
  const idx = Array.from({ length: n }, (_, i) => i);
  return (
    <div className="overflow-x-auto rounded-lg border border-line bg-surface">
      <table className="w-full text-sm" data-testid="ndbc-preview">
        <caption className="px-3 py-2 text-left text-sm text-ink-soft">
          The first {n} records as they will be stored (oldest first).
        </caption>
        <thead className="border-y border-line bg-surface-2">
          <tr>
            <th className="px-3 py-2 text-left text-xs font-semibold text-ink-soft">Time</th>
            {COLS.map((c) => (
              <th key={c.key} className="px-3 py-2 text-right text-xs font-semibold whitespace-nowrap text-ink-soft">
                {c.label}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {idx.map((i) => (
            <tr key={i} className="border-b border-line last:border-0">
              <td className="px-3 py-1.5 whitespace-nowrap">{formatUtc(r.timeMs[i])}</td>
              {COLS.map((c) => (
                <td key={c.key} className="px-3 py-1.5 text-right tabular-nums">
                  {formatValue(r[c.key][i], c.decimals)}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
