import { HeadingRow } from '../../../components/ui/table';
/** One problem of an imported file, as the API reports it. */
export interface IssueRow {
  line?: number;
  column?: string;
  value?: string;
  reason?: string;
}

/**
 * Problems of an import, one row each: line (1-based, 0 = the whole file), column, raw value and
 * reason. Shows at most `limit` rows and says how many more there are.
 */
export function IssuesTable({
  issues,
  total,
  limit = 50,
  caption,
}: {
  issues: IssueRow[];
  total?: number;
  limit?: number;
  caption: string;
}) {
  const shown = issues.slice(0, limit);
  const count = Math.max(total ?? issues.length, issues.length);
  return (
    <div className="overflow-x-auto rounded-lg border border-line bg-surface">
      <table className="w-full text-sm" data-testid="issues-table">
        <caption className="px-3 py-2 text-left text-sm text-ink-soft">
          {caption}
          {count > shown.length ? ` (the first ${shown.length} of ${count.toLocaleString('en-GB')})` : ''}
        </caption>
        <thead className="border-y border-line bg-surface-2">
          <HeadingRow
            cellClassName="px-3 py-2 text-xs font-semibold text-ink-soft"
            right={[0]}
            headings={['Line', 'Column', 'Value', 'Reason']}
          />
        </thead>
        <tbody>
          {shown.map((i, k) => (
            <tr key={k} className="border-b border-line last:border-0">
              <td className="px-3 py-1.5 text-right tabular-nums">{i.line === 0 ? 'file' : (i.line ?? '–')}</td>
              <td className="px-3 py-1.5">{i.column || '–'}</td>
              <td className="max-w-56 px-3 py-1.5 font-mono text-xs break-all">
                {i.value === undefined || i.value === '' ? '–' : i.value}
              </td>
              <td className="px-3 py-1.5">{i.reason ?? ''}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
