import { WATER_LEVEL_REFERENCE_WORDS } from '../../../../shared/seadata/water-level';
import type { ReactNode } from 'react';
import type { DatasetDetail } from '../../../../shared/api-types-datasets';
import { Card } from '../../../components/ui';
import { formatCount, formatUtc } from './format';
import { IssuesTable, type IssueRow } from './issues-table';

/** The stored import report, read defensively (older or service datasets hold fewer fields). */
interface ReportView {
  format?: string;
  mode?: string;
  rowsRead?: number;
  records?: number;
  rowsSkipped?: number;
  newestFirst?: boolean;
  issues: IssueRow[];
  issueCount?: number;
  notes: string[];
  timeZone?: string;
  source?: string;
}

const num = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) ? v : undefined);
const str = (v: unknown) => (typeof v === 'string' ? v : undefined);

function readReport(r: Record<string, unknown>): ReportView {
  const issues = Array.isArray(r.issues)
    ? (r.issues as unknown[])
        .filter((i): i is Record<string, unknown> => typeof i === 'object' && i !== null)
        .map((i) => ({
          line: num(i.line),
          column: str(i.column),
          value: str(i.value),
          reason: str(i.reason),
        }))
    : [];
  return {
    format: str(r.format),
    mode: str(r.mode),
    rowsRead: num(r.rowsRead),
    records: num(r.records),
    rowsSkipped: num(r.rowsSkipped),
    newestFirst: typeof r.newestFirst === 'boolean' ? r.newestFirst : undefined,
    issues,
    issueCount: num(r.issueCount),
    notes: Array.isArray(r.notes) ? (r.notes as unknown[]).filter((n): n is string => typeof n === 'string') : [],
    timeZone: str(r.timeZone),
    source: str(r.source),
  };
}

const PERIODS: { key: 'tp' | 'tz' | 'te'; label: string }[] = [
  { key: 'tp', label: 'Tp, peak period' },
  { key: 'tz', label: 'Tz, zero-crossing period' },
  { key: 'te', label: 'Te, energy period' },
];

/** How the dataset was read: rows, skipped rows and their problems, decisions, derived periods. */
export function ImportReportCard({ d }: { d: DatasetDetail }) {
  const r = readReport(d.importReport);
  const fromService = d.source.kind === 'service';
  const formatName =
    r.format === 'ndbc'
      ? 'NDBC standard meteorological text'
      : r.format === 'csv'
        ? 'CSV'
        : r.format === 'netcdf'
          ? 'NetCDF (CF conventions)'
          : (r.format ?? r.source);
  return (
    <Card>
      <h2 className="mb-3 text-lg font-bold">{fromService ? 'How it was fetched' : 'Import report'}</h2>
      <dl className="grid gap-x-6 gap-y-3 text-sm sm:grid-cols-2 lg:grid-cols-4">
        {fromService ? (
          <>
            <Item label="Source">Forecast service{r.source ? ` (${r.source})` : ''}</Item>
            <Item label="Issued">{d.source.issuedAt ? formatUtc(d.source.issuedAt) : 'unknown'}</Item>
          </>
        ) : (
          <>
            <Item label="File">
              {d.source.fileName ?? 'name not recorded'}
              {formatName ? <span className="block font-normal text-ink-soft">{formatName}</span> : null}
            </Item>
            {r.rowsRead !== undefined ? <Item label="Rows read">{formatCount(r.rowsRead)}</Item> : null}
            <Item label="Records kept">{formatCount(r.records ?? d.records)}</Item>
            {r.rowsSkipped !== undefined ? (
              <Item label="Rows skipped">
                {formatCount(r.rowsSkipped)}
                <span className="block font-normal text-ink-soft">
                  {r.mode === 'skip' ? 'bad rows were skipped and listed' : 'bad rows refuse the file'}
                </span>
              </Item>
            ) : null}
            {r.timeZone && r.format !== 'ndbc' && r.format !== 'netcdf' ? (
              <Item label="Times without offset read in">
                {/* An import setting (the file's zone), not a statement of the page's times. */}
                <span data-setting>{r.timeZone}</span>
              </Item>
            ) : null}
            {r.newestFirst ? <Item label="Order">Newest first in the file; stored oldest first</Item> : null}
            <Item label="Wind height">
              {d.wind.anemometerHeightM === null
                ? 'not stated (kept as read)'
                : d.wind.anemometerHeightM === 10
                  ? 'already at 10 m'
                  : `${d.wind.anemometerHeightM} m above the sea, brought to 10 m`}
              {d.wind.anemometerHeightM !== null && d.wind.anemometerHeightM !== 10 && d.wind.exponent !== null ? (
                <span className="block font-normal text-ink-soft">
                  U10 = Uz·(10/z)^a, a = {Math.abs(d.wind.exponent - 1 / 7) < 1e-9 ? '1/7 (over land)' : `${d.wind.exponent} (open sea)`}
                </span>
              ) : null}
            </Item>
            {d.waterLevelReference ? <Item label="Water level">{WATER_LEVEL_REFERENCE_WORDS[d.waterLevelReference]}</Item> : null}
            {str(d.importReport.currentDirConvention) ? (
              <Item label="Current directions">
                stored as flowing towards
                {d.importReport.currentDirConvention === 'coming-from'
                  ? ' (the file’s coming-from directions, 180° added)'
                  : ' (as in the file)'}
              </Item>
            ) : null}
            {str(d.importReport.directionConvention) ? (
              <Item label="Directions in the file">
                {d.importReport.directionConvention === 'going-to' ? 'going to (180° added)' : 'coming from'}
              </Item>
            ) : null}
          </>
        )}
        <Item label="Stored as">
          {formatCount(d.records)} records, {formatUtc(d.createdAt)}
        </Item>
      </dl>

      <h3 className="mt-5 mb-2 font-bold">Periods given and derived</h3>
      <p className="mb-2 text-sm text-ink-soft">
        Periods missing from the source are derived from the ones given with the JONSWAP period ratios (γ = 3.3); each record keeps which
        were given.
      </p>
      <ul className="grid gap-2 text-sm sm:grid-cols-3">
        {PERIODS.map((p) => {
          const derived = d.derived[p.key] ?? 0;
          const missing = d.missing[p.key] ?? 0;
          const given = Math.max(0, d.records - missing - derived);
          return (
            <li key={p.key} className="rounded-lg border border-line bg-surface-2 px-3 py-2">
              <span className="font-semibold">{p.label}</span>
              <span className="block text-ink-soft">
                {formatCount(given)} given, {formatCount(derived)} derived{missing > 0 ? `, ${formatCount(missing)} missing` : ''}
              </span>
            </li>
          );
        })}
      </ul>

      {r.notes.length > 0 ? (
        <>
          <h3 className="mt-5 mb-2 font-bold">Decisions applied to the whole file</h3>
          <ul className="list-disc pl-5 text-sm">
            {r.notes.map((n, i) => (
              <li key={i}>{n}</li>
            ))}
          </ul>
        </>
      ) : null}

      {r.issues.length > 0 ? (
        <div className="mt-5">
          <IssuesTable
            issues={r.issues}
            total={r.issueCount}
            limit={200}
            caption={r.mode === 'skip' ? 'Problems of the skipped rows' : 'Problems found'}
          />
        </div>
      ) : !fromService && r.rowsRead !== undefined ? (
        <p className="mt-5 text-sm text-ink-soft">No row had a problem.</p>
      ) : null}
    </Card>
  );
}

function Item({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div>
      <dt className="text-ink-soft">{label}</dt>
      <dd className="mt-0.5 font-semibold break-words">{children}</dd>
    </div>
  );
}
