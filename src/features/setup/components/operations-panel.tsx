import type { ReactNode } from 'react';
import type { OperationResponse, SiteResponse } from '../../../../shared/api-types-sites';
import { alphaFor } from '../../../../shared/engine/alpha-factor';
import type { AlphaTable } from '../../../../shared/engine/types';
import { Card, ErrorNotice, Spinner } from '../../../components/ui';
import { Term } from '../../../components/ui/term';
import { useDeleteOperation } from '../api/delete-operation';
import { useAlpha } from '../api/get-alpha';
import { useOperations } from '../../../api/operations';
import { useSites } from '../../../api/sites';
import { useVessels } from '../../../api/vessels';
import { EditableListFrame, useEditableList } from './editable-list';
import { Tag } from './form-bits';
import { fmt, withUnit } from './format';
import { summarizeLimits } from './limits-summary';
import { OperationForm } from './operation-form';

/** Operations with their limits: the list, and for coordinators the add/edit form and deletion. */
export function OperationsPanel({ projectId, canEdit }: { projectId: string; canEdit: boolean }) {
  const ops = useOperations(projectId);
  const sites = useSites(projectId);
  const alpha = useAlpha(projectId);
  const list = useEditableList(
    useDeleteOperation(projectId),
    'Operation',
    'It leaves the watch board and the statistics; the audit trail keeps its last limits.',
    canEdit,
  );

  if (ops.isPending || sites.isPending) return <Spinner label="Loading operations" />;
  if (ops.error) return <ErrorNotice error={ops.error} />;
  if (sites.error) return <ErrorNotice error={sites.error} />;

  return (
    <EditableListFrame
      list={list}
      items={ops.data}
      intro="Each operation’s limits (OPLIM) are tested hour by hour at its worksites. Weather-restricted operations are planned on the forecast limit OPWF = α·OPLIM for Hs."
      form={(op) => (
        <OperationForm
          key={list.editing}
          projectId={projectId}
          op={op}
          sites={sites.data}
          alphaTable={alpha.data?.table}
          onDone={list.formDone}
        />
      )}
      empty={{ title: 'No operations yet.', addHint: 'Add the operations of the campaign with their durations and weather limits.' }}
    >
      <ul className="grid gap-3 lg:grid-cols-2" aria-label="Operations">
        {ops.data.map((o) => (
          <li key={o.id} className="min-w-0">
            <OperationCard
              projectId={projectId}
              op={o}
              sites={sites.data}
              alphaTable={alpha.data?.table}
              actions={list.actions(o)}
              confirm={list.confirming === o.id ? list.confirmBox(o) : null}
            />
          </li>
        ))}
      </ul>
    </EditableListFrame>
  );
}

/**
 * The forecast limits of a weather-restricted operation in words: Hs max × α, and for a curve the
 * range of α over its points (α is looked up at each point's own Hs, docs/domain.md#convention-5). Null when α is
 * 1 (not weather-restricted, TPOP above 72 h or TR above 96 h) or there is no Hs limit.
 */
function forecastLimitText(op: OperationResponse, table: AlphaTable | undefined): string | null {
  if (!op.weatherRestricted || !table) return null;
  const parts: string[] = [];
  try {
    if (op.limits.hsMax != null) {
      const a = alphaFor(table, op.tpop, op.limits.hsMax, op.tr, true);
      if (a < 1) parts.push(`Hs ≤ ${withUnit(a * op.limits.hsMax, 'm')} (α ${fmt(a, 3)})`);
    }
    const curve = op.limits.hsTpCurve ?? [];
    if (curve.length > 0) {
      const alphas = curve.map(([, hs]) => alphaFor(table, op.tpop, hs, op.tr, true));
      const lo = Math.min(...alphas);
      const hi = Math.max(...alphas);
      if (lo < 1) parts.push(`curve × α ${lo === hi ? fmt(lo, 3) : `${fmt(lo, 3)}–${fmt(hi, 3)}`}`);
    }
  } catch {
    return null;
  }
  return parts.length > 0 ? `On the forecast: ${parts.join(', ')}` : null;
}

/** The operation's vessel and heading, in words (response limits read them). */
function VesselLine({ projectId, vesselId, heading }: { projectId: string; vesselId: string; heading: number | null }) {
  const name = useVessels(projectId).data?.find((v) => v.id === vesselId)?.name;
  return (
    <p className="text-sm" data-testid="operation-vessel">
      <span className="font-semibold">Vessel:</span> {name ?? 'a vessel no longer listed'}
      {heading !== null ? `, heading ${fmt(heading, 1)}° true` : ', no heading set'}
    </p>
  );
}

/** The duration tiles of an operation's card: the term, any words after it, and the hours shown. */
const DURATION_TILES = [
  { term: 'tpop', after: null },
  { term: 'tc', after: null },
  { term: 'tr', after: ' = TPOP + TC' },
] as const;

function OperationCard({
  projectId,
  op,
  sites,
  alphaTable,
  actions,
  confirm,
}: {
  projectId: string;
  op: OperationResponse;
  sites: SiteResponse[];
  alphaTable: AlphaTable | undefined;
  actions: ReactNode;
  confirm: ReactNode;
}) {
  const where =
    op.siteIds.length === 0
      ? 'Every worksite'
      : op.siteIds.map((id) => sites.find((s) => s.id === id)?.name ?? 'a worksite no longer listed').join(', ');
  const forecast = forecastLimitText(op, alphaTable);
  return (
    <Card className="flex h-full flex-col gap-3 !p-4" data-testid="operation-card">
      <div className="flex flex-wrap items-start justify-between gap-2">
        <div className="min-w-0">
          <h3 className="text-base font-bold">{op.name}</h3>
          {op.description ? <p className="text-sm text-ink-soft">{op.description}</p> : null}
        </div>
        <div className="flex flex-wrap gap-1.5">
          {op.weatherRestricted ? <Tag tone="accent">Weather-restricted</Tag> : <Tag>Unrestricted</Tag>}
          {op.skipperIds.length > 0 ? (
            <Tag>
              {op.skipperIds.length} {op.skipperIds.length === 1 ? 'skipper' : 'skippers'}
            </Tag>
          ) : null}
        </div>
      </div>
      <p className="text-sm">
        <span className="font-semibold">Limits:</span> <span data-testid="limits-summary">{summarizeLimits(op.limits)}</span>
        {forecast ? <span className="block text-ink-soft">{forecast}</span> : null}
      </p>
      {op.vesselId ? <VesselLine projectId={projectId} vesselId={op.vesselId} heading={op.heading} /> : null}
      <dl className="grid grid-cols-3 gap-2 text-center text-sm">
        {DURATION_TILES.map(({ term, after }) => (
          <div key={term} className="rounded-lg bg-surface-2 px-2 py-1.5">
            <dt className="text-xs text-ink-soft">
              <Term k={term} />
              {after}
            </dt>
            <dd className="font-semibold tabular-nums">{withUnit(op[term], 'h')}</dd>
          </div>
        ))}
      </dl>
      <p className="text-sm">
        <span className="font-semibold">Worksites:</span> {where}
      </p>
      {actions ? <div className="mt-auto">{actions}</div> : null}
      {confirm}
    </Card>
  );
}
