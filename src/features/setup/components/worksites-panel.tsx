import { Fragment } from 'react';
import type { SiteResponse } from '../../../../shared/api-types-sites';
import type { DatasetSummary } from '../../../../shared/api-types-datasets';
import { Card, ErrorNotice, Spinner } from '../../../components/ui';
import { useDeleteSite } from '../api/delete-site';
import { useHindcasts } from '../../../api/datasets';
import { useSites } from '../../../api/sites';
import { EditableListFrame, useEditableList } from './editable-list';
import { Tag } from './form-bits';
import { fmt, position, withUnit } from './format';
import { TransferTableView } from './transfer-table-editor';
import { WorksiteForm } from './worksite-form';

const th = 'px-3 py-2 text-left text-xs font-semibold uppercase tracking-wide text-ink-soft';
const td = 'px-3 py-2 align-top';

function browserZone(): string {
  try {
    return Intl.DateTimeFormat().resolvedOptions().timeZone || 'UTC';
  } catch {
    return 'UTC';
  }
}

function hindcastName(site: SiteResponse, hindcasts: DatasetSummary[] | undefined): string {
  if (!site.hindcastDatasetId) return 'Newest hindcast';
  return hindcasts?.find((d) => d.id === site.hindcastDatasetId)?.name ?? 'A dataset not listed';
}

function shoreNormalText(site: SiteResponse): string {
  return site.shoreNormal === null ? 'none (no refraction)' : withUnit(site.shoreNormal, '°', 1);
}

/** Worksites: the list, and for coordinators the add/edit form and deletion. */
export function WorksitesPanel({ projectId, canEdit }: { projectId: string; canEdit: boolean }) {
  const sites = useSites(projectId);
  const hindcasts = useHindcasts(projectId);
  const editor = useEditableList(
    useDeleteSite(projectId),
    'Worksite',
    'Operations that also work elsewhere lose this worksite from their list; the change is kept in the audit trail.',
    canEdit,
  );
  const { confirming, confirmBox } = editor;

  if (sites.isPending) return <Spinner label="Loading worksites" />;
  if (sites.error) return <ErrorNotice error={sites.error} />;
  const list = sites.data;
  const defaultZone = list[0]?.timeZone ?? browserZone();
  const actions = (site: SiteResponse) => editor.actions(site, 'flex flex-wrap gap-1 md:flex-nowrap');

  return (
    <EditableListFrame
      list={editor}
      items={list}
      intro="Where the work happens. Sea states at the data point are carried to each worksite’s depth (refraction by its shore normal, shoaling, the depth limit γb·d), or by its transfer table where one is set."
      form={(site) => (
        <WorksiteForm key={editor.editing} projectId={projectId} site={site} defaultZone={defaultZone} onDone={editor.formDone} />
      )}
      empty={{ title: 'No worksites yet.', addHint: 'Add the places where the operations happen, with their water depth and time zone.' }}
    >
      <>
        {/* Laptop: one table. */}
        <div className="hidden overflow-x-auto rounded-[var(--radius-card)] border border-line bg-surface md:block">
          <table className="w-full text-sm">
            <thead className="border-b border-line bg-surface-2">
              <tr>
                <th className={th}>Worksite</th>
                <th className={`${th} text-right`}>Depth</th>
                <th className={`${th} text-right`}>Shore normal</th>
                <th className={`${th} text-right`}>
                  Breaker index <span className="normal-case">γb</span>
                </th>
                <th className={th}>Time zone</th>
                <th className={th}>Hindcast</th>
                {canEdit ? (
                  <th className={th}>
                    <span className="sr-only">Actions</span>
                  </th>
                ) : null}
              </tr>
            </thead>
            <tbody>
              {list.map((s) => (
                <Fragment key={s.id}>
                  <tr className="border-b border-line last:border-0">
                    <td className={td}>
                      <span className="font-semibold">{s.name}</span>
                      <TransferTag site={s} />
                      {s.latitude !== null && s.longitude !== null ? (
                        <span className="block text-xs text-ink-soft">{position(s.latitude, s.longitude)}</span>
                      ) : null}
                    </td>
                    <td className={`${td} text-right tabular-nums whitespace-nowrap`}>{withUnit(s.depth, 'm')}</td>
                    <td className={`${td} text-right tabular-nums`}>{shoreNormalText(s)}</td>
                    <td className={`${td} text-right tabular-nums`}>{fmt(s.breakerIndex)}</td>
                    <td className={td}>{s.timeZone}</td>
                    <td className={td}>{hindcastName(s, hindcasts.data)}</td>
                    {canEdit ? <td className={`${td} w-1 whitespace-nowrap`}>{actions(s)}</td> : null}
                  </tr>
                  {confirming === s.id ? (
                    <tr className="border-b border-line">
                      <td className="px-3 pb-3" colSpan={canEdit ? 7 : 6}>
                        {confirmBox(s)}
                      </td>
                    </tr>
                  ) : null}
                </Fragment>
              ))}
            </tbody>
          </table>
        </div>
        {/* Phone: one card per worksite. */}
        <ul className="flex flex-col gap-3 md:hidden">
          {list.map((s) => (
            <li key={s.id}>
              <Card className="!p-4">
                <div className="font-semibold">
                  {s.name}
                  <TransferTag site={s} />
                </div>
                <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-sm">
                  <dt className="text-ink-soft">Depth</dt>
                  <dd>{withUnit(s.depth, 'm')}</dd>
                  <dt className="text-ink-soft">Shore normal</dt>
                  <dd>{shoreNormalText(s)}</dd>
                  <dt className="text-ink-soft">Breaker index γb</dt>
                  <dd>{fmt(s.breakerIndex)}</dd>
                  <dt className="text-ink-soft">Time zone</dt>
                  <dd className="break-words">{s.timeZone}</dd>
                  <dt className="text-ink-soft">Hindcast</dt>
                  <dd>{hindcastName(s, hindcasts.data)}</dd>
                  {s.latitude !== null && s.longitude !== null ? (
                    <>
                      <dt className="text-ink-soft">Position</dt>
                      <dd>{position(s.latitude, s.longitude)}</dd>
                    </>
                  ) : null}
                </dl>
                {canEdit ? <div className="mt-3">{actions(s)}</div> : null}
                {confirming === s.id ? <div className="mt-3">{confirmBox(s)}</div> : null}
              </Card>
            </li>
          ))}
        </ul>
      </>
    </EditableListFrame>
  );
}

function TransferTag({ site }: { site: SiteResponse }) {
  if (!site.transferTable) return null;
  const t = site.transferTable;
  return (
    <details className="mt-1 text-xs">
      <summary className="inline-flex min-h-11 cursor-pointer items-center gap-2">
        <Tag tone="accent">
          Transfer table {t.directionSectorsDeg.length} × {t.tpBandsS.length}
        </Tag>
        <span className="text-ink-soft underline">show</span>
      </summary>
      <div className="mt-1 rounded-md border border-line bg-surface-2 p-2">
        <TransferTableView table={t} />
      </div>
    </details>
  );
}
