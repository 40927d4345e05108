// `/projects/:projectId/alerts`: what the caller hears about (subscription), their calendar feed,
// and the recent alerts of the planning job, for every member. Coordinators and admins also
// re-plan now, read the outbox, and set which operations recur.
import { useParams } from 'react-router-dom';
import { ErrorNotice, PageHeader, Spinner } from '../../../components/ui';
import { useProjectAccess } from '../../../api/projects';
import { useOperations } from '../../../api/operations';
import { useSites } from '../../../api/sites';
import { usePageZone } from '../../../components/page-zone';
import { localTimeZone, worksiteZoneStatement } from '../../../../shared/dates';
import { CalendarSection } from './calendar-section';
import { OutboxSection } from './outbox-section';
import { RecentAlertsSection } from './recent-alerts-section';
import { RecurrenceSection } from './recurrence-section';
import { ReplanSection } from './replan-section';
import { SubscriptionSection } from './subscription-section';

export function AlertsPage() {
  const { projectId = '' } = useParams();
  const access = useProjectAccess(projectId);
  const operations = useOperations(projectId);
  const sites = useSites(projectId);
  // The page's one zone statement: window times in their worksite's zone, other times (found, written,
  // sent) in the first worksite's.
  const pageZone = sites.data ? worksiteZoneStatement(sites.data, localTimeZone()) : null;
  usePageZone(pageZone?.statement ?? null);

  if (access.isPending || operations.isPending || sites.isPending) return <Spinner label="Opening alerts" />;
  const error = access.error ?? operations.error ?? sites.error;
  if (error) return <ErrorNotice error={error} />;
  const ops = operations.data ?? [];
  const sitesList = sites.data ?? [];
  const zone = pageZone?.zone ?? localTimeZone();

  return (
    // Native controls (tick boxes, date and time pickers) follow the dark theme too.
    <div className="flex flex-col gap-5 dark:scheme-dark">
      <PageHeader
        title="Alerts"
        subtitle="A new forecast can open, shorten or close a weather window. Choose what you hear about by e-mail and in your calendar."
      />
      <div className="grid items-start gap-5 lg:grid-cols-2">
        <SubscriptionSection projectId={projectId} role={access.role} operations={ops} sites={sitesList} />
        <div className="flex flex-col gap-5">
          <CalendarSection />
          {access.canEdit ? <ReplanSection projectId={projectId} operations={ops} sites={sitesList} zone={zone} /> : null}
        </div>
      </div>
      <RecentAlertsSection projectId={projectId} operations={ops} sites={sitesList} zone={zone} />
      {access.canEdit ? (
        <>
          <OutboxSection projectId={projectId} zone={zone} />
          <RecurrenceSection projectId={projectId} operations={ops} sites={sitesList} />
        </>
      ) : null}
    </div>
  );
}
