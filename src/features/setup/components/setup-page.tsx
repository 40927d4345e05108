import { useParams, useSearchParams } from 'react-router-dom';
import { ErrorNotice, Notice, PageHeader, Spinner } from '../../../components/ui';
import { Tabs } from '../../../components/ui/tabs';
import { useProjectAccess } from '../../../api/projects';
import { usePageZone } from '../../../components/page-zone';
import { localTimeZone, zoneStatement } from '../../../../shared/dates';
import { AlphaPanel } from './alpha-panel';
import { AuditPanel } from './audit-panel';
import { ExchangePanel } from './exchange-panel';
import { OperationsPanel } from './operations-panel';
import { WorksitesPanel } from './worksites-panel';

/** Internal tabs of the page, kept in `?tab=` so a link or a reload opens the same one. */
export const SETUP_TABS = [
  { id: 'worksites', label: 'Worksites' },
  { id: 'operations', label: 'Operations' },
  { id: 'alpha', label: 'Alpha table' },
  { id: 'audit', label: 'Audit trail' },
  { id: 'exchange', label: 'Export/import' },
] as const;
export type SetupTab = (typeof SETUP_TABS)[number]['id'];

const isTab = (v: string | null): v is SetupTab => SETUP_TABS.some((t) => t.id === v);

/**
 * `/projects/:projectId/setup` ("Sites & limits"): worksites, operations and their limits, the
 * alpha table, the audit trail and the setup export/import. Every member reads; coordinators and
 * administrators edit (clients and skippers see no edit control at all).
 */
export function SetupPage() {
  const { projectId = '' } = useParams();
  // The times here (audit entries, saved and exported at) are on the reader's own clock.
  usePageZone(zoneStatement(localTimeZone(), 'your own clock'));
  const [params, setParams] = useSearchParams();
  const access = useProjectAccess(projectId);
  const raw = params.get('tab');
  const tab: SetupTab = isTab(raw) ? raw : 'worksites';

  const select = (next: SetupTab) =>
    setParams(
      (p) => {
        const q = new URLSearchParams(p);
        q.set('tab', next);
        return q;
      },
      { replace: false },
    );

  if (access.isPending) return <Spinner label="Opening the setup" />;
  if (access.error) return <ErrorNotice error={access.error} />;
  const canEdit = access.canEdit;

  return (
    <div>
      <PageHeader
        title="Sites & limits"
        subtitle={
          canEdit
            ? 'Worksites, operations and their weather limits, and the alpha table the forecast plans use. Every change is kept in the audit trail.'
            : 'Worksites, operations and their weather limits, as the marine coordinator set them. You can read everything here; changes are made by the coordinator.'
        }
      />
      {!canEdit ? (
        <div className="mb-4">
          <Notice>Read-only: your role in this project lets you see the setup but not change it.</Notice>
        </div>
      ) : null}
      <Tabs label="Setup sections" tabs={SETUP_TABS} selected={tab} onSelect={select}>
        {tab === 'worksites' ? <WorksitesPanel projectId={projectId} canEdit={canEdit} /> : null}
        {tab === 'operations' ? <OperationsPanel projectId={projectId} canEdit={canEdit} /> : null}
        {tab === 'alpha' ? <AlphaPanel projectId={projectId} canEdit={canEdit} /> : null}
        {tab === 'audit' ? <AuditPanel projectId={projectId} /> : null}
        {tab === 'exchange' ? <ExchangePanel projectId={projectId} canEdit={canEdit} /> : null}
      </Tabs>
    </div>
  );
}
