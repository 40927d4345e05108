import { useState, type ReactNode } from 'react';
import { usePageZone } from '../../../components/page-zone';
import { DATA_ZONE_STATEMENT } from './data-zone';
import { sub } from 'date-fns';
import { tz } from '@date-fns/tz';
import { Link, useLocation, useNavigate, useParams } from 'react-router-dom';
import type { DatasetDetail } from '../../../../shared/api-types-datasets';
import { Button, Card, ErrorNotice, FieldShell, Input, Notice, PageHeader, Spinner } from '../../../components/ui';
import { datasetCsvUrl, useDataset } from '../api/get-dataset';
import { useDeleteDataset } from '../api/delete-dataset';
import { useProjectAccess } from '../../../api/projects';
import { ImportReportCard } from './import-report';
import { KindBadge } from './kind-badge';
import { MonthlyTable } from './monthly-table';
import { RangeChart, type ChartView } from './range-chart';
import { describeSource, formatCount, formatDepth, formatPosition, formatShare, formatStep, formatUtc, VARIABLE_LABELS } from './format';

const linkButton =
  'inline-flex min-h-11 items-center justify-center gap-2 rounded-lg border border-line bg-surface-2 px-4 text-sm font-semibold text-ink transition hover:border-accent';

/** `/projects/:projectId/sea-data/:datasetId`: one dataset's facts, chart, monthly summary and import report. */
export function DatasetDetailPage() {
  const { projectId = '', datasetId = '' } = useParams();
  // The page's one zone statement: sea data are stored and shown in UTC.
  usePageZone(DATA_ZONE_STATEMENT);
  const location = useLocation();
  const imported = (location.state as { imported?: { records: number; skipped: number; warning?: string | null } } | null)?.imported;
  const project = useProjectAccess(projectId);
  const dataset = useDataset(projectId, datasetId);
  // undefined until the user picks a range: then the default range of the dataset is shown.
  const [picked, setPicked] = useState<ChartView | undefined>(undefined);

  if (dataset.isPending) return <Spinner label="Loading the dataset" />;
  if (dataset.error) {
    return (
      <div className="flex flex-col gap-3">
        <ErrorNotice error={dataset.error} />
        <BackLink projectId={projectId} />
      </div>
    );
  }
  const d = dataset.data;
  const view = picked === undefined ? defaultView(d) : picked;
  return (
    <div className="flex flex-col gap-5">
      <div>
        <BackLink projectId={projectId} />
        <PageHeader
          title={d.name}
          subtitle={
            <span className="flex flex-wrap items-center gap-2">
              <KindBadge kind={d.kind} />
              <span>
                {formatUtc(d.start)} – {formatUtc(d.end)}
              </span>
            </span>
          }
          actions={
            <a className={linkButton} href={datasetCsvUrl(projectId, d.id)} download>
              Download CSV
            </a>
          }
        />
      </div>
      {imported ? (
        <Notice tone="success">
          Imported {formatCount(imported.records)} records
          {imported.skipped === 1 ? '; 1 bad row was skipped and is listed in the import report below' : ''}
          {imported.skipped > 1 ? `; ${formatCount(imported.skipped)} bad rows were skipped and are listed in the import report below` : ''}
          .
        </Notice>
      ) : null}
      {imported?.warning ? <Notice tone="error">{imported.warning}</Notice> : null}
      <Facts d={d} />
      <Card>
        <h2 className="mb-3 text-lg font-bold">Time series</h2>
        <RangeChart projectId={projectId} dataset={d} view={view} onView={setPicked} />
      </Card>
      <Card>
        <h2 className="mb-1 text-lg font-bold">Monthly summary</h2>
        <p className="mb-3 text-sm text-ink-soft">
          Per calendar month: records, share of the month’s time steps with an Hs value, mean and 90th percentile Hs. Choose a month to see
          it in the chart.
        </p>
        <MonthlyTable
          projectId={projectId}
          datasetId={d.id}
          onPick={(fromMs, toMs) => {
            setPicked({ fromMs, toMs });
            document.getElementById('range-chart')?.scrollIntoView({ behavior: 'smooth', block: 'start' });
          }}
        />
      </Card>
      <ImportReportCard d={d} />
      {project.canEdit ? <DeleteCard projectId={projectId} d={d} /> : null}
    </div>
  );
}

/** Records above which the chart opens on the last year instead of the whole dataset (about 2 MB of JSON). */
const WHOLE_DATASET_RECORDS = 20_000;

/** The range shown first: the whole dataset when it is short, else its last year (the rest is one click away). */
function defaultView(d: DatasetDetail): ChartView {
  if (d.records <= WHOLE_DATASET_RECORDS) return null;
  const toMs = Date.parse(d.end);
  const fromMs = sub(new Date(toMs), { years: 1 }, { in: tz('UTC') }).getTime();
  return fromMs <= Date.parse(d.start) ? null : { fromMs, toMs };
}

function BackLink({ projectId }: { projectId: string }) {
  return (
    <Link
      to={`/projects/${projectId}/sea-data`}
      className="mb-1 inline-flex min-h-11 items-center text-sm font-semibold text-accent hover:underline"
    >
      ← All sea data
    </Link>
  );
}

function Facts({ d }: { d: DatasetDetail }) {
  const lat = d.dataPoint.latitude;
  const lon = d.dataPoint.longitude;
  return (
    <Card>
      <dl className="grid gap-x-6 gap-y-3 text-sm sm:grid-cols-2 lg:grid-cols-4">
        <Fact label="Records">
          {formatCount(d.records)}, every {formatStep(d.stepMinutes)}
        </Fact>
        <Fact label="Hs missing or absent">
          {formatShare(d.hsGapShare)} of {formatCount(d.expectedRecords)} {formatStep(d.stepMinutes)} steps
          <span className="block text-ink-soft">
            {formatCount(d.missing.hs ?? 0)} {(d.missing.hs ?? 0) === 1 ? 'record' : 'records'} without Hs; {formatCount(d.absentRecords)}{' '}
            {d.absentRecords === 1 ? 'row' : 'rows'} absent
          </span>
        </Fact>
        <Fact label="Data point">
          {d.dataPoint.name || 'Unnamed'}, {formatDepth(d.dataPoint.depthM)}
          {lat !== null && lon !== null ? <span className="block text-ink-soft">{formatPosition(lat, lon)}</span> : null}
        </Fact>
        <Fact label="Source">{describeSource(d)}</Fact>
        <div className="sm:col-span-2 lg:col-span-4">
          <dt className="text-ink-soft">Variables (missing records)</dt>
          <dd className="mt-1 flex flex-wrap gap-1.5">
            {Object.keys(VARIABLE_LABELS).map((v) => {
              const present = d.variables.includes(v);
              const info = VARIABLE_LABELS[v];
              return (
                <span
                  key={v}
                  className={`rounded-full border px-2.5 py-0.5 text-xs ${present ? 'border-line bg-surface-2 text-ink' : 'border-dashed border-line text-ink-soft line-through'}`}
                  title={present ? undefined : 'Not in this dataset'}
                >
                  {info.label} ({info.unit}){present && (d.missing[v] ?? 0) > 0 ? ` – ${formatCount(d.missing[v])} missing` : ''}
                  {present ? '' : ' – absent'}
                </span>
              );
            })}
          </dd>
        </div>
      </dl>
    </Card>
  );
}

function Fact({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div>
      <dt className="text-ink-soft">{label}</dt>
      <dd className="mt-0.5 font-semibold break-words">{children}</dd>
    </div>
  );
}

function DeleteCard({ projectId, d }: { projectId: string; d: DatasetDetail }) {
  const navigate = useNavigate();
  const del = useDeleteDataset(projectId);
  const [confirming, setConfirming] = useState(false);
  const [typed, setTyped] = useState('');
  const matches = typed.trim() === d.name.trim();
  return (
    <Card className="border-danger/40">
      <h2 className="mb-1 text-lg font-bold">Delete this dataset</h2>
      <p className="mb-3 text-sm text-ink-soft">Its records and import report are removed for good; this cannot be undone.</p>
      {!confirming ? (
        <Button variant="danger" onClick={() => setConfirming(true)}>
          Delete…
        </Button>
      ) : (
        <form
          className="flex flex-col gap-3"
          onSubmit={(e) => {
            e.preventDefault();
            if (!matches) return;
            del.mutate(d.id, {
              onSuccess: () => void navigate(`/projects/${projectId}/sea-data`, { replace: true, state: { deleted: d.name } }),
            });
          }}
        >
          <FieldShell label={`Type the name “${d.name}” to confirm`} htmlFor="confirm-name">
            <Input id="confirm-name" value={typed} autoComplete="off" onChange={(e) => setTyped(e.target.value)} autoFocus />
          </FieldShell>
          {del.error ? <ErrorNotice error={del.error} /> : null}
          <div className="flex flex-wrap gap-2">
            <Button type="submit" variant="danger" disabled={!matches || del.isPending}>
              {del.isPending ? 'Deleting…' : 'Delete for good'}
            </Button>
            <Button
              variant="secondary"
              onClick={() => {
                setConfirming(false);
                setTyped('');
              }}
            >
              Keep it
            </Button>
          </div>
        </form>
      )}
    </Card>
  );
}
