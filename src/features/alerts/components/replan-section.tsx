// "Re-plan now" (coordinators and admins): runs the planning job for this project at once and
// shows what it did: the forecast planned on, how many plans, which alerts it found, how many
// e-mails it wrote to the outbox, and what the delivery that follows sent.
import type { OperationResponse, SiteResponse } from '../../../../shared/api-types-sites';
import { Button, ErrorNotice, Notice, SectionCard } from '../../../components/ui';
import { useReplan } from '../api/replan';
import type { ProjectJobResult } from '../api/types';
import { KIND_WORDS } from './alert-words';
import { DATE_STYLE } from '../../../../shared/dates';
import { timeIn } from './format';
import { plural } from '../../../lib/format';

interface Props {
  projectId: string;
  operations: OperationResponse[];
  sites: SiteResponse[];
  /** The page's zone for times that belong to no worksite. */
  zone: string;
}

export function ReplanSection({ projectId, operations, sites, zone: here }: Props) {
  const replan = useReplan(projectId);
  const result = replan.data;
  const mine = result?.projects.find((p) => p.projectId === projectId) ?? result?.projects[0];
  return (
    <SectionCard
      titleId="replan-title"
      title="Re-plan now"
      intro="The planning job runs by itself on a schedule, and within a minute of a new forecast stored here (fetched or imported). Run it now to fetch the latest forecast (when the project uses the forecast service), plan every operation at every worksite, and queue alert e-mails for what changed."
    >
      <div className="mt-3">
        <Button onClick={() => replan.mutate()} disabled={replan.isPending} data-testid="replan-button">
          {replan.isPending ? 'Planning…' : 'Re-plan now'}
        </Button>
      </div>
      <ErrorNotice error={replan.error} className="mt-3" />
      {result && mine ? (
        <div className="mt-4 flex flex-col gap-3" data-testid="replan-result" aria-live="polite">
          <RunSummary run={mine} startedAt={result.startedAt} here={here} operations={operations} sites={sites} />
          <p className="text-sm">
            <span className="font-semibold">E-mail delivery after the run:</span> {plural(result.mail.due, 'e-mail')} due,{' '}
            {result.mail.sent} sent, {result.mail.failed} not sent this time
            {result.mail.failed > 0 ? ' (each is tried again later until its tries run out; see the outbox below)' : ''}.
          </p>
        </div>
      ) : null}
    </SectionCard>
  );
}

function RunSummary({
  run,
  startedAt,
  here,
  operations,
  sites,
}: {
  run: ProjectJobResult;
  startedAt: string;
  here: string;
  operations: OperationResponse[];
  sites: SiteResponse[];
}) {
  const when = timeIn(startedAt, here, 'HH:mm:ss');
  if (run.status === 'skipped') {
    return (
      <Notice>
        Run at {when} skipped: {run.reason ?? 'another planning run holds this project'}. Try again in a moment.
      </Notice>
    );
  }
  if (run.status === 'failed') {
    return (
      <Notice tone="error">
        Run at {when} failed: {run.reason ?? 'unknown error'}. The last plan is kept; the next scheduled run tries again.
      </Notice>
    );
  }
  const alerts = run.alerts ?? [];
  return (
    <>
      <Notice tone="success">
        <p className="font-semibold">Planned at {when}.</p>
        <p>
          {run.forecast
            ? `Forecast issued ${timeIn(run.forecast.issuedAt, here, DATE_STYLE.dateTimeYear)}${run.forecast.isNew ? ', a new issue stored now' : ', the same issue as before'}. `
            : 'Planned on the newest uploaded sea data (this project does not use the forecast service). '}
          {plural(run.plans ?? 0, 'plan')} (operation × worksite), {plural(alerts.length, 'change')} found,{' '}
          {plural(run.queued ?? 0, 'alert e-mail')} written to the outbox.
        </p>
      </Notice>
      {alerts.length > 0 ? (
        <ul className="flex flex-col gap-1 text-sm" aria-label="Changes found by this run">
          {alerts.map((a, i) => {
            const op = operations.find((o) => o.id === a.operationId);
            const site = sites.find((s) => s.id === a.siteId);
            return (
              <li key={i} className="rounded-md bg-surface-2 px-3 py-2">
                <span className="font-semibold">{KIND_WORDS[a.kind] ?? a.kind}</span>: {op?.name ?? 'an operation'} at{' '}
                {site?.name ?? 'a worksite'}
                {a.start ? <span className="text-ink-soft"> · {timeIn(a.start, site?.timeZone ?? 'UTC')}</span> : null}
              </li>
            );
          })}
        </ul>
      ) : (
        <p className="text-sm text-ink-soft">Nothing changed since the last plan, so no alert was queued.</p>
      )}
    </>
  );
}
