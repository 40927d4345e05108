import { ErrorNotice, Spinner } from '../../../components/ui';
import { useDatasetMonthly } from '../api/get-dataset-monthly';
import { formatCount, formatUtc, formatValue } from './format';
import { HeadingRow } from '../../../components/ui/table';

const th = 'sticky top-0 bg-surface-2 px-3 py-2 text-xs font-semibold text-ink-soft';

/**
 * Records, coverage, mean and 90th percentile Hs per calendar month (UTC). A month can be picked
 * to show it in the chart.
 */
export function MonthlyTable({
  projectId,
  datasetId,
  onPick,
}: {
  projectId: string;
  datasetId: string;
  onPick: (fromMs: number, toMs: number) => void;
}) {
  const monthly = useDatasetMonthly(projectId, datasetId);
  if (monthly.isPending) return <Spinner label="Summing up the months" />;
  if (monthly.error) return <ErrorNotice error={monthly.error} />;
  const rows = monthly.data;
  if (rows.length === 0) return <p className="text-sm text-ink-soft">No records.</p>;
  return (
    <div className="max-h-[28rem] overflow-auto rounded-lg border border-line">
      <table className="w-full text-sm" data-testid="monthly-table">
        <thead>
          <HeadingRow cellClassName={th} right={[1, 3, 4]} headings={['Month', 'Records', 'Hs coverage', 'Mean Hs (m)', 'P90 Hs (m)']} />
        </thead>
        <tbody>
          {rows.map((r) => {
            const fromMs = Date.UTC(r.year, r.month - 1, 1);
            const toMs = Date.UTC(r.year, r.month, 1) - 1;
            const pct = Math.round(r.coverage * 1000) / 10;
            return (
              <tr key={`${r.year}-${r.month}`} className="border-t border-line">
                <td className="px-1 py-0">
                  <button
                    type="button"
                    className="inline-flex min-h-11 items-center rounded-lg px-2 font-semibold whitespace-nowrap text-accent hover:bg-surface-2 hover:underline"
                    onClick={() => onPick(fromMs, toMs)}
                    title="Show this month in the chart"
                  >
                    {formatUtc(fromMs, 'yyyy-MM')}{' '}
                    <span className="ml-1 hidden font-normal text-ink-soft sm:inline">{formatUtc(fromMs, 'MMM')}</span>
                  </button>
                </td>
                <td className="px-3 py-1 text-right tabular-nums">{formatCount(r.records)}</td>
                <td className="px-3 py-1">
                  <div className="flex items-center gap-2">
                    <div className="hidden h-2 w-24 shrink-0 overflow-hidden rounded-full bg-surface-2 sm:block" aria-hidden>
                      <div className={`h-full ${pct < 80 ? 'bg-st-marginal' : 'bg-accent'}`} style={{ width: `${Math.min(100, pct)}%` }} />
                    </div>
                    <span className="whitespace-nowrap tabular-nums">{pct.toFixed(pct >= 99.95 ? 0 : 1)} %</span>
                  </div>
                </td>
                <td className="px-3 py-1 text-right tabular-nums">{formatValue(r.hsMean, 2)}</td>
                <td className="px-3 py-1 text-right tabular-nums">{formatValue(r.hsP90, 2)}</td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
