// The live campaign outlook: "as of today, with what is done and the forecast we have, when will
// we finish?" P10/P50/P90 of the finish and of the remaining waiting on weather, the forecast and
// hindcast-only parts side by side, each step's progress (coordinators mark it), and the drift of
// the P50/P90 finish over the planning runs as a chart with the planned finish. Prints with the page.
import { useState } from 'react';
import { TZDate } from '@date-fns/tz';
import type { CampaignOutlookAnswer, CampaignResponse, OutlookHistoryPoint } from '../../../../shared/api-types-downtime';
import type { OperationResponse, SiteResponse } from '../../../../shared/api-types-sites';
import { Button, Card, ErrorNotice, FieldShell, Input, Notice, SectionHeading, Select, Spinner } from '../../../components/ui';
import { DateEcho } from '../../../components/ui/date-echo';
import { useCampaigns } from '../api/get-campaigns';
import { useOutlook, useOutlookHistory } from '../api/get-outlook';
import { useSetStepProgress } from '../api/set-step-progress';
import { dateIn, hours } from './format';
import { HeadingRow } from '../../../components/ui/table';
import { dayTicks } from '../../../lib/local-midnights';

const th = 'bg-surface-2 px-2 py-2 text-left text-xs font-semibold text-ink-soft';
const td = 'px-2 py-1 whitespace-nowrap';
const DAY_MS = 86_400_000;

interface Props {
  projectId: string;
  canEdit: boolean;
  alpha: boolean;
  operations: OperationResponse[];
  sites: SiteResponse[];
  selectedId: string;
}

export function OutlookSection({ projectId, canEdit, alpha, operations, sites, selectedId }: Props) {
  const campaigns = useCampaigns(projectId);
  const list = campaigns.data ?? [];
  const selected = list.find((c) => c.id === selectedId) ?? list[0];
  const outlook = useOutlook(projectId, selected?.id ?? null, alpha);
  const history = useOutlookHistory(projectId, selected?.id ?? null);
  if (!selected) return null;
  const zone = selected.timeZone;
  const o = outlook.data;

  return (
    <Card className="flex flex-col gap-4" aria-labelledby="outlook-title" data-testid="outlook-section">
      <div>
        <SectionHeading id="outlook-title" title="Live outlook: when will we finish?" narrow>
          {selected.name}, as of now: the steps not yet done, in order, first on the latest forecast’s go-starts
          {o?.forecast?.ensemble
            ? ' (each run of its ensemble at OPLIM: the runs’ spread stands for its uncertainty)'
            : alpha
              ? ' (with α)'
              : ' (at OPLIM)'}
          , then each hindcast year from the same calendar time{alpha ? ' (with α)' : ' (at OPLIM)'}. Each forecast × hindcast year pair is
          one sample.
        </SectionHeading>
      </div>
      {outlook.error ? <ErrorNotice error={outlook.error} /> : null}
      {outlook.isPending ? <Spinner label="Working out the outlook" /> : null}
      {o ? <OutlookFigures o={o} zone={zone} stale={outlook.isFetching} /> : null}
      <StepsTable campaign={selected} outlook={o} zone={zone} operations={operations} sites={sites} />
      {canEdit ? <ProgressEditor projectId={projectId} campaign={selected} operations={operations} zone={zone} /> : null}
      <div className="flex flex-col gap-2">
        <h3 className="text-base font-bold">How the finish date moved</h3>
        {history.error ? <ErrorNotice error={history.error} /> : null}
        {history.data ? <DriftChart points={history.data} plannedFinish={selected.plannedFinish} zone={zone} /> : null}
      </div>
    </Card>
  );
}

function OutlookFigures({ o, zone, stale }: { o: CampaignOutlookAnswer; zone: string; stale: boolean }) {
  const d = (iso: string | null) => dateIn(iso, zone, 'EEE d MMM yyyy');
  const shiftDays = o.forecastShiftHours.p50 === null ? null : o.forecastShiftHours.p50 / 24;
  return (
    <div className={`flex flex-col gap-3 ${stale ? 'opacity-60' : ''}`}>
      {o.complete ? <Notice tone="success">Every step is done: the campaign finished on {d(o.finish.p50)}.</Notice> : null}
      <dl className="grid gap-3 sm:grid-cols-3" data-testid="outlook-dates">
        <Figure label="P10 finish" value={d(o.finish.p10)} />
        <Figure label="P50 finish" value={d(o.finish.p50)} strong testId="outlook-p50" />
        <Figure label="P90 finish" value={d(o.finish.p90)} testId="outlook-p90" />
        <Figure label="Remaining waiting on weather, P50" value={hours(o.remainingWowHours.p50, 0)} />
        <Figure label="Remaining waiting on weather, P90" value={hours(o.remainingWowHours.p90, 0)} />
        <Figure label="Samples" value={`${o.samples}${o.censored > 0 ? `, ${o.censored} censored (left out)` : ', none censored'}`} />
      </dl>
      {!o.complete ? (
        <div className="grid gap-3 sm:grid-cols-2" data-testid="outlook-parts">
          <div className="rounded-lg border border-line p-3 text-sm">
            <p className="font-semibold">With the forecast</p>
            {o.forecast ? (
              <p className="mt-1 text-ink-soft">
                Forecast issued {dateIn(o.forecast.issuedAt, zone, 'd MMM HH:mm')}, to {dateIn(o.forecast.end, zone, 'd MMM HH:mm')}:{' '}
                {o.forecast.finishedInForecast
                  ? 'the forecast alone finishes the work.'
                  : `${o.forecast.stepsStartedInForecast} of ${o.steps.length} remaining step${o.steps.length === 1 ? '' : 's'} start${o.forecast.stepsStartedInForecast === 1 ? 's' : ''} inside it; the hindcast years take over at its end.`}{' '}
                {o.forecast.ensemble
                  ? `The control and ${o.forecast.members - 1} ensemble members, each a sample per hindcast year, at the operation limits (no α).`
                  : 'One deterministic forecast.'}
              </p>
            ) : (
              <p className="mt-1 text-ink-soft">No forecast: the outlook is the hindcast years alone.</p>
            )}
            <p className="mt-1">
              P50 {d(o.finish.p50)}, P90 {d(o.finish.p90)}
            </p>
          </div>
          <div className="rounded-lg border border-line p-3 text-sm">
            <p className="font-semibold">Hindcast alone, from the same start</p>
            <p className="mt-1 text-ink-soft">
              {o.hindcast.name}: {o.hindcast.years} years, {o.hindcast.censored} censored.
            </p>
            <p className="mt-1">
              P50 {d(o.hindcast.finish.p50)}, P90 {d(o.hindcast.finish.p90)}
            </p>
            {o.forecast && shiftDays !== null ? (
              <p className="mt-1 font-semibold" data-testid="outlook-shift">
                {Math.abs(shiftDays) < 0.05
                  ? 'The forecast does not move the P50.'
                  : `The forecast moves the P50 ${Math.abs(shiftDays).toFixed(1)} days ${shiftDays > 0 ? 'later' : 'earlier'}.`}
              </p>
            ) : null}
          </div>
        </div>
      ) : null}
      <p className="text-xs text-ink-soft">
        As of {dateIn(o.asOf, zone, 'd MMM yyyy HH:mm')}; the remaining work starts {dateIn(o.startFrom, zone, 'd MMM yyyy HH:mm')}.
        P10/P50/P90 by linear interpolation between order statistics (type 7) over the samples that finish; a sample that reaches the end of
        the hindcast is censored.
      </p>
    </div>
  );
}

function Figure({ label, value, strong, testId }: { label: string; value: string; strong?: boolean; testId?: string }) {
  return (
    <div className="rounded-lg bg-surface-2 px-3 py-2">
      <dt className="text-xs text-ink-soft">{label}</dt>
      <dd className={strong ? 'text-xl font-bold' : 'text-base font-semibold'} data-testid={testId}>
        {value}
      </dd>
    </div>
  );
}

const STATUS_WORDS = { planned: 'Planned', started: 'Under way', done: 'Done' } as const;

function StepsTable({
  campaign,
  outlook,
  zone,
  operations,
  sites,
}: {
  campaign: CampaignResponse;
  outlook: CampaignOutlookAnswer | undefined;
  zone: string;
  operations: OperationResponse[];
  sites: SiteResponse[];
}) {
  const opName = new Map(operations.map((o) => [o.id, o.name]));
  const siteName = new Map(sites.map((s) => [s.id, s.name]));
  const forecastOf = new Map((outlook?.steps ?? []).map((s) => [s.index, s]));
  const t = (iso: string | null) => dateIn(iso, zone, 'd MMM HH:mm');
  return (
    <div className="overflow-x-auto rounded-lg border border-line">
      <table className="w-full min-w-[44rem] text-sm" data-testid="outlook-steps">
        <caption className="sr-only">Campaign steps: progress and the outlook of their starts</caption>
        <thead>
          <HeadingRow cellClassName={th} headings={['Step', 'Progress', 'Actual start', 'Actual end', 'P50 start', 'P90 start']} />
        </thead>
        <tbody>
          {campaign.steps.map((s, i) => {
            const p = campaign.progress[i];
            const f = forecastOf.get(i);
            return (
              <tr key={i} className="border-t border-line">
                <td className={td}>
                  {i + 1}. {opName.get(s.operationId) ?? 'Operation removed'}{' '}
                  <span className="text-ink-soft">at {siteName.get(s.siteId) ?? 'worksite removed'}</span>
                </td>
                <td className={td}>
                  {STATUS_WORDS[p?.status ?? 'planned']}
                  {p?.source === 'ledger' ? <span className="ml-1 text-xs text-ink-soft">(from the ledger)</span> : null}
                </td>
                <td className={td}>{t(p?.startedAt ?? null)}</td>
                <td className={td}>{t(p?.doneAt ?? null)}</td>
                <td className={td}>{f ? t(f.p50Start) : '–'}</td>
                <td className={td}>{f ? t(f.p90Start) : '–'}</td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}

/**
 * A `datetime-local` value read in `zone` (the zone the page states and shows the steps' times in,
 * not the browser's) as ISO UTC; '' stays empty.
 */
const localToIso = (v: string, zone: string) => {
  const m = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})/.exec(v);
  return m ? new Date(new TZDate(+m[1], +m[2] - 1, +m[3], +m[4], +m[5], zone).getTime()).toISOString() : '';
};

function ProgressEditor({
  projectId,
  campaign,
  operations,
  zone,
}: {
  projectId: string;
  campaign: CampaignResponse;
  operations: OperationResponse[];
  zone: string;
}) {
  const save = useSetStepProgress(projectId);
  const firstOpen = campaign.progress.findIndex((p) => p.status !== 'done');
  const [index, setIndex] = useState(firstOpen < 0 ? campaign.steps.length - 1 : firstOpen);
  const [status, setStatus] = useState<'planned' | 'started' | 'done'>(campaign.progress[index]?.status === 'started' ? 'done' : 'started');
  const [when, setWhen] = useState('');
  const opName = new Map(operations.map((o) => [o.id, o.name]));
  const submit = () => {
    const iso = localToIso(when, zone);
    const input =
      status === 'planned'
        ? { status }
        : status === 'started'
          ? { status, ...(iso ? { startedAt: iso } : {}) }
          : { status, ...(iso ? { doneAt: iso } : {}) };
    save.mutate({ campaignId: campaign.id, index, input }, { onSuccess: () => setWhen('') });
  };
  return (
    <form
      className="no-print flex flex-col gap-2 rounded-lg border border-line p-3"
      aria-label="Mark progress"
      onSubmit={(e) => {
        e.preventDefault();
        submit();
      }}
    >
      <p className="text-sm font-semibold">Mark progress (coordinators; every change is in the audit trail)</p>
      <div className="grid gap-3 sm:grid-cols-[1fr_10rem_14rem_auto] sm:items-end">
        <FieldShell label="Step" htmlFor="progress-step">
          <Select id="progress-step" value={index} onChange={(e) => setIndex(Number(e.target.value))}>
            {campaign.steps.map((s, i) => (
              <option key={i} value={i}>
                {i + 1}. {opName.get(s.operationId) ?? 'Operation removed'}
              </option>
            ))}
          </Select>
        </FieldShell>
        <FieldShell label="Now" htmlFor="progress-status">
          <Select id="progress-status" value={status} onChange={(e) => setStatus(e.target.value as typeof status)}>
            <option value="started">Under way</option>
            <option value="done">Done</option>
            <option value="planned">Back to planned</option>
          </Select>
        </FieldShell>
        <FieldShell
          label={status === 'done' ? 'Actual end' : status === 'started' ? 'Actual start' : 'Time'}
          htmlFor="progress-time"
          hint={status === 'done' ? 'Empty: from the confirmed ledger days.' : status === 'started' ? 'Empty: now.' : undefined}
        >
          <Input
            id="progress-time"
            type="datetime-local"
            value={when}
            onChange={(e) => setWhen(e.target.value)}
            disabled={status === 'planned'}
          />
          <DateEcho value={when} />
        </FieldShell>
        <Button type="submit" disabled={save.isPending}>
          {save.isPending ? 'Saving…' : 'Save'}
        </Button>
      </div>
      {save.error ? <ErrorNotice error={save.error} /> : null}
    </form>
  );
}

/**
 * The P50 finish line with its P50-P90 band over the planning runs, and the planned finish as a
 * dashed line; a table of the same points follows for screen readers and for paper.
 */
export function DriftChart({ points, plannedFinish, zone }: { points: OutlookHistoryPoint[]; plannedFinish: string | null; zone: string }) {
  const pts = points
    .filter((p) => p.p50 !== null)
    .map((p) => ({ at: Date.parse(p.at), p50: Date.parse(p.p50!), p90: p.p90 ? Date.parse(p.p90) : null, fc: p.forecastIssuedAt }));
  if (pts.length === 0) return <Notice>No outlook stored yet: each planning run adds one.</Notice>;
  const W = 720;
  const H = 260;
  const m = { l: 86, r: 16, t: 14, b: 34 };
  const planned = plannedFinish ? Date.parse(plannedFinish) : null;
  const x0 = pts[0].at;
  const x1 = Math.max(pts[pts.length - 1].at, x0 + DAY_MS);
  const ys = pts.flatMap((p) => (p.p90 === null ? [p.p50] : [p.p50, p.p90])).concat(planned === null ? [] : [planned]);
  const pad = Math.max(DAY_MS, (Math.max(...ys) - Math.min(...ys)) * 0.08);
  const y0 = Math.min(...ys) - pad;
  const y1 = Math.max(...ys) + pad;
  const X = (t: number) => m.l + ((t - x0) / (x1 - x0)) * (W - m.l - m.r);
  const Y = (t: number) => H - m.b - ((t - y0) / (y1 - y0)) * (H - m.t - m.b);
  const withP90 = pts.filter((p) => p.p90 !== null);
  const band =
    withP90.length > 0
      ? [...withP90.map((p) => `${X(p.at)},${Y(p.p90!)}`), ...[...withP90].reverse().map((p) => `${X(p.at)},${Y(p.p50)}`)].join(' ')
      : '';
  const label = (t: number) => dateIn(new Date(t).toISOString(), zone, 'd MMM');
  return (
    <div className="flex flex-col gap-2">
      <svg
        viewBox={`0 0 ${W} ${H}`}
        className="w-full max-w-3xl"
        role="img"
        aria-labelledby="drift-title"
        data-testid="outlook-history-chart"
      >
        <title id="drift-title">P50 and P90 finish date at each planning run{planned !== null ? ', with the planned finish' : ''}</title>
        {dayTicks(y0, y1, zone, 5).map((t) => (
          <g key={`y${t}`}>
            <line x1={m.l} x2={W - m.r} y1={Y(t)} y2={Y(t)} stroke="var(--color-line)" strokeWidth={1} />
            <text x={m.l - 6} y={Y(t) + 4} textAnchor="end" fontSize={11} fill="var(--color-ink-soft)">
              {label(t)}
            </text>
          </g>
        ))}
        {dayTicks(x0, x1, zone, 6).map((t) => (
          <text key={`x${t}`} x={X(t)} y={H - m.b + 16} textAnchor="middle" fontSize={11} fill="var(--color-ink-soft)">
            {label(t)}
          </text>
        ))}
        <text x={(m.l + W - m.r) / 2} y={H - 4} textAnchor="middle" fontSize={11} fill="var(--color-ink-soft)">
          planning run
        </text>
        <text
          x={12}
          y={(m.t + H - m.b) / 2}
          textAnchor="middle"
          fontSize={11}
          fill="var(--color-ink-soft)"
          transform={`rotate(-90 12 ${(m.t + H - m.b) / 2})`}
        >
          finish date
        </text>
        {band ? <polygon points={band} fill="var(--color-accent)" opacity={0.18} data-testid="drift-band" /> : null}
        {withP90.length > 0 ? (
          <polyline
            points={withP90.map((p) => `${X(p.at)},${Y(p.p90!)}`).join(' ')}
            fill="none"
            stroke="var(--color-accent)"
            strokeWidth={1}
            strokeDasharray="3 3"
          />
        ) : null}
        <polyline
          points={pts.map((p) => `${X(p.at)},${Y(p.p50)}`).join(' ')}
          fill="none"
          stroke="var(--color-accent)"
          strokeWidth={2.5}
          data-testid="drift-p50"
        />
        {pts.map((p) => (
          <circle key={p.at} cx={X(p.at)} cy={Y(p.p50)} r={2.5} fill="var(--color-accent)" />
        ))}
        {planned !== null ? (
          <g data-testid="drift-planned">
            <line
              x1={m.l}
              x2={W - m.r}
              y1={Y(planned)}
              y2={Y(planned)}
              stroke="var(--color-danger)"
              strokeWidth={1.5}
              strokeDasharray="6 4"
            />
            <text x={W - m.r - 4} y={Y(planned) - 5} textAnchor="end" fontSize={11} fill="var(--color-danger)">
              planned finish {label(planned)}
            </text>
          </g>
        ) : null}
      </svg>
      <p className="text-xs text-ink-soft">
        <span className="font-semibold text-accent">━</span> P50 finish, <span className="text-accent">▒</span> band to the P90 finish
        {planned !== null ? (
          <>
            , <span className="text-danger">╍</span> planned finish
          </>
        ) : null}
        . One point per planning run.
      </p>
      <details className="no-print text-sm">
        <summary className="cursor-pointer text-ink-soft">The points as a table</summary>
        <HistoryTable points={points} zone={zone} />
      </details>
      <div className="hidden print:block">
        <HistoryTable points={points} zone={zone} />
      </div>
    </div>
  );
}

function HistoryTable({ points, zone }: { points: OutlookHistoryPoint[]; zone: string }) {
  return (
    <table className="mt-2 text-sm" data-testid="outlook-history-table">
      <caption className="sr-only">Outlook history</caption>
      <thead>
        <HeadingRow cellClassName={th} headings={['Run', 'P50 finish', 'P90 finish', 'Forecast issued']} />
      </thead>
      <tbody>
        {points.map((p) => (
          <tr key={p.at} className="border-t border-line">
            <td className={td}>{dateIn(p.at, zone, 'd MMM yyyy HH:mm')}</td>
            <td className={td}>{dateIn(p.p50, zone)}</td>
            <td className={td}>{dateIn(p.p90, zone)}</td>
            <td className={td}>{p.forecastIssuedAt ? dateIn(p.forecastIssuedAt, zone, 'd MMM HH:mm') : 'none (hindcast only)'}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
