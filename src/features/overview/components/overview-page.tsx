// The project's first page: today's picture for the person looking at it. Everyone gets one plain
// line per operation and worksite and the map; skippers their own operations as cards first;
// coordinators what waits for them; clients this month's downtime against the expectation.
import { Link, useParams } from 'react-router-dom';
import type { ProjectDetail } from '../../../../shared/api-types';
import type { OverviewAnswer, OverviewLine } from '../../../../shared/api-types-overview';
import { formatDay, formatInstant, formatMonth, zoneStatement } from '../../../../shared/dates';
import { finishSpan } from '../../../../shared/status-words';
import { useProjectAccess } from '../../../api/projects';
import { Card, ErrorNotice, Notice, Spinner } from '../../../components/ui';
import { formatPosition } from '../../../lib/format';
import { useOverview } from '../api/get-overview';
import { HourStrip, statusWord } from './hour-strip';
import { changeCountWords, forecastAgeWords, hoursWords, plainLine, goStartWords, startWords } from './plain-line';
import { OverviewMap } from './overview-map';
import { SetupCard } from './setup-card';

/** Hours of a month as plain hours ("212.5 h"), so P50, P90 and the confirmed hours read on one scale. */
const plainHours = (h: number) => `${Math.round(h * 10) / 10} h`;
/** A month's expected lost hours (P50, P90 over the hindcast years): whole hours, tenths would be false precision. */
const wholeHours = (h: number) => `${Math.round(h)} h`;

/** The hour now in words; a workable hour that cannot start the operation says why. */
function nowWords(l: OverviewLine): string {
  const s = l.next.status[0];
  return s === 'workable' ? `workable, but not for TR = ${hoursWords(l.tr)} from now` : statusWord(s);
}

const lineKey = (l: OverviewLine) => `${l.operationId}|${l.siteId}`;

/** One zone for the page when every worksite shares it, else null (each line in its worksite's zone). */
function pageZone(lines: OverviewLine[]): string | null {
  const zones = new Set(lines.map((l) => l.timeZone));
  return zones.size === 1 ? [...zones][0] : null;
}

export function ProjectOverviewPage() {
  const { projectId = '' } = useParams();
  const access = useProjectAccess(projectId);
  const overview = useOverview(projectId);
  if (access.isPending || overview.isPending) return <Spinner />;
  if (access.error) return <ErrorNotice error={access.error} />;
  if (overview.error) return <ErrorNotice error={overview.error} />;
  const project = access.data!;
  const o = overview.data;
  const nowMs = Date.parse(o.generatedAt);
  const zone = pageZone(o.lines);
  const role = o.role;
  const mine = o.lines.filter((l) => l.mine);

  return (
    <div className="grid min-w-0 gap-4" data-testid="overview">
      {o.coordinator ? <SetupCard projectId={projectId} setup={o.coordinator.setup} /> : null}
      <ForecastCard projectId={projectId} o={o} nowMs={nowMs} zone={zone} />
      {role === 'skipper' ? <MyOperations projectId={projectId} lines={mine} forecastEnd={o.forecast?.end ?? null} nowMs={nowMs} /> : null}
      {o.coordinator ? <CoordinatorCard projectId={projectId} c={o.coordinator} /> : null}
      {o.month && o.lines.length > 0 && role === 'client' ? <MonthCard month={o.month} /> : null}
      <LinesCard o={o} nowMs={nowMs} />
      {o.month && o.lines.length > 0 && role !== 'client' ? <MonthCard month={o.month} /> : null}
      <OverviewMap project={project} waveDirection={o.dataPointNow?.dir ?? null} canEdit={access.canEdit} />
      <AboutCard project={project} o={o} />
    </div>
  );
}

function AboutCard({ project: p, o }: { project: ProjectDetail; o: OverviewAnswer }) {
  return (
    <div className="grid gap-4 lg:grid-cols-2">
      <Card>
        <h2 className="mb-2 text-lg font-bold">About this project</h2>
        <p className="text-sm whitespace-pre-line text-ink-soft">{p.description || 'No description.'}</p>
      </Card>
      <Card>
        <h2 className="mb-2 text-lg font-bold">Offshore data point</h2>
        <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
          <dt className="text-ink-soft">Name</dt>
          <dd>{p.dataPointName || 'Not set'}</dd>
          <dt className="text-ink-soft">Position</dt>
          <dd>
            {p.dataPointLatitude !== null && p.dataPointLongitude !== null
              ? formatPosition(p.dataPointLatitude, p.dataPointLongitude)
              : 'Not set'}
          </dd>
          <dt className="text-ink-soft">Water depth</dt>
          <dd>{p.dataPointDepthM === null ? 'Deep water' : `${p.dataPointDepthM} m`}</dd>
          <dt className="text-ink-soft">Forecasts</dt>
          <dd>{p.forecastSource === 'service' ? 'Fetched from the forecast service' : 'Uploaded files only'}</dd>
          {o.dataPointNow ? (
            <>
              <dt className="text-ink-soft">Now</dt>
              <dd data-testid="data-point-now">
                Hs {o.dataPointNow.hs ?? '–'} m, Tp {o.dataPointNow.tp ?? '–'} s, waves from{' '}
                {o.dataPointNow.dir === null ? '–' : `${Math.round(o.dataPointNow.dir)}°`}
              </dd>
            </>
          ) : null}
        </dl>
      </Card>
    </div>
  );
}

function ForecastCard({ projectId, o, nowMs, zone }: { projectId: string; o: OverviewAnswer; nowMs: number; zone: string | null }) {
  const z = zone ?? 'UTC';
  return (
    <Card aria-labelledby="overview-forecast-title">
      <h2 id="overview-forecast-title" className="text-lg font-bold">
        Today’s picture
      </h2>
      {o.forecast ? (
        <p className="mt-1 text-sm" data-testid="forecast-age">
          {forecastAgeWords(o.forecast.issuedAt, z, nowMs)}; it runs to {formatInstant(o.forecast.end, z, 'dateTime')}.
        </p>
      ) : (
        <p className="mt-1 text-sm" data-testid="forecast-age">
          No forecast yet: nothing to plan on.
        </p>
      )}
      <p className="mt-1 text-xs text-ink-soft">
        {zone ? zoneStatement(zone, 'the worksites’ local time', nowMs) : 'Times are in each worksite’s own zone.'}
      </p>
      <div className="mt-3 text-sm" data-testid="plan-changes">
        {o.lastPlan ? (
          o.lastPlan.changes.length > 0 ? (
            <>
              <p className="font-semibold">Changed at the last planning run ({formatInstant(o.lastPlan.at, z, 'dateTime')}):</p>
              <ul className="mt-1 list-disc pl-5">
                {o.lastPlan.changes.map((c) => (
                  <li key={`${c.operationId}|${c.siteId}`} className="break-words">
                    <span className="font-semibold">{c.operationName}</span>
                    {c.siteName ? (
                      <>
                        {' '}
                        at <span className="font-semibold">{c.siteName}</span>
                      </>
                    ) : null}
                    : {changeCountWords(c)}
                  </li>
                ))}
              </ul>
              <p className="mt-1">
                <Link className="font-semibold text-accent underline" to={`/projects/${projectId}/alerts`}>
                  Each change with its times
                </Link>{' '}
                is on the Alerts page.
              </p>
            </>
          ) : (
            <p>Nothing changed at the last planning run ({formatInstant(o.lastPlan.at, z, 'dateTime')}).</p>
          )
        ) : (
          <p className="text-ink-soft">No planning run yet: changes appear here after the next one.</p>
        )}
      </div>
      {o.failedPlan ? (
        <div className="mt-3" data-testid="plan-failed">
          <Notice tone="error">
            <span className="font-semibold">The planning run of {formatInstant(o.failedPlan.at, z, 'dateTime')} failed</span>
            {o.failedPlan.error ? `: ${o.failedPlan.error.replace(/[.\s]+$/, '')}` : ''}.{' '}
            {o.lastPlan
              ? `Alerts and e-mails are still those of the last good run (${formatInstant(o.lastPlan.at, z, 'dateTime')}).`
              : 'No alerts have gone out yet.'}{' '}
            The next planning tick tries again; a coordinator can also re-plan now on the Alerts page.
          </Notice>
        </div>
      ) : null}
    </Card>
  );
}

function LinesCard({ o, nowMs }: { o: OverviewAnswer; nowMs: number }) {
  return (
    <Card aria-labelledby="overview-lines-title">
      <h2 id="overview-lines-title" className="mb-2 text-lg font-bold">
        Every operation
      </h2>
      {o.lines.length === 0 ? <p className="text-sm text-ink-soft">No operations at any worksite yet.</p> : null}
      <ul className="grid gap-2">
        {o.lines.map((l) => (
          <li
            key={lineKey(l)}
            data-testid="overview-line"
            data-operation-id={l.operationId}
            data-site-id={l.siteId}
            data-earliest-start={l.earliestStart ?? ''}
            className="min-w-0 border-b border-line pb-2 last:border-0"
          >
            <p className="text-sm font-semibold break-words">
              {l.operationName} <span className="font-normal text-ink-soft">at</span> {l.siteName}
            </p>
            <p className="text-sm break-words" data-testid="plain-line">
              {plainLine(l, nowMs, o.forecast?.end ?? null)}
            </p>
          </li>
        ))}
      </ul>
    </Card>
  );
}

/** The skipper's own operations as cards: now, the next go-start, the window, the next 48 h. */
function MyOperations({
  projectId,
  lines,
  forecastEnd,
  nowMs,
}: {
  projectId: string;
  lines: OverviewLine[];
  forecastEnd: string | null;
  nowMs: number;
}) {
  return (
    <section aria-labelledby="my-operations-title" className="min-w-0">
      <h2 id="my-operations-title" className="mb-2 text-lg font-bold">
        My operations
      </h2>
      {lines.length === 0 ? (
        <p className="text-sm text-ink-soft">
          You are not named skipper on any operation of this project; every operation is listed below.
        </p>
      ) : null}
      <ul className="grid gap-3 sm:grid-cols-2">
        {lines.map((l) => (
          <li
            key={lineKey(l)}
            className="min-w-0"
            data-testid="my-operation-card"
            data-operation-id={l.operationId}
            data-site-id={l.siteId}
          >
            <Card className="grid gap-2">
              <h3 className="font-bold break-words">
                {l.operationName} <span className="font-normal text-ink-soft">at</span> {l.siteName}
              </h3>
              <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-sm">
                <dt className="text-ink-soft">Now</dt>
                <dd data-testid="card-now">{l.informationOnly ? 'for information only' : l.startNow ? 'may start now' : nowWords(l)}</dd>
                <dt className="text-ink-soft">Next go-start</dt>
                <dd className="break-words" data-testid="card-next">
                  {goStartWords(l, nowMs, forecastEnd)}
                </dd>
                {l.earliestStart && !l.informationOnly ? (
                  <>
                    <dt className="text-ink-soft">Planned finish</dt>
                    <dd className="break-words" data-testid="card-finish">
                      {finishSpan(Date.parse(l.earliestStart), l.tpop, l.tr, (ms) => startWords(ms, l.timeZone, nowMs))}
                    </dd>
                  </>
                ) : null}
                <dt className="text-ink-soft">Window</dt>
                <dd data-testid="card-window">
                  {l.windowHours !== null ? hoursWords(l.windowHours) : '–'} (TR {hoursWords(l.tr)})
                </dd>
              </dl>
              <HourStrip times={l.next.times} status={l.next.status} timeZone={l.timeZone} />
              <Link
                className="inline-flex min-h-11 items-center text-sm font-semibold text-accent underline"
                to={`/projects/${projectId}/board?op=${l.operationId}&site=${l.siteId}${l.next.times[0] ? `&hour=${encodeURIComponent(l.next.times[0])}` : ''}`}
              >
                Hour by hour, with the chain behind each hour
              </Link>
            </Card>
          </li>
        ))}
      </ul>
    </section>
  );
}

function CoordinatorCard({ projectId, c }: { projectId: string; c: NonNullable<OverviewAnswer['coordinator']> }) {
  const link = 'font-semibold text-accent underline';
  return (
    <Card aria-labelledby="overview-attention-title" data-testid="coordinator-attention">
      <h2 id="overview-attention-title" className="mb-2 text-lg font-bold">
        Waiting for you
      </h2>
      <ul className="grid gap-1 text-sm">
        <li data-testid="ledger-waiting">
          {c.ledgerDaysWaiting === 0 ? (
            'No ledger days waiting for confirmation.'
          ) : (
            <>
              {c.ledgerDaysWaiting} ledger day{c.ledgerDaysWaiting === 1 ? '' : 's'} waiting for confirmation
              {c.oldestWaitingDay ? `, the oldest ${formatDay(c.oldestWaitingDay, 'day')}` : ''}:{' '}
              <Link className={link} to={`/projects/${projectId}/downtime`}>
                confirm on the Downtime page
              </Link>
              .
            </>
          )}
        </li>
        <li data-testid="failed-emails">
          {c.failedEmails === 0 ? (
            'No failed alert e-mails.'
          ) : (
            <>
              {c.failedEmails} alert e-mail{c.failedEmails === 1 ? '' : 's'} failed:{' '}
              <Link className={link} to={`/projects/${projectId}/alerts`}>
                see the Alerts page
              </Link>
              .
            </>
          )}
        </li>
        <li data-testid="dataset-warnings">
          {c.datasetsWithWarnings.length === 0 ? (
            'No dataset warnings.'
          ) : (
            <>
              Datasets with warnings:
              <ul className="list-disc pl-5">
                {c.datasetsWithWarnings.map((d) => (
                  <li key={d.id} className="break-words">
                    <Link className={link} to={`/projects/${projectId}/sea-data/${d.id}`}>
                      {d.name}
                    </Link>
                    : {d.warnings.join('; ')}
                  </li>
                ))}
              </ul>
            </>
          )}
        </li>
      </ul>
    </Card>
  );
}

/** This month's confirmed downtime against the hindcast's P50/P90 for the whole month. */
function MonthCard({ month }: { month: NonNullable<OverviewAnswer['month']> }) {
  const name = month.rows[0] ? `in ${formatMonth(month.rows[0].month)}` : 'this month';
  return (
    <Card aria-labelledby="overview-month-title" data-testid="month-card">
      <h2 id="overview-month-title" className="mb-1 text-lg font-bold">
        Downtime {name}
      </h2>
      <p className="mb-3 text-sm text-ink-soft">
        Confirmed lost hours so far against the expectation for the whole month
        {month.hindcast ? ` from ${month.hindcast.name}` : ''}: P50 is exceeded in half of the hindcast years, P90 in one year in ten.
      </p>
      {!month.hindcast ? <p className="mb-2 text-sm">No hindcast in this project: no expectation to compare with.</p> : null}
      <ul className="grid gap-3">
        {month.rows.map((r) => {
          const top = Math.max(r.expectedP90Hours ?? 0, r.confirmedLostHours, 1);
          const pct = (h: number) => `${Math.min(100, (h / top) * 100)}%`;
          const verdict =
            r.expectedP50Hours === null
              ? ''
              : r.expectedP90Hours !== null && r.confirmedLostHours > r.expectedP90Hours
                ? ' — already above P90'
                : r.confirmedLostHours > r.expectedP50Hours
                  ? ' — already above P50'
                  : ' — within P50 so far';
          return (
            <li key={`${r.operationId}|${r.siteId}`} className="min-w-0" data-testid="month-row">
              <p className="text-sm font-semibold break-words">
                {r.operationName} <span className="font-normal text-ink-soft">at</span> {r.siteName}
              </p>
              <p className="text-sm break-words" data-testid="month-words">
                {plainHours(r.confirmedLostHours)} lost on {r.confirmedDays} confirmed day{r.confirmedDays === 1 ? '' : 's'} of {r.daysOver}{' '}
                so far; expected for the month: P50 {r.expectedP50Hours === null ? '–' : wholeHours(r.expectedP50Hours)}, P90{' '}
                {r.expectedP90Hours === null ? '–' : wholeHours(r.expectedP90Hours)}
                {r.hindcastYears ? ` (${r.hindcastYears} years)` : ''}
                {verdict}.
              </p>
              {r.expectedP90Hours !== null ? (
                <div className="relative mt-1 h-3 w-full rounded bg-surface-2" aria-hidden>
                  <div className="absolute inset-y-0 left-0 rounded bg-accent" style={{ width: pct(r.confirmedLostHours) }} />
                  {r.expectedP50Hours !== null ? (
                    <div className="absolute inset-y-[-2px] w-0.5 bg-ink" style={{ left: pct(r.expectedP50Hours) }} title="P50" />
                  ) : null}
                  <div
                    className="absolute inset-y-[-2px] w-0.5 bg-danger"
                    style={{ left: `calc(${pct(r.expectedP90Hours)} - 2px)` }}
                    title="P90"
                  />
                </div>
              ) : null}
            </li>
          );
        })}
      </ul>
    </Card>
  );
}
