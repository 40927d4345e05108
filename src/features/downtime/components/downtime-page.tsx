// `/projects/:projectId/downtime`: the downtime schedule. Expected weather downtime by month from
// a hindcast (heat map and table), campaign durations by start month, and the downtime ledger with
// its monthly totals against the expectation; CSV of every table and a printable report. Every
// member reads; coordinators (and admins) edit campaigns and propose/confirm the ledger.
// The choices live in the address (?dataset=&alpha=off&campaign=&month=) so a view can be shared.
import { useParams, useSearchParams } from 'react-router-dom';
import { Button, Card, ErrorNotice, FieldShell, Notice, PageHeader, Select, Spinner } from '../../../components/ui';
import { Term } from '../../../components/ui/term';
import { Switch } from '../../../components/ui/switch';
import { useProjectAccess } from '../../../api/projects';
import { useStatisticsDatasets } from '../../../api/datasets';
import { useOperations } from '../../../api/operations';
import { useSites } from '../../../api/sites';
import { useWorkability } from '../api/get-workability';
import { useLedger } from '../api/get-ledger';
import { useCampaigns } from '../api/get-campaigns';
import { usePageZone } from '../../../components/page-zone';
import { localTimeZone, worksiteZoneStatement } from '../../../../shared/dates';
import { CampaignSection } from './campaign-section';
import { dateIn, monthRange, thisMonth } from './format';
import { LedgerSection } from './ledger-section';
import { OutlookSection } from './outlook-section';
import { PrintReport } from './print-report';
import { WorkabilitySection } from './workability-section';

const YEAR_MS = 365.25 * 86_400_000;
/** Shorter than a year: statistics by calendar month cannot stand on it. */
const thinHindcast = (d: { start: string; end: string }) => Date.parse(d.end) - Date.parse(d.start) < YEAR_MS - 86_400_000;
const spanWords = (d: { start: string; end: string }) => {
  const days = Math.round((Date.parse(d.end) - Date.parse(d.start)) / 86_400_000);
  return days < 62 ? `${days} day${days === 1 ? '' : 's'}` : `about ${Math.round(days / 30.44)} months`;
};

export function DowntimePage() {
  const { projectId = '' } = useParams();
  const [params, setParams] = useSearchParams();
  const access = useProjectAccess(projectId);
  const hindcasts = useStatisticsDatasets(projectId);
  const operations = useOperations(projectId);
  const sites = useSites(projectId);

  const list = hindcasts.data ?? [];
  const asked = params.get('dataset');
  const datasetId = asked && list.some((d) => d.id === asked) ? asked : (list.find((d) => d.statisticsDefault)?.id ?? list[0]?.id ?? '');
  const hindcast = list.find((d) => d.id === datasetId);
  const alpha = params.get('alpha') !== 'off';
  const monthParam = params.get('month');
  const month = monthParam && /^\d{4}-\d{2}$/.test(monthParam) ? monthParam : thisMonth();
  const campaignId = params.get('campaign') ?? '';

  const workability = useWorkability(projectId, datasetId ? { datasetId, alpha } : null);
  // The same query as the ledger section (one cache entry): its sources go into the printed report.
  const ledger = useLedger(projectId, monthRange(month));
  // The page's one zone statement: the worksites' zones, and the campaign's own zone where it differs
  // (its runs start on the 1st at 00:00 there, so its dates are shown there).
  const campaigns = useCampaigns(projectId);
  const campaign = (campaigns.data ?? []).find((c) => c.id === campaignId) ?? campaigns.data?.[0];
  const pageZone = worksiteZoneStatement(sites.data ?? [], localTimeZone());
  usePageZone(
    sites.data
      ? `${pageZone.statement}${campaign && campaign.timeZone !== pageZone.zone ? ` Campaign dates are in ${campaign.timeZone}, the campaign’s own zone.` : ''}`
      : null,
  );

  const set = (key: string, value: string | null) =>
    setParams(
      (prev) => {
        const next = new URLSearchParams(prev);
        if (value === null || value === '') next.delete(key);
        else next.set(key, value);
        return next;
      },
      { replace: true },
    );

  if (access.isPending || hindcasts.isPending) return <Spinner label="Opening the downtime schedule" />;
  if (access.error || !access.data) return <ErrorNotice error={access.error} />;
  const project = access.data;
  const ledgerSources = [...new Set((ledger.data ?? []).map((r) => `${r.datasetName ?? 'a removed dataset'} (${r.source})`))];

  return (
    <div className="flex flex-col gap-5">
      <PrintReport
        projectName={project.name}
        hindcast={hindcast}
        ledgerSources={ledgerSources}
        alpha={alpha}
        operations={operations.data ?? []}
        sites={sites.data ?? []}
        zone={pageZone.zone}
      />
      <div className="no-print">
        <PageHeader
          title="Downtime schedule"
          subtitle="How much of each month the weather takes, how long a campaign really lasts, and what was lost."
          actions={
            <Button variant="secondary" onClick={() => window.print()}>
              Print report
            </Button>
          }
        />
      </div>

      <Card className="no-print flex flex-wrap items-end gap-3">
        <div className="min-w-64 flex-1 sm:max-w-lg">
          <FieldShell
            label="Hindcast"
            htmlFor="downtime-dataset"
            hint={
              hindcast
                ? `${dateIn(hindcast.start, pageZone.zone)} to ${dateIn(hindcast.end, pageZone.zone)}, ${hindcast.records.toLocaleString('en-GB')} records, every ${hindcast.stepMinutes} min`
                : undefined
            }
          >
            <Select id="downtime-dataset" value={datasetId} onChange={(e) => set('dataset', e.target.value)} disabled={list.length === 0}>
              {list.length === 0 ? <option value="">No hindcast yet</option> : null}
              {list.map((d) => (
                <option key={d.id} value={d.id}>
                  {d.name}
                  {d.statisticsDefault ? ' (project default)' : ''}
                </option>
              ))}
            </Select>
          </FieldShell>
        </div>
        <Switch on={alpha} onChange={(on) => set('alpha', on ? null : 'off')} testId="alpha-switch">
          Forecast limits
        </Switch>
        <Term k="alpha" />
        <p className="w-full text-sm" data-testid="downtime-basis">
          <span className="font-semibold">Basis of every figure on this page</span> (heat map, table, campaign durations and the ledger’s
          expected downtime): {hindcast ? hindcast.name : 'no hindcast yet'},{' '}
          {alpha ? 'forecast limits on: Hs limits at OPWF = α × OPLIM.' : 'forecast limits off: every limit at OPLIM.'}
          {hindcast && thinHindcast(hindcast) ? (
            <span className="mt-1 block font-semibold text-danger">
              This hindcast spans {spanWords(hindcast)}: shorter than a year, so some months have no data and the rest rest on one short
              sample.
            </span>
          ) : null}
        </p>
      </Card>
      {hindcasts.error ? <ErrorNotice error={hindcasts.error} /> : null}

      {list.length === 0 ? (
        <Notice>
          No hindcast in this project yet, so there is no expected downtime and no campaign simulation.{' '}
          {access.canEdit ? 'Import a multi-year hindcast under Sea data.' : 'The coordinator imports one under Sea data.'}
        </Notice>
      ) : (
        <WorkabilitySection
          entries={workability.data}
          isFetching={workability.isFetching}
          error={workability.error}
          alpha={alpha}
          datasetName={hindcast?.name ?? ''}
        />
      )}

      <CampaignSection
        projectId={projectId}
        canEdit={access.canEdit}
        datasetId={datasetId}
        alpha={alpha}
        operations={operations.data ?? []}
        sites={sites.data ?? []}
        selectedId={campaignId}
        onSelect={(id) => set('campaign', id)}
      />

      <OutlookSection
        projectId={projectId}
        canEdit={access.canEdit}
        alpha={alpha}
        operations={operations.data ?? []}
        sites={sites.data ?? []}
        selectedId={campaignId}
      />

      <LedgerSection
        projectId={projectId}
        canEdit={access.canEdit}
        isClient={access.role === 'client'}
        month={month}
        onMonth={(m) => set('month', m)}
        datasetId={datasetId}
        alpha={alpha}
      />
    </div>
  );
}
