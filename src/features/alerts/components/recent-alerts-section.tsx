// "Recent alerts": the changes the planning job found in this project, newest first, in words:
// operation and worksite, what changed, times in the worksite's zone and the limiting factor.
import { useState } from 'react';
import type { OperationResponse, SiteResponse } from '../../../../shared/api-types-sites';
import { Button, ErrorNotice, SectionCard, Spinner } from '../../../components/ui';
import { useAlerts } from '../api/get-alerts';
import { alertText, TONE_CLASS } from './alert-words';
import { DATE_STYLE } from '../../../../shared/dates';
import { timeIn } from './format';

/** Alerts listed before "show all" (the list holds the latest 50). */
const FIRST_SHOWN = 8;

interface Props {
  projectId: string;
  operations: OperationResponse[];
  sites: SiteResponse[];
  /** The page's zone for times that belong to no worksite. */
  zone: string;
}

export function RecentAlertsSection({ projectId, operations, sites, zone: here }: Props) {
  const alerts = useAlerts(projectId, 50);
  const [all, setAll] = useState(false);
  const list = alerts.data ?? [];
  const shown = all ? list : list.slice(0, FIRST_SHOWN);
  return (
    <SectionCard titleId="recent-title" title="Recent alerts" intro="What the last planning runs changed, for everyone in the project.">
      <div className="mt-4">
        {alerts.isPending ? <Spinner label="Reading the alerts" /> : null}
        {alerts.error ? <ErrorNotice error={alerts.error} /> : null}
        {alerts.data && alerts.data.length === 0 ? (
          <p className="text-sm text-ink-soft">No alerts yet. They appear when a planning run finds a window opened, lost or moved.</p>
        ) : null}
        {alerts.data && alerts.data.length > 0 ? (
          <ul className="flex flex-col divide-y divide-line" data-testid="alerts-list">
            {shown.map((a) => {
              const op = operations.find((o) => o.id === a.operationId);
              const site = sites.find((s) => s.id === a.siteId);
              const zone = site?.timeZone ?? 'UTC';
              const t = alertText(a.kind, a.details, zone, op?.tr ?? null);
              return (
                <li key={a.id} className="flex gap-3 py-3">
                  <span
                    className={`mt-0.5 inline-flex size-7 shrink-0 items-center justify-center rounded-full text-sm font-bold ${TONE_CLASS[t.tone]}`}
                    aria-hidden
                  >
                    {t.mark}
                  </span>
                  <div className="min-w-0">
                    <p className="font-semibold">
                      {t.headline}
                      <span className="font-normal text-ink-soft">
                        {' · '}
                        {op?.name ?? a.message ?? 'a removed operation'} at {site?.name ?? 'a removed worksite'}
                      </span>
                    </p>
                    <p className="text-sm">{t.body}</p>
                    <p className="text-xs text-ink-soft">Found {timeIn(a.createdAt, here, DATE_STYLE.dateTimeYear)}</p>
                  </div>
                </li>
              );
            })}
          </ul>
        ) : null}
        {list.length > FIRST_SHOWN ? (
          <Button variant="secondary" className="mt-2" onClick={() => setAll((x) => !x)} aria-expanded={all}>
            {all ? `Show the latest ${FIRST_SHOWN} only` : `Show all ${list.length} recent alerts`}
          </Button>
        ) : null}
      </div>
    </SectionCard>
  );
}
