import { lazy, Suspense, useMemo, useState } from 'react';
import type { WorkabilityCalendarMonth, WorkabilityEntry, WorkabilityYearMonth } from '../../../../shared/api-types-downtime';
import { Button, Card, ErrorNotice, Notice, SectionHeading, Select, Spinner } from '../../../components/ui';
import { Term } from '../../../components/ui/term';
import { downloadCsv, toCsv } from '../../../lib/csv';
import { hours, MONTH_LONG, MONTH_SHORT, num, pct } from './format';
import type { HeatRow } from './downtime-heatmap';
import { HeadingRow } from '../../../components/ui/table';

// The chart library is large: load it only when the heat map is shown.
const DowntimeHeatmap = lazy(() => import('./downtime-heatmap'));

const th = 'sticky top-0 z-10 bg-surface-2 px-2 py-2 text-xs font-semibold text-ink-soft';
const td = 'px-2 py-1 text-right tabular-nums whitespace-nowrap';

const pairLabel = (e: WorkabilityEntry) => `${e.operationName} · ${e.siteName}`;

/**
 * Expected weather downtime by month for every operation at each worksite: a heat map of
 * 100 - workability (%) and a plain table with the same numbers and the rest of the statistics,
 * each downloadable as CSV; and a year-by-year heat map of one operation at one worksite.
 */
export function WorkabilitySection({
  entries,
  isFetching,
  error,
  alpha,
  datasetName,
}: {
  entries: WorkabilityEntry[] | undefined;
  isFetching: boolean;
  error: unknown;
  alpha: boolean;
  datasetName: string;
}) {
  const [pick, setPick] = useState(0);
  const rows: HeatRow[] = useMemo(
    () =>
      (entries ?? []).map((e) => ({
        id: pairLabel(e),
        data: e.months.map((m) => ({ x: MONTH_SHORT[m.month - 1], y: m.workability === null ? null : (1 - m.workability) * 100 })),
      })),
    [entries],
  );
  const chosen = entries?.[Math.min(pick, (entries?.length ?? 1) - 1)];
  const yearRows: HeatRow[] = useMemo(() => {
    if (!chosen) return [];
    const years = [...new Set(chosen.yearMonths.map((m) => m.year))].sort((a, b) => a - b);
    return years.map((y) => ({
      id: String(y),
      data: MONTH_SHORT.map((label, k) => {
        const m = chosen.yearMonths.find((v) => v.year === y && v.month === k + 1);
        return { x: label, y: m && m.workability !== null ? (1 - m.workability) * 100 : null };
      }),
    }));
  }, [chosen]);

  function downloadMonths() {
    if (!entries) return;
    downloadCsv(
      `expected-downtime-${alpha ? 'alpha' : 'oplim'}.csv`,
      toCsv(
        ['operation', 'worksite', 'time_zone', 'month', ...monthFigureColumns('windows_per_month'), 'years'],
        entries.flatMap((e) =>
          e.months.map((m) => [e.operationName, e.siteName, e.timeZone, m.month, ...monthFigures(m, m.windowsPerMonth), m.years]),
        ),
      ),
    );
  }

  function downloadYears() {
    if (!chosen) return;
    downloadCsv(
      `downtime-by-year-${alpha ? 'alpha' : 'oplim'}.csv`,
      toCsv(
        ['operation', 'worksite', 'year', 'month', ...monthFigureColumns('windows')],
        chosen.yearMonths.map((m) => [chosen.operationName, chosen.siteName, m.year, m.month, ...monthFigures(m, m.windows)]),
      ),
    );
  }

  return (
    <Card className="flex flex-col gap-4" aria-labelledby="expected-downtime-title">
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <SectionHeading id="expected-downtime-title" title="Expected weather downtime by month" narrow>
            Share of hours not workable (100 % − workability) in each calendar month of {datasetName || 'the hindcast'}, months as the
            worksite’s calendar has them (basis at the top of the page).
          </SectionHeading>
        </div>
        <Button variant="secondary" className="no-print" onClick={downloadMonths} disabled={!entries || entries.length === 0}>
          Download CSV
        </Button>
      </div>
      {error ? <ErrorNotice error={error} /> : null}
      {!entries && !error ? <Spinner label="Working through the hindcast" /> : null}
      {entries && entries.length === 0 ? (
        <Notice>No operation takes place at a worksite yet: add them under Sites &amp; limits.</Notice>
      ) : null}
      {entries && entries.length > 0 ? (
        <div className={isFetching ? 'opacity-60 transition-opacity' : 'transition-opacity'}>
          <figure className="overflow-x-auto" data-testid="downtime-heatmap">
            <Suspense fallback={<Spinner label="Drawing the heat map" />}>
              <DowntimeHeatmap
                rows={rows}
                label="Expected weather downtime by month, percent of hours, for each operation at each worksite"
              />
            </Suspense>
            <figcaption className="mt-1 text-xs text-ink-soft">
              Numbers in the cells: downtime in % of the month’s hours with data. Grey: no data.
            </figcaption>
          </figure>
          <MonthlyTable entries={entries} />
        </div>
      ) : null}
      {chosen ? (
        <div className="flex flex-col gap-3 border-t border-line pt-4 print:break-before-page">
          <div className="flex flex-wrap items-end justify-between gap-3">
            <div className="flex flex-col gap-1">
              <h3 className="text-base font-bold">Year by year</h3>
              <label className="text-sm text-ink-soft" htmlFor="year-pair">
                Downtime (%) of one operation at one worksite in every hindcast year
              </label>
              <Select
                id="year-pair"
                className="no-print max-w-md"
                value={String(Math.min(pick, entries!.length - 1))}
                onChange={(e) => setPick(Number(e.target.value))}
              >
                {entries!.map((e, i) => (
                  <option key={`${e.operationId}-${e.siteId}`} value={i}>
                    {pairLabel(e)}
                  </option>
                ))}
              </Select>
              <p className="hidden text-sm font-semibold print:block">{pairLabel(chosen)}</p>
            </div>
            <Button variant="secondary" className="no-print" onClick={downloadYears}>
              Download CSV
            </Button>
          </div>
          <figure className="overflow-x-auto" data-testid="downtime-by-year">
            <Suspense fallback={<Spinner label="Drawing the heat map" />}>
              <DowntimeHeatmap
                rows={yearRows}
                labelWidth={64}
                label={`Weather downtime by year and month, percent of hours, ${pairLabel(chosen)}`}
              />
            </Suspense>
          </figure>
          <YearTable entry={chosen} />
        </div>
      ) : null}
    </Card>
  );
}

const round = (x: number, d: number) => Math.round(x * 10 ** d) / 10 ** d;

/** The names of the columns of {@link monthFigures}, the windows column named `windows`. */
const monthFigureColumns = (windows: string) => [
  'downtime_pct',
  'workability_pct',
  'go_start_share_pct',
  'wow_mean_h',
  'wow_p90_h',
  windows,
  'mean_window_h',
  'censored_records',
];

/** The CSV columns from downtime_pct to censored_records of a calendar month or a year's month (`windows`: its count of windows). */
const monthFigures = (m: WorkabilityCalendarMonth | WorkabilityYearMonth, windows: number | null) => [
  m.workability === null ? null : round((1 - m.workability) * 100, 2),
  m.workability === null ? null : round(m.workability * 100, 2),
  m.goStartShare === null ? null : round(m.goStartShare * 100, 2),
  m.wowMeanHours,
  m.wowP90Hours,
  windows,
  m.meanWindowHours,
  m.censored,
];

/** Hours the WoW figures stand on: hours with data that have a go-start after them before the data end. */
const wowStarts = (m: WorkabilityCalendarMonth) => Math.max(0, m.recordsWithData - m.censored);

// Where a figure stands on little (common practice, no source): fewer than 3 years of a month
// cannot show the spread between years; a WoW mean from under a quarter of the month's hours
// leaves most hours out (they found no go-start before the data ended).
const FEW_YEARS = 3;
const FEW_STARTS_SHARE = 0.25;

/** A short note when the month's statistics stand on thin data; null otherwise. */
function thinNote(m: WorkabilityCalendarMonth): string | null {
  const notes: string[] = [];
  if (m.years > 0 && m.years < FEW_YEARS) notes.push(`only ${m.years} year${m.years === 1 ? '' : 's'}`);
  if (m.wowMeanHours !== null && m.recordsWithData > 0 && wowStarts(m) < FEW_STARTS_SHARE * m.recordsWithData)
    notes.push('WoW from few hours');
  return notes.length > 0 ? `Thin: ${notes.join(', ')}` : null;
}

/** The same numbers as the heat map, and the other statistics, one row group per operation at a worksite. */
function MonthlyTable({ entries }: { entries: WorkabilityEntry[] }) {
  return (
    <div
      className="mt-4 max-h-[36rem] overflow-auto rounded-lg border border-line print:max-h-none print:overflow-visible"
      // Scrolls with the keyboard too, whatever the table holds.
      tabIndex={0}
      role="region"
      aria-label="Workability statistics by month, scrolls"
    >
      <table className="w-full min-w-[52rem] text-sm" data-testid="workability-table">
        <caption className="sr-only">
          Expected weather downtime and workability statistics by month for each operation at each worksite
        </caption>
        <thead>
          <HeadingRow
            cellClassName={th}
            right={[1, 2, 3, 4, 5, 6, 7, 8]}
            headings={[
              'Month',
              'Downtime',
              'Workability',
              <Term k="goStart" />,
              <Term k="wow">WoW mean</Term>,
              <Term k="wow">WoW P90</Term>,
              'Windows per month',
              'Mean window',
              <Term k="censored">Censored (records)</Term>,
            ]}
          />
        </thead>
        {entries.map((e) => (
          <tbody key={`${e.operationId}-${e.siteId}`} className="break-inside-avoid">
            <tr className="border-t border-line bg-surface-2/60">
              <th scope="rowgroup" colSpan={9} className="px-2 py-2 text-left text-sm font-semibold">
                {e.operationName} <span className="font-normal text-ink-soft">at {e.siteName}</span>
                <span className="ml-2 text-xs font-normal text-ink-soft">
                  <Term k="tpop" /> {e.tpopHours} h, <Term k="tr" /> {e.tpopHours + e.tcHours} h
                </span>
              </th>
            </tr>
            {e.months.map((m) => (
              <tr key={m.month} className="border-t border-line/60">
                <th scope="row" className="px-2 py-1 text-left font-normal whitespace-nowrap">
                  {MONTH_LONG[m.month - 1]}
                  <span className="block text-xs text-ink-soft" data-testid="month-basis">
                    {m.years} yr, {m.recordsWithData.toLocaleString('en-GB')} h with data
                  </span>
                  {thinNote(m) ? <span className="block text-xs font-semibold text-danger">{thinNote(m)}</span> : null}
                </th>
                <td className={`${td} font-semibold`}>{m.workability === null ? '–' : pct(1 - m.workability)}</td>
                <td className={td}>{pct(m.workability)}</td>
                <td className={td}>{pct(m.goStartShare)}</td>
                <td className={td}>
                  {hours(m.wowMeanHours)}
                  {m.wowMeanHours !== null ? (
                    <span className="block text-xs text-ink-soft">
                      from {wowStarts(m).toLocaleString('en-GB')} of {m.recordsWithData.toLocaleString('en-GB')} h
                    </span>
                  ) : null}
                </td>
                <td className={td}>{hours(m.wowP90Hours)}</td>
                <td className={td}>{num(m.windowsPerMonth, 2)}</td>
                <td className={td}>{hours(m.meanWindowHours)}</td>
                <td className={td}>{m.censored}</td>
              </tr>
            ))}
          </tbody>
        ))}
      </table>
    </div>
  );
}

/** Year-by-year numbers of one operation at one worksite. */
function YearTable({ entry }: { entry: WorkabilityEntry }) {
  return (
    <details className="rounded-lg border border-line print:hidden">
      <summary className="flex min-h-11 cursor-pointer items-center px-3 text-sm font-semibold">
        Year-by-year table ({entry.yearMonths.length} months)
      </summary>
      <div className="max-h-[28rem] overflow-auto">
        <table className="w-full min-w-[44rem] text-sm">
          <caption className="sr-only">Weather downtime by year and month, {pairLabel(entry)}</caption>
          <thead>
            <tr>
              {['Month', 'Downtime', 'Workability', 'Go-start share', 'WoW mean', 'WoW P90', 'Windows', 'Mean window'].map((h, i) => (
                <th key={h} scope="col" className={`${th} ${i === 0 ? 'text-left' : 'text-right'}`}>
                  {h}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {entry.yearMonths.map((m) => (
              <tr key={`${m.year}-${m.month}`} className="border-t border-line/60">
                <th scope="row" className="px-2 py-1 text-left font-normal whitespace-nowrap">
                  {MONTH_SHORT[m.month - 1]} {m.year}
                </th>
                <td className={`${td} font-semibold`}>{m.workability === null ? '–' : pct(1 - m.workability)}</td>
                <td className={td}>{pct(m.workability)}</td>
                <td className={td}>{pct(m.goStartShare)}</td>
                <td className={td}>{hours(m.wowMeanHours)}</td>
                <td className={td}>{hours(m.wowP90Hours)}</td>
                <td className={td}>{m.windows}</td>
                <td className={td}>{hours(m.meanWindowHours)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </details>
  );
}
