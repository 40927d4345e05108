import { useState, type ReactNode } from 'react';
import { formatInstant, localTimeZone } from '../../../../shared/dates';
import type { AuditEntryResponse, SiteResponse } from '../../../../shared/api-types-sites';
import type { DatasetSummary } from '../../../../shared/api-types-datasets';
import type { AlphaTable } from '../../../../shared/engine/types';
import { AUDIT_ENTITIES, type AuditEntity, type TransferTableInput } from '../../../../shared/schemas/sites';
import { Button, Card, ErrorNotice, FieldShell, PlainOptions, Select, Spinner } from '../../../components/ui';
import { useAudit } from '../api/get-audit';
import { useHindcasts } from '../../../api/datasets';
import { useSites } from '../../../api/sites';
import { auditChanges, type FieldChange } from './audit-diff';
import { fmt, range, withUnit } from './format';
import { BED_VELOCITY_METHOD_LABEL } from '../../../../shared/limits-in-words';

const ENTITY_LABEL: Record<AuditEntity, string> = {
  operation: 'Operation',
  worksite: 'Worksite',
  alpha: 'Alpha table',
  project: 'Setup import',
  campaign: 'Campaign progress',
  vessel: 'Vessel',
};
const ENTITY_FILTER_LABEL: Record<AuditEntity, string> = {
  operation: 'Operations',
  worksite: 'Worksites',
  alpha: 'Alpha table',
  project: 'Setup imports',
  campaign: 'Campaign progress',
  vessel: 'Vessels',
};
const ACTION_LABEL = { create: 'added', update: 'changed', delete: 'deleted', import: 'imported' } as const;

/** Field names in words, by dotted path. */
const FIELD_LABEL: Record<string, string> = {
  name: 'Name',
  description: 'Description',
  tpop: 'TPOP',
  tc: 'TC',
  tr: 'TR',
  weatherRestricted: 'Weather-restricted',
  siteIds: 'Worksites',
  skipperIds: 'Skippers',
  'limits.hsMax': 'Hs max',
  'limits.hsTpCurve': 'Hs–Tp curve',
  'limits.tpMin': 'Tp min',
  'limits.tpMax': 'Tp max',
  'limits.tpExcluded': 'Excluded Tp bands',
  'limits.bedVelocityMax': 'Bed velocity max',
  'limits.bedVelocityMethod': 'Bed velocity method',
  'limits.windMax': 'Wind max',
  latitude: 'Latitude',
  longitude: 'Longitude',
  depth: 'Water depth',
  shoreNormal: 'Shore normal',
  breakerIndex: 'Breaker index γb',
  timeZone: 'Time zone',
  hindcastDatasetId: 'Hindcast',
  transferTable: 'Transfer table',
  table: 'Alpha table',
  isDefault: 'Uses the default table',
  mode: 'Mode',
  'worksites.created': 'Worksites added',
  'worksites.deleted': 'Worksites deleted',
  'operations.created': 'Operations added',
  'operations.deleted': 'Operations deleted',
  alphaTable: 'Alpha table',
  sourceProject: 'From project',
  exportedAt: 'Exported',
};

/** Units of numeric fields, by dotted path. */
const FIELD_UNIT: Record<string, string> = {
  tpop: 'h',
  tc: 'h',
  tr: 'h',
  depth: 'm',
  latitude: '°',
  longitude: '°',
  shoreNormal: '°',
  'limits.hsMax': 'm',
  'limits.tpMin': 's',
  'limits.tpMax': 's',
  'limits.bedVelocityMax': 'm/s',
  'limits.windMax': 'm/s',
};

/** Compared whole: a table is one value to the reader (the alpha table gets a cell-by-cell line). */
const LEAF_PATHS = new Set(['transferTable', 'table']);

interface Names {
  sites: SiteResponse[];
  hindcasts: DatasetSummary[];
}

const isPairs = (v: unknown): v is [number, number][] => Array.isArray(v) && v.every((p) => Array.isArray(p) && p.length === 2);

/** One audited value in words, with its unit. */
export function describeValue(path: string, value: unknown, names: Names): string {
  if (value === undefined || value === null) {
    if (path === 'shoreNormal') return 'none (no refraction)';
    if (path === 'hindcastDatasetId') return 'newest hindcast';
    if (path === 'transferTable') return 'none';
    return 'not set';
  }
  if (path === 'siteIds' && Array.isArray(value)) {
    if (value.length === 0) return 'every worksite';
    return value.map((id) => names.sites.find((s) => s.id === id)?.name ?? 'a deleted worksite').join(', ');
  }
  if (path === 'skipperIds' && Array.isArray(value)) return value.length === 0 ? 'none' : `${value.length} assigned`;
  if (path === 'hindcastDatasetId' && typeof value === 'string')
    return names.hindcasts.find((d) => d.id === value)?.name ?? 'a dataset not listed';
  if (path === 'limits.bedVelocityMethod' && (value === 'linear' || value === 'soulsby')) return BED_VELOCITY_METHOD_LABEL[value];
  if (path === 'limits.hsTpCurve' && isPairs(value)) return value.map(([tp, hs]) => `Tp ${fmt(tp)} s: Hs ${fmt(hs)} m`).join(' · ');
  if (path === 'limits.tpExcluded' && isPairs(value)) return value.map(([a, b]) => range(a, b, 's')).join(', ');
  if (path === 'transferTable' && typeof value === 'object') {
    const t = value as TransferTableInput;
    return `${t.directionSectorsDeg?.length ?? 0} sectors × ${t.tpBandsS?.length ?? 0} Tp bands`;
  }
  if (path === 'table' && typeof value === 'object') {
    const t = value as AlphaTable;
    return `${t.tpopBoundsH?.length ?? 0} TPOP rows × ${t.hsColumnsM?.length ?? 0} Hs columns`;
  }
  if (path === 'exportedAt' && typeof value === 'string') return formatInstant(value, localTimeZone(), 'dateTimeYear');
  if (path === 'alphaTable' && typeof value === 'string')
    return { set: 'set from the file', default: 'reset to the default', kept: 'kept' }[value] ?? value;
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (typeof value === 'number') return FIELD_UNIT[path] ? withUnit(value, FIELD_UNIT[path], 4) : fmt(value, 4);
  if (typeof value === 'string') return value === '' ? '(empty)' : value;
  return JSON.stringify(value);
}

/** The alpha factors that changed, cell by cell, when both tables have the same rows and columns. */
function alphaCellChanges(before: unknown, after: unknown): string[] | null {
  const b = before as AlphaTable | undefined;
  const a = after as AlphaTable | undefined;
  if (!b?.values || !a?.values) return null;
  if (JSON.stringify(b.tpopBoundsH) !== JSON.stringify(a.tpopBoundsH) || JSON.stringify(b.hsColumnsM) !== JSON.stringify(a.hsColumnsM))
    return null;
  const out: string[] = [];
  a.values.forEach((row, i) =>
    row.forEach((v, j) => {
      const old = b.values[i]?.[j];
      if (old !== v) out.push(`TPOP ≤ ${fmt(a.tpopBoundsH[i])} h, Hs ${fmt(a.hsColumnsM[j])} m: ${fmt(old ?? NaN, 3)} → ${fmt(v, 3)}`);
    }),
  );
  return out;
}

/** The audit trail, newest first, with a filter by kind; read-only for everyone. */
export function AuditPanel({ projectId }: { projectId: string }) {
  const [entity, setEntity] = useState<AuditEntity | ''>('');
  const [limit, setLimit] = useState(50);
  const audit = useAudit(projectId, { entity: entity || undefined, limit });
  const sites = useSites(projectId);
  const hindcasts = useHindcasts(projectId);
  const names: Names = { sites: sites.data ?? [], hindcasts: hindcasts.data ?? [] };

  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <p className="max-w-2xl text-sm text-ink-soft">
          Every change to a worksite, an operation’s limits or the alpha table, with who made it and the values before and after. Nobody can
          change or delete an entry.
        </p>
        <div className="w-full sm:w-64">
          <FieldShell label="Show" htmlFor="audit-entity">
            <Select
              id="audit-entity"
              value={entity}
              onChange={(e) => {
                setEntity(e.target.value as AuditEntity | '');
                setLimit(50);
              }}
            >
              <option value="">Every change</option>
              <PlainOptions values={AUDIT_ENTITIES} labels={ENTITY_FILTER_LABEL} />
            </Select>
          </FieldShell>
        </div>
      </div>
      {audit.isPending ? <Spinner label="Loading the audit trail" /> : null}
      {audit.error ? <ErrorNotice error={audit.error} /> : null}
      {audit.data && audit.data.length === 0 ? (
        <Card>
          <p className="text-sm text-ink-soft">No changes recorded{entity ? ' of this kind' : ''} yet.</p>
        </Card>
      ) : null}
      {audit.data && audit.data.length > 0 ? (
        <ol className="flex flex-col gap-3" aria-label="Audit trail entries">
          {audit.data.map((e) => (
            <li key={e.id}>
              <AuditEntry entry={e} names={names} />
            </li>
          ))}
        </ol>
      ) : null}
      {audit.data && audit.data.length >= limit && limit < 500 ? (
        <div>
          <Button variant="secondary" onClick={() => setLimit((n) => Math.min(500, n + 50))} disabled={audit.isFetching}>
            {audit.isFetching ? 'Loading…' : 'Show older changes'}
          </Button>
        </div>
      ) : null}
    </div>
  );
}

function AuditEntry({ entry, names }: { entry: AuditEntryResponse; names: Names }) {
  const changes = auditChanges(entry.before, entry.after, (p) => LEAF_PATHS.has(p.join('.')));
  const title =
    entry.entity === 'alpha'
      ? `Alpha table ${ACTION_LABEL[entry.action]}`
      : entry.entity === 'project'
        ? `Setup imported into “${entry.entityName}”`
        : `${ENTITY_LABEL[entry.entity]} “${entry.entityName}” ${ACTION_LABEL[entry.action]}`;
  const at = new Date(entry.at);
  const oneSided = entry.before == null || entry.after == null;
  return (
    <Card className="!p-4" data-testid="audit-entry">
      <div className="flex flex-wrap items-baseline justify-between gap-x-4 gap-y-1">
        <h3 className="text-base font-bold">{title}</h3>
        <p className="text-sm text-ink-soft">
          <time dateTime={entry.at}>{formatInstant(at, localTimeZone(), 'dateTimeSeconds')}</time> · {entry.userName}
          {entry.userEmail ? <> ({entry.userEmail})</> : null}
          {entry.userId ? <span className="text-xs text-ink-soft"> · user id {entry.userId}</span> : null}
        </p>
      </div>
      {changes.length === 0 ? (
        <p className="mt-2 text-sm text-ink-soft">No audited field changed.</p>
      ) : oneSided ? (
        <dl className="mt-2 grid grid-cols-1 gap-x-4 gap-y-1 text-sm sm:grid-cols-[max-content_1fr]">
          {changes.map((c) => (
            <FieldLine key={c.path.join('.')} label={labelOf(c)}>
              {describeValue(c.path.join('.'), entry.after == null ? c.before : c.after, names)}
            </FieldLine>
          ))}
        </dl>
      ) : (
        <ul className="mt-2 flex flex-col gap-1.5 text-sm">
          {changes.map((c) => (
            <ChangeLine key={c.path.join('.')} change={c} names={names} />
          ))}
        </ul>
      )}
    </Card>
  );
}

function labelOf(c: FieldChange): string {
  const path = c.path.join('.');
  const unit = FIELD_UNIT[path];
  const label = FIELD_LABEL[path] ?? path;
  return unit && unit !== '°' ? `${label} (${unit})` : label;
}

function FieldLine({ label, children }: { label: string; children: ReactNode }) {
  return (
    <>
      <dt className="font-semibold text-ink-soft">{label}</dt>
      <dd className="break-words">{children}</dd>
    </>
  );
}

function ChangeLine({ change, names }: { change: FieldChange; names: Names }) {
  const path = change.path.join('.');
  const cells = path === 'table' ? alphaCellChanges(change.before, change.after) : null;
  return (
    <li className="flex flex-col gap-0.5 sm:flex-row sm:flex-wrap sm:items-baseline sm:gap-2" data-testid="audit-change">
      <span className="font-semibold">{FIELD_LABEL[path] ?? path}:</span>
      {cells ? (
        <span>{cells.length > 0 ? cells.join('; ') : 'same factors'}</span>
      ) : (
        <span className="break-words">
          <del className="text-ink-soft decoration-danger/60">{describeValue(path, change.before, names)}</del>
          <span aria-hidden> → </span>
          <span className="sr-only"> changed to </span>
          <ins className="font-semibold no-underline">{describeValue(path, change.after, names)}</ins>
        </span>
      )}
    </li>
  );
}
