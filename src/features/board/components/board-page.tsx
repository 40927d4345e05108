// `/projects/:projectId/board`: the watch board. For the latest forecast, one row per operation
// and worksite, an hour per column in the worksite's time zone, the status of each hour in colour,
// letter and pattern, usable windows outlined, and the start of each row in words. Any hour opens
// the chain behind it. Every member reads; coordinators and admins may fetch a new forecast.
import { useCallback, useEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import { Link, useParams, useSearchParams } from 'react-router-dom';
import type { PlanAnswer } from '../../../../shared/api-types-plan';
import { Button, Card, ErrorNotice, Notice, PageHeader, Spinner } from '../../../components/ui';
import { usePageZone } from '../../../components/page-zone';
import { localTimeZone, worksiteZoneStatement } from '../../../../shared/dates';
import { FetchForecastButton } from '../../../components/fetch-forecast-button';
import { useFetchForecast } from '../../../api/forecasts';
import { usePlan } from '../api/get-plan';
import { useViewer } from '../api/get-viewer';
import { BoardControls, HOUR_WIDTH_PX, type BoardFilters, type HourWidth } from './board-controls';
import { formatIn, relativeTime } from './board-format';
import { BoardGrid, type SelectedHour } from './board-grid';
import { BoardLegend } from './board-legend';
import { recordAt, startWords, visibleRange } from './board-model';
import { ChainPanel } from './chain-panel';
import { TideStrip } from './tide-strip';
import { useSites } from '../../../api/sites';

/** A forecast older than this is called out (common practice: forecasts are issued 2-4 times a day). */
const STALE_FORECAST_MS = 24 * 3_600_000;

/** Wide hours (letters, bigger targets) on touch screens and narrow windows; narrow ones on a laptop. */
function defaultWidth(): HourWidth {
  if (typeof window === 'undefined' || !window.matchMedia) return 'wide';
  return window.matchMedia('(min-width: 1024px) and (pointer: fine)').matches ? 'narrow' : 'wide';
}

/** The server's clock, carried forward by the client's: "now" as the plan was computed, then ticking. */
function useBoardNow(generatedAt: string | undefined, receivedAtMs: number): number {
  const [tick, setTick] = useState(() => Date.now());
  useEffect(() => {
    const id = window.setInterval(() => setTick(Date.now()), 60_000);
    return () => window.clearInterval(id);
  }, []);
  if (!generatedAt) return tick;
  return Date.parse(generatedAt) + Math.max(0, tick - receivedAtMs);
}

function useFilters(isSkipper: boolean): [BoardFilters, (patch: Partial<BoardFilters>) => void] {
  const [params, setParams] = useSearchParams();
  const [initialWidth] = useState(defaultWidth);
  const daysParam = params.get('days');
  const filters: BoardFilters = {
    siteId: params.get('site') ?? '',
    operationId: params.get('op') ?? '',
    mine: params.has('mine') ? params.get('mine') === '1' : isSkipper,
    alpha: params.get('alpha') !== 'off',
    days: daysParam === 'all' ? null : [2, 5, 7].includes(Number(daysParam)) ? Number(daysParam) : 7,
    width: params.get('width') === 'wide' || params.get('width') === 'narrow' ? (params.get('width') as HourWidth) : initialWidth,
  };
  const update = (patch: Partial<BoardFilters>) => {
    setParams(
      (prev) => {
        const next = new URLSearchParams(prev);
        const set = (key: string, value: string | null) => (value === null || value === '' ? next.delete(key) : next.set(key, value));
        if ('siteId' in patch) set('site', patch.siteId ?? '');
        if ('operationId' in patch) set('op', patch.operationId ?? '');
        if ('mine' in patch) set('mine', patch.mine ? '1' : '0');
        if ('alpha' in patch) set('alpha', patch.alpha ? null : 'off');
        if ('days' in patch) set('days', patch.days === null ? 'all' : String(patch.days));
        if ('width' in patch) set('width', patch.width ?? null);
        return next;
      },
      { replace: true },
    );
  };
  return [filters, update];
}

/**
 * A link such as `board?op=<id>&site=<id>&hour=<ISO instant>` (the skipper's cards on the
 * Overview) opens the chain behind the record holding that instant, once, when the plan arrives.
 */
function useChainLink(answer: PlanAnswer | undefined, filters: BoardFilters, select: (hour: SelectedHour) => void) {
  const [params] = useSearchParams();
  const hour = params.get('hour');
  const opened = useRef(false);
  useEffect(() => {
    if (opened.current || !answer || !hour || !filters.operationId || !filters.siteId) return;
    opened.current = true;
    const plan = answer.plans.find((p) => p.operationId === filters.operationId && p.siteId === filters.siteId);
    if (!plan) return;
    const index = recordAt(plan.times.map(Date.parse), Date.parse(hour), 3_600_000);
    if (index >= 0) select({ operationId: plan.operationId, siteId: plan.siteId, index });
  }, [answer, hour, filters.operationId, filters.siteId, select]);
}

export function BoardPage() {
  const { projectId = '' } = useParams();
  const viewer = useViewer(projectId);
  const [filters, setFilters] = useFilters(viewer.isSkipper);
  const plan = usePlan({ projectId, alpha: filters.alpha });
  const fetchForecast = useFetchForecast(projectId);
  const nowMs = useBoardNow(plan.data?.generatedAt, plan.dataUpdatedAt);
  const [selected, setSelected] = useState<SelectedHour | null>(null);
  // Closing the chain gives the focus back to the hour it belongs to (WCAG 2.4.3), not to the page's start.
  const closePanel = useCallback(() => {
    document.querySelector<HTMLElement>('[aria-controls="hour-chain"]')?.focus({ preventScroll: true });
    setSelected(null);
  }, []);
  useChainLink(plan.data, filters, setSelected);

  const fetchButton = viewer.canFetchForecast ? <FetchForecastButton fetchForecast={fetchForecast} /> : null;

  return (
    <div>
      <PageHeader
        title="Watch board"
        subtitle="When each operation may start at each worksite, hour by hour, on the latest forecast."
        actions={plan.data?.dataset ? fetchButton : null}
      />
      <div className="mb-4 flex flex-col gap-3 empty:hidden">
        {fetchForecast.error ? <ErrorNotice error={fetchForecast.error} /> : null}
        {fetchForecast.data ? (
          <Notice tone="success">
            {fetchForecast.data.isNew
              ? `New forecast stored: ${fetchForecast.data.records} hourly records. The board below is planned on it; within a minute the planning job compares it with the last plan and e-mails the changes to those subscribed.`
              : 'The forecast service has nothing newer than the forecast already on the board.'}
          </Notice>
        ) : null}
      </div>
      {plan.isPending || viewer.isPending ? <Spinner label="Planning on the latest forecast" /> : null}
      {plan.error ? <ErrorNotice error={plan.error} /> : viewer.error ? <ErrorNotice error={viewer.error} /> : null}
      {plan.data && !viewer.isPending ? (
        <BoardBody
          projectId={projectId}
          answer={plan.data}
          updating={plan.isPlaceholderData}
          nowMs={nowMs}
          filters={filters}
          setFilters={setFilters}
          userId={viewer.userId}
          canFetch={viewer.canFetchForecast}
          fetchButton={fetchButton}
          selected={selected}
          onSelect={setSelected}
          onClose={closePanel}
        />
      ) : null}
    </div>
  );
}

interface BoardBodyProps {
  projectId: string;
  answer: PlanAnswer;
  updating: boolean;
  nowMs: number;
  filters: BoardFilters;
  setFilters: (patch: Partial<BoardFilters>) => void;
  userId: string | null;
  canFetch: boolean;
  fetchButton: ReactNode;
  selected: SelectedHour | null;
  onSelect: (hour: SelectedHour | null) => void;
  onClose: () => void;
}

function BoardBody({
  projectId,
  answer,
  updating,
  nowMs,
  filters,
  setFilters,
  userId,
  canFetch,
  fetchButton,
  selected,
  onSelect,
  onClose,
}: BoardBodyProps) {
  const dataset = answer.dataset;
  const stepMs = answer.stepMinutes * 60_000;
  const allPlans = answer.plans;
  const timesMs = useMemo(() => (allPlans[0]?.times ?? []).map((t) => Date.parse(t)), [allPlans]);
  const sites = useMemo(() => uniqueBy(allPlans.map((p) => ({ id: p.siteId, name: p.siteName }))), [allPlans]);
  const operations = useMemo(() => uniqueBy(allPlans.map((p) => ({ id: p.operationId, name: p.operationName }))), [allPlans]);
  const hasOwn = userId !== null && allPlans.some((p) => p.skipperIds.includes(userId));
  const plans = allPlans.filter(
    (p) =>
      (!filters.siteId || p.siteId === filters.siteId) &&
      (!filters.operationId || p.operationId === filters.operationId) &&
      (!filters.mine || (userId !== null && p.skipperIds.includes(userId))),
  );
  const range = useMemo(() => visibleRange(timesMs, stepMs, nowMs, filters.days), [timesMs, stepMs, nowMs, filters.days]);
  const zone = plans[0]?.timeZone ?? allPlans[0]?.timeZone ?? 'UTC';
  // The page's one zone statement (shown by the layout): every worksite on the board, by zone.
  const zoneSites = useMemo(() => uniqueBy(allPlans.map((p) => ({ id: p.siteId, name: p.siteName, timeZone: p.timeZone }))), [allPlans]);
  usePageZone(dataset ? worksiteZoneStatement(zoneSites, localTimeZone(), timesMs[0] ?? nowMs).statement : null);

  const selectedPlan = selected ? plans.find((p) => p.operationId === selected.operationId && p.siteId === selected.siteId) : undefined;

  if (!dataset) {
    return (
      <Card>
        <h2 className="text-lg font-bold">No forecast yet</h2>
        <p className="mt-1 text-sm text-ink-soft">
          The board plans every operation on the project’s latest forecast, and there is none yet.{' '}
          {canFetch ? (
            <>
              Fetch one from the forecast service, or import a forecast file under{' '}
              <Link className="font-semibold text-accent underline" to={`/projects/${projectId}/sea-data`}>
                Sea data
              </Link>
              .
            </>
          ) : (
            'The marine coordinator fetches forecasts; the board fills in as soon as one arrives.'
          )}
        </p>
        {canFetch ? <div className="mt-3 flex flex-wrap gap-2">{fetchButton}</div> : null}
      </Card>
    );
  }

  const issuedMs = dataset.issuedAt ? Date.parse(dataset.issuedAt) : Date.parse(dataset.start);
  const lastMs = Date.parse(dataset.end);
  const stale = nowMs - issuedMs > STALE_FORECAST_MS;

  return (
    <div className="flex flex-col gap-4">
      <NextStarts plans={plans} nowMs={nowMs} />
      <Card className="flex flex-col gap-4">
        <div className="flex flex-wrap items-baseline gap-x-3 gap-y-1" data-testid="forecast-info">
          <h2 className="text-base font-bold">{dataset.name}</h2>
          <p className="text-sm text-ink-soft">
            Issued <strong className="text-ink">{formatIn(issuedMs, zone)}</strong> ({relativeTime(issuedMs, nowMs)}) · last hour{' '}
            {formatIn(lastMs, zone)}
          </p>
          {updating ? (
            <span className="text-xs text-ink-soft" role="status">
              Updating…
            </span>
          ) : null}
        </div>
        <BoardControls filters={filters} onChange={setFilters} sites={sites} operations={operations} hasOwnOperations={hasOwn} />
        <AlphaNote alpha={filters.alpha} />
      </Card>

      {range.ended ? (
        <Notice tone="error">
          This forecast ended {relativeTime(lastMs, nowMs)}; the board shows it whole for reference only.{' '}
          {canFetch ? 'Fetch the latest forecast to plan ahead.' : 'Ask the marine coordinator for a new forecast.'}
        </Notice>
      ) : stale ? (
        <Notice tone="info">This forecast was issued more than a day ago; a newer issue may change the windows.</Notice>
      ) : null}

      {allPlans.length === 0 ? (
        <Card>
          <h2 className="text-lg font-bold">No operations yet</h2>
          <p className="mt-1 text-sm text-ink-soft">
            The board shows one row per operation and worksite.{' '}
            {canFetch
              ? 'Add worksites and operations with their limits first.'
              : 'The marine coordinator has not set up any operations in this project yet.'}
          </p>
          {canFetch ? (
            <Link
              className="mt-3 inline-flex min-h-11 items-center rounded-lg bg-accent px-4 text-sm font-semibold text-accent-ink"
              to={`/projects/${projectId}/setup`}
            >
              Set up worksites and limits
            </Link>
          ) : null}
        </Card>
      ) : plans.length === 0 ? (
        <Card>
          <h2 className="text-lg font-bold">No rows match these filters</h2>
          <p className="mt-1 text-sm text-ink-soft">
            {filters.mine && !hasOwn ? 'No operation names you as its skipper. ' : ''}Clear the filters to see every operation at every
            worksite.
          </p>
          <Button className="mt-3" variant="secondary" onClick={() => setFilters({ siteId: '', operationId: '', mine: false })}>
            Show every operation
          </Button>
        </Card>
      ) : (
        <>
          <BoardLegend alpha={filters.alpha} />
          <BoardGrid
            projectId={projectId}
            plans={plans}
            timesMs={timesMs}
            stepMs={stepMs}
            range={range}
            nowMs={nowMs}
            alpha={filters.alpha}
            cellPx={HOUR_WIDTH_PX[filters.width]}
            selected={selectedPlan ? selected : null}
            onSelect={onSelect}
          />
          <TideStrips
            projectId={projectId}
            siteIds={[...new Set(plans.map((p) => p.siteId))]}
            fromMs={timesMs[range.from]}
            toMs={timesMs[Math.max(range.from, range.to - 1)]}
          />
          <p className="text-xs text-ink-soft">
            {plans.length} of {allPlans.length} rows · {range.to - range.from} hours shown of {timesMs.length} in the forecast · each hour
            stands for the hour that starts at its label.
          </p>
        </>
      )}

      {selected && selectedPlan ? (
        <ChainPanel
          projectId={projectId}
          plan={selectedPlan}
          index={selected.index}
          timeMs={timesMs[selected.index]}
          alpha={filters.alpha}
          datasetId={dataset.id}
          canStepBack={selected.index > 0}
          canStepOn={selected.index < timesMs.length - 1}
          onStep={(d) => onSelect({ ...selected, index: Math.min(timesMs.length - 1, Math.max(0, selected.index + d)) })}
          onClose={onClose}
        />
      ) : null}
    </div>
  );
}

/** The tide of each worksite shown that has one, under the board, over the hours shown. */
function TideStrips({ projectId, siteIds, fromMs, toMs }: { projectId: string; siteIds: string[]; fromMs: number; toMs: number }) {
  const sites = useSites(projectId).data ?? [];
  const tidal = sites.filter((s) => siteIds.includes(s.id) && s.tide && s.tide.source !== 'none');
  if (tidal.length === 0 || !Number.isFinite(fromMs) || !Number.isFinite(toMs) || !(toMs > fromMs)) return null;
  return (
    <div className="flex flex-col gap-2">
      {tidal.map((s) => (
        <TideStrip key={s.id} projectId={projectId} site={s} fromMs={fromMs} toMs={toMs} />
      ))}
    </div>
  );
}

/**
 * Phones: the board's first answer, the next start of each operation at each worksite, before the
 * forecast details and the controls (wider screens read it at the start of each row of the grid).
 */
function NextStarts({ plans, nowMs }: { plans: PlanAnswer['plans']; nowMs: number }) {
  if (plans.length === 0) return null;
  return (
    <section
      className="rounded-[var(--radius-card)] border border-line bg-surface p-3 sm:hidden"
      aria-labelledby="next-starts-title"
      data-testid="next-starts"
    >
      <h2 id="next-starts-title" className="text-base font-bold">
        Next starts
      </h2>
      <ul className="mt-1 flex flex-col divide-y divide-line">
        {plans.slice(0, 8).map((p) => {
          const w = startWords(p, nowMs);
          return (
            <li key={`${p.operationId}-${p.siteId}`} className="py-1.5 text-sm">
              <span className="font-semibold">{p.operationName}</span> <span className="text-ink-soft">at {p.siteName}</span>
              <span
                className={`block ${w.tone === 'now' ? 'font-semibold text-accent' : w.tone === 'none' ? 'text-ink-soft' : 'text-ink'}`}
              >
                {w.text}
              </span>
              {w.finish ? <span className="block text-xs text-ink-soft">{w.finish}</span> : null}
            </li>
          );
        })}
      </ul>
      {plans.length > 8 ? <p className="mt-1 text-xs text-ink-soft">{plans.length - 8} more below in the board.</p> : null}
    </section>
  );
}

/** The caution for forecast planning, in words, for the state of the alpha switch. */
function AlphaNote({ alpha }: { alpha: boolean }) {
  return alpha ? (
    <p className="rounded-lg bg-surface-2 px-3 py-2 text-sm" data-testid="alpha-note">
      <strong>Forecast limits on.</strong> A forecast is uncertain, so the Hs limits of weather-restricted operations are cut to the
      forecast limit <strong>OPWF = α × OPLIM</strong> (α from the project’s alpha table by TPOP and Hs limit); other limits stay at OPLIM.
      Hours that meet OPLIM but not OPWF are marginal, not workable.
    </p>
  ) : (
    <p className="rounded-lg border border-danger bg-danger-soft px-3 py-2 text-sm" data-testid="alpha-note">
      <strong>Forecast limits off: planning on OPLIM.</strong> Every hour is tested at the operation limits with no allowance for forecast
      uncertainty. Weather-restricted operations planned on a forecast should use OPWF = α × OPLIM on Hs: switch forecast limits back on
      before committing to a window.
    </p>
  );
}

function uniqueBy<T extends { id: string; name: string }>(items: T[]): T[] {
  const seen = new Map<string, T>();
  for (const it of items) if (!seen.has(it.id)) seen.set(it.id, it);
  return [...seen.values()].sort((a, b) => a.name.localeCompare(b.name));
}
