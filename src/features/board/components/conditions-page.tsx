// `/projects/:projectId/conditions/:siteId`: one worksite over the latest forecast. Worksite Hs,
// Tp, near-bed velocity (both methods) and wind against time in the worksite's zone, with each
// operation's limit (OPLIM) and forecast limit (OPWF) drawn, and how often the transformation
// flagged an hour.
import { lazy, Suspense, useMemo, useState, useEffect } from 'react';
import { Link, useParams } from 'react-router-dom';
import { TRANSFORMATION_CAUTION } from '../../../../shared/caution';
import { TRANSFORM_FLAG } from '../../../../shared/waves/transform';
import { Card, ErrorNotice, Notice, PageHeader, Spinner } from '../../../components/ui';
import { useConditions } from '../api/get-conditions';
import { useOperations } from '../../../api/operations';
import { usePlan } from '../api/get-plan';
import { useSites } from '../../../api/sites';
import { fmt, formatIn, relativeTime, responseLimitWords } from './board-format';
import { usePageZone } from '../../../components/page-zone';
import { zoneStatement } from '../../../../shared/dates';
import type { ChartOperation } from './conditions-charts';
import { useIsDark } from '../../../lib/use-is-dark';
import { operationColour } from './operation-colours';
import { TideStrip } from './tide-strip';
import { CurrentStrip } from './current-strip';

const ConditionsCharts = lazy(() => import('./conditions-charts'));

const linkClass =
  'inline-flex min-h-11 items-center rounded-lg border border-line bg-surface-2 px-4 text-sm font-semibold hover:border-accent';

function useMinuteClock() {
  const [now, setNow] = useState(() => Date.now());
  useEffect(() => {
    const id = window.setInterval(() => setNow(Date.now()), 60_000);
    return () => window.clearInterval(id);
  }, []);
  return now;
}

export function ConditionsPage() {
  const { projectId = '', siteId = '' } = useParams();
  const conditions = useConditions({ projectId, siteId });
  const sites = useSites(projectId);
  const operations = useOperations(projectId);
  const plan = usePlan({ projectId, alpha: true });
  const nowMs = useMinuteClock();
  const site = sites.data?.find((s) => s.id === siteId);
  const c = conditions.data;

  const chartOps: ChartOperation[] = useMemo(() => {
    if (!c) return [];
    return c.operations.map((o, i) => {
      const limits = operations.data?.find((x) => x.id === o.id)?.limits;
      return {
        n: i + 1,
        ...o,
        tpMin: limits?.tpMin ?? null,
        tpMax: limits?.tpMax ?? null,
        tpExcluded: (limits?.tpExcluded ?? []) as [number, number][],
        hasCurve: Boolean(limits?.hsTpCurve && limits.hsTpCurve.length > 0),
      };
    });
  }, [c, operations.data]);

  const flagCounts = useMemo(() => {
    const counts = { depth: 0, landward: 0, skipped: 0, table: 0, missing: 0 };
    for (const f of c?.flags ?? []) {
      if (f & TRANSFORM_FLAG.DEPTH_LIMITED) counts.depth++;
      if (f & TRANSFORM_FLAG.LANDWARD) counts.landward++;
      if (f & TRANSFORM_FLAG.REFRACTION_SKIPPED) counts.skipped++;
      if (f & TRANSFORM_FLAG.TRANSFER_TABLE) counts.table++;
      if (f & TRANSFORM_FLAG.MISSING_INPUT) counts.missing++;
    }
    return counts;
  }, [c]);

  const zone = c?.timeZone ?? site?.timeZone ?? 'UTC';
  usePageZone(c || site ? zoneStatement(zone, 'the worksite’s local time') : null);
  const dataset = plan.data?.dataset ?? null;
  const dark = useIsDark();

  return (
    <div>
      <PageHeader
        title={site ? `Conditions at ${site.name}` : 'Worksite conditions'}
        subtitle={
          site ? (
            <>
              Water depth {fmt(site.depth, 1, 'm')} · shore normal{' '}
              {site.shoreNormal === null ? 'not set (no refraction)' : `${site.shoreNormal}° from`} · breaker index γb {site.breakerIndex}
            </>
          ) : (
            'The worksite’s sea over the latest forecast, with the limits of the operations planned there.'
          )
        }
        actions={
          <Link to={`/projects/${projectId}/board?site=${siteId}`} className={linkClass}>
            ‹ Watch board for this worksite
          </Link>
        }
      />
      {conditions.isPending ? <Spinner label="Transforming the forecast to the worksite" /> : null}
      {conditions.error ? <ErrorNotice error={conditions.error} /> : null}
      {c && c.times.length === 0 ? (
        <Card>
          <h2 className="text-lg font-bold">No forecast yet</h2>
          <p className="mt-1 text-sm text-ink-soft">
            The conditions appear here once the marine coordinator has fetched a forecast for the project.
          </p>
        </Card>
      ) : null}
      {c && c.times.length > 0 ? (
        <div className="flex flex-col gap-4">
          <Card className="flex flex-col gap-3">
            {dataset ? (
              <p className="text-sm">
                <strong>{dataset.name}</strong>
                {dataset.issuedAt ? (
                  <span className="text-ink-soft">
                    {' '}
                    · issued {formatIn(dataset.issuedAt, zone)} ({relativeTime(Date.parse(dataset.issuedAt), nowMs)})
                  </span>
                ) : null}
              </p>
            ) : null}
            <p className="text-sm text-ink-soft">
              From {formatIn(c.times[0], zone)} to {formatIn(c.times[c.times.length - 1], zone)}, hourly. Numbered lines are the limits of
              the operations below: solid at the operation limit OPLIM, dashed at the forecast limit OPWF = α × OPLIM (Hs only).
            </p>
            {chartOps.length === 0 ? (
              <Notice>No operation is planned at this worksite, so no limits are drawn.</Notice>
            ) : (
              <ol className="grid gap-2 text-sm sm:grid-cols-2" data-testid="conditions-operations">
                {chartOps.map((o) => (
                  <li key={o.id} className="flex items-start gap-2">
                    <span
                      className="inline-flex size-6 shrink-0 items-center justify-center rounded-full text-xs font-bold text-white dark:text-deep"
                      style={{ background: operationColour(o.n, dark) }}
                      aria-hidden
                    >
                      {o.n}
                    </span>
                    <span>
                      <strong>{o.name}</strong>
                      <span className="block text-xs text-ink-soft">{describeLimits(o)}</span>
                    </span>
                  </li>
                ))}
              </ol>
            )}
          </Card>
          {(site?.tide && site.tide.source !== 'none') || c.currentStation || c.current.some((v) => v !== null) ? (
            <Card className="flex flex-col gap-3" data-testid="conditions-tide-current">
              <h2 className="text-lg font-bold">Tide and current</h2>
              {site?.tide && site.tide.source !== 'none' ? (
                <TideStrip
                  projectId={projectId}
                  site={site}
                  fromMs={Date.parse(c.times[0])}
                  toMs={Date.parse(c.times[c.times.length - 1])}
                />
              ) : null}
              <CurrentStrip conditions={c} zone={zone} />
            </Card>
          ) : null}
          <Card>
            <Suspense fallback={<Spinner label="Drawing the charts" />}>
              <ConditionsCharts conditions={c} operations={chartOps} nowMs={nowMs} />
            </Suspense>
            <p className="mt-3 text-right text-xs text-ink-soft">A gridline at each midnight at the worksite.</p>
          </Card>
          <Card className="text-sm">
            <h2 className="font-bold">How the sea was brought to the worksite</h2>
            <p className="mt-1 text-ink-soft">
              Hs at the data point, refracted and shoaled to {site ? fmt(site.depth, 1, 'm') : 'the worksite depth'} with linear wave theory
              at Tp, then capped at γb × d.
            </p>
            <ul className="mt-2 flex flex-wrap gap-2 text-xs" data-testid="conditions-flags">
              <FlagCount n={flagCounts.depth} text="depth-limited (Hs capped)" />
              <FlagCount n={flagCounts.landward} text="sea from the landward side (shoaling only)" />
              <FlagCount n={flagCounts.skipped} text="refraction skipped" />
              <FlagCount n={flagCounts.table} text="from the transfer table" />
              <FlagCount n={flagCounts.missing} text="missing input" />
            </ul>
            <p className="mt-3 rounded-lg bg-surface-2 px-3 py-2 text-ink" data-testid="transformation-caution">
              <strong>Caution:</strong> {TRANSFORMATION_CAUTION}
            </p>
          </Card>
        </div>
      ) : null}
    </div>
  );
}

function FlagCount({ n, text }: { n: number; text: string }) {
  return (
    <li className={`rounded-full border border-line px-3 py-1 ${n > 0 ? 'bg-surface-2 font-semibold' : 'text-ink-soft'}`}>
      {n} h {text}
    </li>
  );
}

/** The limits of an operation in one line, units included. */
function describeLimits(o: ChartOperation): string {
  const parts: string[] = [];
  if (o.hsMax !== null) parts.push(`Hs ≤ ${fmt(o.hsMax, 2, 'm')} (OPWF ${fmt(o.hsMaxForecast, 2, 'm')})`);
  if (o.hasCurve) parts.push('Hs-Tp curve');
  if (o.tpMin !== null) parts.push(`Tp ≥ ${fmt(o.tpMin, 1, 's')}`);
  if (o.tpMax !== null) parts.push(`Tp ≤ ${fmt(o.tpMax, 1, 's')}`);
  for (const [a, b] of o.tpExcluded) parts.push(`Tp not ${a}–${b} s`);
  if (o.bedVelocityMax !== null)
    parts.push(`bed velocity ≤ ${fmt(o.bedVelocityMax, 2, 'm/s')} (${o.bedVelocityMethod === 'soulsby' ? 'Soulsby' : 'linear'})`);
  if (o.windMax !== null) parts.push(`wind ≤ ${fmt(o.windMax, 1, 'm/s')}`);
  if (o.currentMax != null) parts.push(`current ≤ ${fmt(o.currentMax, 2, 'm/s')}`);
  for (const l of o.responses?.limits ?? []) parts.push(responseLimitWords(l));
  return parts.join(' · ') || 'no limits drawn here';
}
