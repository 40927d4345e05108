import { useState } from 'react';
import { Link, useLocation, useParams } from 'react-router-dom';
import { usePageZone } from '../../../components/page-zone';
import { DATA_ZONE_STATEMENT } from './data-zone';
import type { DatasetSummary } from '../../../../shared/api-types-datasets';
import { Button, Card, ErrorNotice, Notice, PageHeader, Spinner } from '../../../components/ui';
import { useDatasets } from '../../../api/datasets';
import { FetchForecastButton } from '../../../components/fetch-forecast-button';
import { useFetchForecast } from '../../../api/forecasts';
import { useProjectAccess } from '../../../api/projects';
import { useSetDefaultHindcast } from '../api/set-default-hindcast';
import { KindBadge } from './kind-badge';
import { describeSource, formatCount, formatDepth, formatShare, formatStep, formatUtc, formatUtcDay } from './format';

const linkButton =
  'inline-flex min-h-11 items-center justify-center gap-2 rounded-lg px-4 text-sm font-semibold transition bg-accent text-accent-ink hover:brightness-110';

/** Forecast issues newest first; the rest as the API lists them (newest import first). */
function splitDatasets(all: DatasetSummary[]) {
  const forecasts = all
    .filter((d) => d.kind === 'forecast')
    .sort((a, b) => Date.parse(b.source.issuedAt ?? b.start) - Date.parse(a.source.issuedAt ?? a.start));
  const series = all.filter((d) => d.kind !== 'forecast');
  return { series, forecasts };
}

/** `/projects/:projectId/sea-data`: the project's hindcasts, observations and forecast issues. */
export function DatasetsPage() {
  const { projectId = '' } = useParams();
  // The page's one zone statement: sea data are stored and shown in UTC.
  usePageZone(DATA_ZONE_STATEMENT);
  const location = useLocation();
  const deletedName = (location.state as { deleted?: string } | null)?.deleted;
  const project = useProjectAccess(projectId);
  const datasets = useDatasets(projectId);
  const fetchForecast = useFetchForecast(projectId);
  const canEdit = project.canEdit;

  const actions = canEdit ? (
    <>
      <Link to={`/projects/${projectId}/sea-data/import`} className={linkButton}>
        Import a file
      </Link>
      <FetchForecastButton fetchForecast={fetchForecast} />
    </>
  ) : undefined;

  return (
    <div>
      <PageHeader
        title="Sea data"
        subtitle={
          project.data
            ? `Sea states at the data point ${project.data.dataPointName || '(unnamed)'}, ${formatDepth(project.data.dataPointDepthM)}.`
            : 'Sea states at the project’s data point.'
        }
        actions={actions}
      />
      <div className="mb-4 flex flex-col gap-3 empty:hidden">
        {deletedName ? <Notice tone="success">The dataset “{deletedName}” was deleted.</Notice> : null}
        {fetchForecast.error ? <ErrorNotice error={fetchForecast.error} /> : null}
        {fetchForecast.data ? (
          <Notice tone="success">
            {fetchForecast.data.isNew
              ? `New forecast issued ${formatUtc(fetchForecast.data.issuedAt)} stored: ${formatCount(fetchForecast.data.records)} records. Within a minute the planning job compares it with the last plan and e-mails the changes to those subscribed.`
              : `The service has nothing newer: the forecast issued ${formatUtc(fetchForecast.data.issuedAt)} is already stored.`}{' '}
            <Link className="font-semibold underline" to={`/projects/${projectId}/sea-data/${fetchForecast.data.datasetId}`}>
              Open it
            </Link>
          </Notice>
        ) : null}
      </div>
      {datasets.isPending ? <Spinner label="Loading datasets" /> : null}
      {datasets.error ? <ErrorNotice error={datasets.error} /> : null}
      {datasets.data && datasets.data.length === 0 ? (
        <Card>
          <p className="font-semibold">No sea data in this project yet.</p>
          <p className="mt-1 text-sm text-ink-soft">
            {canEdit
              ? 'Import a hindcast or buoy file (CSV or NDBC text up to 100 MB, NetCDF up to 2 GB), or fetch the latest forecast for the data point.'
              : 'A marine coordinator imports hindcasts and buoy records and fetches forecasts; they will be listed here.'}
          </p>
        </Card>
      ) : null}
      {datasets.data && datasets.data.length > 0 ? <DatasetGroups projectId={projectId} all={datasets.data} canEdit={canEdit} /> : null}
    </div>
  );
}

const YEAR_MS = 365 * 86_400_000;
const shortSpan = (d: DatasetSummary) => Date.parse(d.end) + d.stepMinutes * 60_000 - Date.parse(d.start) < YEAR_MS;

/** Which dataset statistics use when none is named: chosen by the coordinator, else the newest hindcast. */
function DefaultChoice({ projectId, series, canEdit }: { projectId: string; series: DatasetSummary[]; canEdit: boolean }) {
  const choose = useSetDefaultHindcast(projectId);
  const current = series.find((d) => d.statisticsDefault);
  return (
    <div className="mb-3 flex flex-col gap-2 text-sm" data-testid="default-hindcast">
      <p>
        <span className="font-semibold">Default for statistics:</span> {current ? current.name : 'none yet'}
        {current && shortSpan(current) ? (
          <span className="ml-1 font-semibold text-danger">
            : shorter than a year, so every statistic of the project rests on one short sample.
          </span>
        ) : null}
      </p>
      {canEdit && series.length > 0 ? (
        <label className="flex flex-wrap items-center gap-2">
          <span>Choose the default</span>
          <select
            className="min-h-11 rounded-lg border border-line bg-surface px-2"
            value=""
            onChange={(e) => e.target.value && choose.mutate(e.target.value === 'newest' ? null : e.target.value)}
            disabled={choose.isPending}
          >
            <option value="">…</option>
            <option value="newest">The newest hindcast, whichever it is</option>
            {series.map((d) => (
              <option key={d.id} value={d.id}>
                {d.name}
                {shortSpan(d) ? ' (less than a year)' : ''}
              </option>
            ))}
          </select>
        </label>
      ) : null}
      {choose.error ? <ErrorNotice error={choose.error} /> : null}
      {choose.data?.warning ? <Notice tone="error">{choose.data.warning}</Notice> : null}
    </div>
  );
}

function DatasetGroups({ projectId, all, canEdit }: { projectId: string; all: DatasetSummary[]; canEdit: boolean }) {
  const { series, forecasts } = splitDatasets(all);
  return (
    <div className="flex flex-col gap-6">
      <section aria-labelledby="series-heading">
        <h2 id="series-heading" className="mb-2 text-lg font-bold">
          Hindcasts and observations
        </h2>
        {series.length === 0 ? (
          <p className="text-sm text-ink-soft">None yet: statistics and downtime schedules need a hindcast.</p>
        ) : (
          <>
            <DefaultChoice projectId={projectId} series={series} canEdit={canEdit} />
            <DatasetTable projectId={projectId} rows={series} />
          </>
        )}
      </section>
      <section aria-labelledby="forecast-heading">
        <h2 id="forecast-heading" className="mb-1 text-lg font-bold">
          Forecasts
        </h2>
        <p className="mb-2 text-sm text-ink-soft">
          Every issue is kept, newest first, so a plan can be compared with the previous forecast.
        </p>
        {forecasts.length === 0 ? (
          <p className="text-sm text-ink-soft">No forecast stored yet.</p>
        ) : (
          <ForecastTable projectId={projectId} forecasts={forecasts} />
        )}
      </section>
    </div>
  );
}

/** Forecast issues shown before "Show all": four issues a day make a long list within weeks. */
const FORECASTS_SHOWN = 12;

function ForecastTable({ projectId, forecasts }: { projectId: string; forecasts: DatasetSummary[] }) {
  const [all, setAll] = useState(false);
  const rows = all ? forecasts : forecasts.slice(0, FORECASTS_SHOWN);
  return (
    <>
      <DatasetTable projectId={projectId} rows={rows} latestId={forecasts[0].id} />
      {forecasts.length > FORECASTS_SHOWN ? (
        <Button variant="secondary" className="mt-2" onClick={() => setAll((x) => !x)} aria-expanded={all}>
          {all ? `Show the newest ${FORECASTS_SHOWN} only` : `Show all ${formatCount(forecasts.length)} forecasts`}
        </Button>
      ) : null}
    </>
  );
}

const th = 'px-3 py-2 text-left text-xs font-semibold text-ink-soft';
const td = 'px-3 py-2 align-top';

function DatasetTable({ projectId, rows, latestId }: { projectId: string; rows: DatasetSummary[]; latestId?: string }) {
  const href = (d: DatasetSummary) => `/projects/${projectId}/sea-data/${d.id}`;
  return (
    <>
      {/* Laptop: one table. */}
      <div className="hidden overflow-x-auto rounded-[var(--radius-card)] border border-line bg-surface md:block">
        <table className="w-full table-fixed text-sm">
          <colgroup>
            <col className="w-[24%]" />
            <col className="w-[19%]" />
            <col className="w-[7%]" />
            <col className="w-[9%]" />
            <col className="w-[9%]" />
            <col className="w-[14%]" />
            <col className="w-[18%]" />
          </colgroup>
          <thead className="border-b border-line bg-surface-2">
            <tr>
              <th className={th}>Name</th>
              <th className={th}>Coverage</th>
              <th className={`${th} text-right`}>Step</th>
              <th className={`${th} text-right`}>Records</th>
              <th className={`${th} text-right`} title="Share of the expected records without Hs: missing values and absent rows">
                Hs missing or absent
              </th>
              <th className={th}>Data point</th>
              <th className={th}>Source</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((d) => (
              <tr key={d.id} className="border-b border-line last:border-0 hover:bg-surface-2/60">
                <td className={td}>
                  <Link
                    to={href(d)}
                    className="inline-flex min-h-11 items-center font-semibold break-words text-accent underline-offset-2 hover:underline"
                  >
                    {d.name}
                  </Link>
                  <div className="flex flex-wrap gap-1.5">
                    <KindBadge kind={d.kind} />
                    {d.id === latestId ? <LatestBadge /> : null}
                    {d.statisticsDefault ? <DefaultBadge /> : null}
                  </div>
                </td>
                <td className={td}>
                  {formatUtcDay(d.start)} –<br />
                  {formatUtcDay(d.end)}
                </td>
                <td className={`${td} text-right whitespace-nowrap`}>{formatStep(d.stepMinutes)}</td>
                <td className={`${td} text-right tabular-nums`}>{formatCount(d.records)}</td>
                <td className={`${td} text-right tabular-nums`}>{formatShare(d.hsGapShare)}</td>
                <td className={td}>
                  {d.dataPoint.name || 'Unnamed'}
                  <span className="block text-xs text-ink-soft">{formatDepth(d.dataPoint.depthM)}</span>
                </td>
                <td className={`${td} break-words`}>{describeSource(d)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {/* Phone: one card per dataset. */}
      <ul className="flex flex-col gap-3 md:hidden">
        {rows.map((d) => (
          <li key={d.id}>
            <Card className="!p-4">
              <div className="flex flex-wrap items-center gap-1.5">
                <KindBadge kind={d.kind} />
                {d.id === latestId ? <LatestBadge /> : null}
              </div>
              <Link to={href(d)} className="mt-1 flex min-h-11 items-center font-semibold text-accent underline underline-offset-2">
                {d.name}
              </Link>
              <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-sm">
                <dt className="text-ink-soft">Coverage</dt>
                <dd>
                  {formatUtcDay(d.start)} – {formatUtcDay(d.end)}
                </dd>
                <dt className="text-ink-soft">Records</dt>
                <dd>
                  {formatCount(d.records)}, every {formatStep(d.stepMinutes)}
                </dd>
                <dt className="text-ink-soft">Hs missing or absent</dt>
                <dd>{formatShare(d.hsGapShare)}</dd>
                <dt className="text-ink-soft">Data point</dt>
                <dd>
                  {d.dataPoint.name || 'Unnamed'}, {formatDepth(d.dataPoint.depthM)}
                </dd>
                <dt className="text-ink-soft">Source</dt>
                <dd className="break-words">{describeSource(d)}</dd>
              </dl>
            </Card>
          </li>
        ))}
      </ul>
    </>
  );
}

function DefaultBadge() {
  return (
    <span className="inline-flex w-fit items-center rounded-full bg-ok-soft px-2.5 py-0.5 text-xs font-semibold text-ink">
      Default for statistics
    </span>
  );
}

function LatestBadge() {
  return (
    <span className="inline-flex w-fit items-center rounded-full bg-deep px-2.5 py-0.5 text-xs font-semibold text-white dark:bg-spray dark:text-deep">
      Latest issue
    </span>
  );
}
