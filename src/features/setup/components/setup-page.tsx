import { useEffect, useRef, type KeyboardEvent } from 'react';
import { useParams, useSearchParams } from 'react-router-dom';
import { ErrorNotice, Notice, PageHeader, Spinner } from '../../../components/ui';
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
  const tabRefs = useRef<(HTMLButtonElement | null)[]>([]);
  const raw = params.get('tab');
  const tab: SetupTab = isTab(raw) ? raw : 'worksites';

  // On a phone the tab list scrolls sideways: keep the open tab in view (without scrolling the page).
  useEffect(() => {
    const el = tabRefs.current[SETUP_TABS.findIndex((t) => t.id === tab)];
    const list = el?.parentElement;
    if (!el || !list) return;
    if (el.offsetLeft < list.scrollLeft || el.offsetLeft + el.offsetWidth > list.scrollLeft + list.clientWidth) {
      list.scrollLeft = el.offsetLeft - (list.clientWidth - el.offsetWidth) / 2;
    }
  }, [tab, access.isPending]);

  const select = (next: SetupTab, focus = false) => {
    setParams(
      (p) => {
        const q = new URLSearchParams(p);
        q.set('tab', next);
        return q;
      },
      { replace: false },
    );
    if (focus) tabRefs.current[SETUP_TABS.findIndex((t) => t.id === next)]?.focus();
  };
  // Arrow keys move along the tab list (WAI-ARIA tabs pattern, automatic activation).
  const onKeyDown = (e: KeyboardEvent<HTMLDivElement>) => {
    const i = SETUP_TABS.findIndex((t) => t.id === tab);
    const n = SETUP_TABS.length;
    const to = e.key === 'ArrowRight' ? (i + 1) % n : e.key === 'ArrowLeft' ? (i - 1 + n) % n : e.key === 'Home' ? 0 : e.key === 'End' ? n - 1 : -1;
    if (to < 0) return;
    e.preventDefault();
    select(SETUP_TABS[to].id, true);
  };

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
      <div role="tablist" aria-label="Setup sections" className="no-print mb-4 flex gap-1 overflow-x-auto rounded-lg bg-surface-2 p-1" onKeyDown={onKeyDown}>
        {SETUP_TABS.map((t, i) => {
          const active = t.id === tab;
          return (
            <button
              key={t.id}
              ref={(el) => {
                tabRefs.current[i] = el;
              }}
              type="button"
              role="tab"
              id={`setup-tab-${t.id}`}
              aria-selected={active}
              aria-controls={`setup-panel-${t.id}`}
              tabIndex={active ? 0 : -1}
              onClick={() => select(t.id)}
              className={`inline-flex min-h-11 shrink-0 items-center rounded-md px-3 text-sm font-semibold whitespace-nowrap transition ${active ? 'bg-surface text-ink shadow-sm ring-1 ring-line' : 'text-ink-soft hover:text-ink'}`}
            >
              {t.label}
            </button>
          );
        })}
      </div>
      {!canEdit ? (
        <div className="mb-4">
          <Notice>Read-only: your role in this project lets you see the setup but not change it.</Notice>
        </div>
      ) : null}
      <div role="tabpanel" id={`setup-panel-${tab}`} aria-labelledby={`setup-tab-${tab}`}>
        {tab === 'worksites' ? <WorksitesPanel projectId={projectId} canEdit={canEdit} /> : null}
        {tab === 'operations' ? <OperationsPanel projectId={projectId} canEdit={canEdit} /> : null}
        {tab === 'alpha' ? <AlphaPanel projectId={projectId} canEdit={canEdit} /> : null}
        {tab === 'audit' ? <AuditPanel projectId={projectId} /> : null}
        {tab === 'exchange' ? <ExchangePanel projectId={projectId} canEdit={canEdit} /> : null}
      </div>
    </div>
  );
}
