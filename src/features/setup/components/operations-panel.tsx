import { useEffect, useRef, useState, type ReactNode } from 'react';
import type { OperationResponse, SiteResponse } from '../../../../shared/api-types-sites';
import { alphaFor } from '../../../../shared/engine/alpha-factor';
import type { AlphaTable } from '../../../../shared/engine/types';
import { Button, Card, ErrorNotice, Notice, Spinner } from '../../../components/ui';
import { Term } from '../../../components/ui/term';
import { useDeleteOperation } from '../api/delete-operation';
import { useAlpha } from '../api/get-alpha';
import { useOperations } from '../../../api/operations';
import { useSites } from '../../../api/sites';
import { ConfirmBox, Tag } from './form-bits';
import { fmt, withUnit } from './format';
import { summarizeLimits } from './limits-summary';
import { OperationForm } from './operation-form';

/** Operations with their limits: the list, and for coordinators the add/edit form and deletion. */
export function OperationsPanel({ projectId, canEdit }: { projectId: string; canEdit: boolean }) {
  const ops = useOperations(projectId);
  const sites = useSites(projectId);
  const alpha = useAlpha(projectId);
  const remove = useDeleteOperation(projectId);
  const [editing, setEditing] = useState<'new' | string | null>(null);
  const [confirming, setConfirming] = useState<string | null>(null);
  const [saved, setSaved] = useState<string | null>(null);
  const formRef = useRef<HTMLDivElement>(null);

  useEffect(() => {
    if (editing) formRef.current?.scrollIntoView({ block: 'start', behavior: 'smooth' });
  }, [editing]);

  if (ops.isPending || sites.isPending) return <Spinner label="Loading operations" />;
  if (ops.error) return <ErrorNotice error={ops.error} />;
  if (sites.error) return <ErrorNotice error={sites.error} />;
  const list = ops.data;
  const editingOp = editing && editing !== 'new' ? (list.find((o) => o.id === editing) ?? null) : null;

  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <p className="max-w-3xl text-sm text-ink-soft">
          Each operation’s limits (OPLIM) are tested hour by hour at its worksites. Weather-restricted operations are planned on the
          forecast limit OPWF = α·OPLIM for Hs.
        </p>
        {canEdit && editing !== 'new' ? (
          <Button
            onClick={() => {
              setEditing('new');
              setSaved(null);
            }}
          >
            Add operation
          </Button>
        ) : null}
      </div>
      {saved ? <Notice tone="success">{saved}</Notice> : null}
      {canEdit && editing ? (
        <div ref={formRef} className="scroll-mt-4">
          <Card>
            <h2 className="mb-4 text-lg font-bold">{editingOp ? `Edit “${editingOp.name}”` : 'New operation'}</h2>
            <OperationForm
              key={editing}
              projectId={projectId}
              op={editingOp}
              sites={sites.data}
              alphaTable={alpha.data?.table}
              onDone={(o) => {
                setEditing(null);
                if (o) setSaved(`Operation “${o.name}” saved.`);
              }}
            />
          </Card>
        </div>
      ) : null}

      {list.length === 0 ? (
        <Card>
          <p className="font-semibold">No operations yet.</p>
          <p className="mt-1 text-sm text-ink-soft">
            {canEdit ? 'Add the operations of the campaign with their durations and weather limits.' : 'A marine coordinator adds them.'}
          </p>
        </Card>
      ) : (
        <ul className="grid gap-3 lg:grid-cols-2" aria-label="Operations">
          {list.map((o) => (
            <li key={o.id} className="min-w-0">
              <OperationCard
                op={o}
                sites={sites.data}
                alphaTable={alpha.data?.table}
                actions={
                  canEdit ? (
                    <div className="flex flex-wrap gap-1">
                      <Button
                        variant="secondary"
                        onClick={() => {
                          setEditing(o.id);
                          setSaved(null);
                        }}
                        aria-label={`Edit ${o.name}`}
                      >
                        Edit
                      </Button>
                      <Button
                        variant="ghost"
                        className="text-danger"
                        onClick={() => {
                          remove.reset();
                          setConfirming(o.id);
                          setSaved(null);
                        }}
                        aria-label={`Delete ${o.name}`}
                      >
                        Delete
                      </Button>
                    </div>
                  ) : null
                }
                confirm={
                  confirming === o.id ? (
                    <ConfirmBox
                      what={`“${o.name}”`}
                      consequence="It leaves the watch board and the statistics; the audit trail keeps its last limits."
                      onConfirm={() =>
                        remove.mutate(o.id, {
                          onSuccess: () => {
                            setConfirming(null);
                            setSaved(`Operation “${o.name}” deleted.`);
                            if (editing === o.id) setEditing(null);
                          },
                        })
                      }
                      onCancel={() => setConfirming(null)}
                      pending={remove.isPending}
                      error={remove.error}
                    />
                  ) : null
                }
              />
            </li>
          ))}
        </ul>
      )}
    </div>
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

function OperationCard({
  op,
  sites,
  alphaTable,
  actions,
  confirm,
}: {
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
      <dl className="grid grid-cols-3 gap-2 text-center text-sm">
        <div className="rounded-lg bg-surface-2 px-2 py-1.5">
          <dt className="text-xs text-ink-soft">
            <Term k="tpop" />
          </dt>
          <dd className="font-semibold tabular-nums">{withUnit(op.tpop, 'h')}</dd>
        </div>
        <div className="rounded-lg bg-surface-2 px-2 py-1.5">
          <dt className="text-xs text-ink-soft">
            <Term k="tc" />
          </dt>
          <dd className="font-semibold tabular-nums">{withUnit(op.tc, 'h')}</dd>
        </div>
        <div className="rounded-lg bg-surface-2 px-2 py-1.5">
          <dt className="text-xs text-ink-soft">
            <Term k="tr" /> = TPOP + TC
          </dt>
          <dd className="font-semibold tabular-nums">{withUnit(op.tr, 'h')}</dd>
        </div>
      </dl>
      <p className="text-sm">
        <span className="font-semibold">Worksites:</span> {where}
      </p>
      {actions ? <div className="mt-auto">{actions}</div> : null}
      {confirm}
    </Card>
  );
}
