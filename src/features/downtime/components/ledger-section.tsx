import { useState, useSyncExternalStore } from 'react';
import { DATE_STYLE } from '../../../../shared/dates';
import { format } from 'date-fns';
import type { LedgerEntry, LedgerMonthRow, LedgerProposeAnswer } from '../../../../shared/api-types-downtime';
import {
  LEDGER_LIMITING_LABELS,
  LEDGER_LIMITING_VALUES,
  LedgerConfirmInput,
  type LedgerLimiting,
} from '../../../../shared/schemas/downtime';
import { Button, Card, Confirm, ErrorNotice, FieldShell, Input, Notice, PlainOptions, Select, Spinner } from '../../../components/ui';
import { useLedger } from '../api/get-ledger';
import { useLedgerMonthly } from '../api/get-ledger-monthly';
import { useProposeLedger } from '../api/propose-ledger';
import { useConfirmLedger } from '../api/confirm-ledger';
import { useConfirmLedgerDay } from '../api/confirm-ledger-day';
import { downloadCsv, toCsv } from '../../../lib/csv';
import { dayWords, hours, monthRange, monthWords } from './format';
import { HeadingRow } from '../../../components/ui/table';
import { SubmitOrCancel } from '../../../components/ui/form-actions';

const th = 'sticky top-0 bg-surface-2 px-2 py-2 text-xs font-semibold text-ink-soft';
const td = 'px-2 py-1 text-right tabular-nums whitespace-nowrap';

const limitingLabel = (v: LedgerLimiting | null) => (v ? LEDGER_LIMITING_LABELS[v] : '–');

// Phones get a list of cards instead of the wide table (one DOM either way, so ids stay unique).
const NARROW = '(max-width: 640px)';
function subscribeNarrow(onChange: () => void) {
  const mq = window.matchMedia(NARROW);
  mq.addEventListener('change', onChange);
  return () => mq.removeEventListener('change', onChange);
}
const isNarrow = () => window.matchMedia(NARROW).matches;

/** Today on the user's clock, YYYY-MM-DD (worksite days differ by at most a day); the server decides in the worksite's zone. */
const todayDay = () => format(new Date(), 'yyyy-MM-dd');

/** Where a day's proposal came from, in plain words. */
const sourceWords = (r: LedgerEntry) => (r.source === 'observation' ? 'Observed' : 'From forecast');
const sourceTitle = (r: LedgerEntry) =>
  r.source === 'observation'
    ? `Measured: ${r.datasetName ?? 'an observation dataset'}`
    : `No observation covers this day: estimated from the forecast issues that covered it (mostly ${r.datasetName ?? 'a deleted forecast'})`;

/** What a row shows: the confirmed values once confirmed, else the proposal. */
function shown(r: LedgerEntry) {
  const confirmed = r.status === 'confirmed';
  return {
    confirmed,
    lost: confirmed ? r.lostHours : r.proposedLostHours,
    limiting: confirmed ? r.limiting : r.proposedLimiting,
    corrected: confirmed && r.proposedLostHours !== null && (r.lostHours !== r.proposedLostHours || r.limiting !== r.proposedLimiting),
  };
}

function StatusBadge({ row }: { row: LedgerEntry }) {
  const { confirmed, corrected } = shown(row);
  return confirmed ? (
    <span
      className="inline-flex items-center gap-1 rounded-full bg-ok-soft px-2 py-0.5 text-xs font-semibold"
      title={row.confirmedBy ? `by ${row.confirmedBy}` : undefined}
    >
      Confirmed{corrected ? ', corrected' : ''}
      <span className="font-normal text-ink-soft">· locked</span>
    </span>
  ) : (
    <span className="inline-flex rounded-full bg-surface-2 px-2 py-0.5 text-xs font-semibold">Proposed</span>
  );
}

/** A ledger day as shown in the list (a card on phones, a table row on laptops). */
interface LedgerItemProps {
  projectId: string;
  row: LedgerEntry;
  canEdit: boolean;
  /** Whether its confirmation form is open. */
  open: boolean;
  onOpen: (v: boolean) => void;
}

/** One ledger day as a card (phones). */
function LedgerCard({ projectId, row: r, canEdit, open, onOpen }: LedgerItemProps) {
  const { confirmed, lost, limiting, corrected } = shown(r);
  return (
    <li className="rounded-lg border border-line p-3 text-sm">
      <div className="flex items-start justify-between gap-2">
        <span className="font-semibold">{dayWords(r.day, 'EEE d MMM')}</span>
        <StatusBadge row={r} />
      </div>
      <p className="mt-1">
        {r.operationName} <span className="text-ink-soft">at {r.siteName}</span>
      </p>
      <p className="mt-1 tabular-nums">
        <span className="font-semibold">{hours(lost)}</span> lost of {hours(r.plannedHours, 0)}
        {corrected ? <span className="text-ink-soft"> (proposed {hours(r.proposedLostHours)})</span> : null} · {limitingLabel(limiting)}
      </p>
      <p className="text-xs text-ink-soft" title={sourceTitle(r)}>
        {sourceWords(r)}
        {r.day >= todayDay() ? ', day not over yet' : ''}
      </p>
      {r.note ? <p className="mt-1 text-xs text-ink-soft">Note: {r.note}</p> : null}
      {canEdit && !confirmed && !open && r.day < todayDay() ? (
        <Button
          variant="secondary"
          className="no-print mt-2"
          onClick={() => onOpen(true)}
          aria-label={`Confirm ${r.day}, ${r.operationName} at ${r.siteName}`}
        >
          Confirm
        </Button>
      ) : null}
      {canEdit && !confirmed && open ? (
        <div className="no-print mt-2 border-t border-line pt-2">
          <ConfirmForm projectId={projectId} row={r} onDone={() => onOpen(false)} />
        </div>
      ) : null}
    </li>
  );
}

/**
 * The month's days with proposals still to confirm, each with a button that confirms the whole day
 * as proposed (every operation at every worksite; all or none), after a question. A day to correct
 * is confirmed entry by entry in the table first.
 */
function DaysWaiting({ projectId, rows }: { projectId: string; rows: LedgerEntry[] }) {
  const confirmDay = useConfirmLedgerDay(projectId);
  const [asking, setAsking] = useState<string | null>(null);
  const counts = new Map<string, number>();
  for (const r of rows) if (r.status === 'proposed') counts.set(r.day, (counts.get(r.day) ?? 0) + 1);
  const days = [...counts].sort(([a], [b]) => a.localeCompare(b));
  if (days.length === 0) return null;
  return (
    <div className="no-print flex flex-col gap-2" data-testid="days-waiting">
      <p className="text-sm">
        <span className="font-semibold">Days waiting for confirmation.</span>{' '}
        <span className="text-ink-soft">
          Confirm a day as proposed in one go, or each entry in the table (to correct one, with a note).
        </span>
      </p>
      <ul className="flex flex-wrap gap-2">
        {days.map(([day, n]) => (
          <li key={day}>
            <Button variant="secondary" disabled={confirmDay.isPending} onClick={() => setAsking(day)}>
              Confirm {dayWords(day, DATE_STYLE.day)} as proposed ({n})
            </Button>
          </li>
        ))}
      </ul>
      {asking ? (
        <Confirm
          title={`Confirm the ${counts.get(asking) ?? 0} proposals of ${dayWords(asking)} as proposed?`}
          confirmLabel="Confirm the day"
          tone="primary"
          busy={confirmDay.isPending}
          onConfirm={() => confirmDay.mutate({ day: asking }, { onSettled: () => setAsking(null) })}
          onCancel={() => setAsking(null)}
        >
          Each entry keeps the hours lost and the limiting factor proposed from the data, and is locked; the audit trail records each.
        </Confirm>
      ) : null}
      {confirmDay.error ? <ErrorNotice error={confirmDay.error} /> : null}
    </div>
  );
}

/**
 * The downtime ledger of one month: per day and operation at a worksite, hours planned and lost to
 * weather with the limiting factor; coordinators propose the month from the data and confirm (or
 * correct, with a note) each day. Below, the month's totals against the hindcast expectation.
 */
export function LedgerSection({
  projectId,
  canEdit,
  isClient,
  month,
  onMonth,
  datasetId,
  alpha,
}: {
  projectId: string;
  canEdit: boolean;
  isClient: boolean;
  month: string;
  onMonth: (m: string) => void;
  datasetId: string;
  /** The page's basis: the expectation uses the same forecast-limit setting as the heat map and table. */
  alpha: boolean;
}) {
  const range = monthRange(month);
  const ledger = useLedger(projectId, range);
  const monthly = useLedgerMonthly(projectId, { ...range, datasetId, alpha });
  const propose = useProposeLedger(projectId);
  const [open, setOpen] = useState<string | null>(null);
  const narrow = useSyncExternalStore(subscribeNarrow, isNarrow, () => false);
  const rows = ledger.data ?? [];
  // Cards on a narrow screen, table rows on a wide one: the same props either way.
  const Entry = narrow ? LedgerCard : LedgerRow;
  const entries = rows.map((r) => (
    <Entry key={r.id} projectId={projectId} row={r} canEdit={canEdit} open={open === r.id} onOpen={(v) => setOpen(v ? r.id : null)} />
  ));

  function downloadDays() {
    downloadCsv(
      `downtime-ledger-${month}.csv`,
      toCsv(
        [
          'day',
          'operation',
          'worksite',
          'planned_h',
          'proposed_lost_h',
          'proposed_limiting',
          'lost_h',
          'limiting',
          'status',
          'note',
          'source',
          'dataset',
          'confirmed_by',
          'confirmed_at',
        ],
        rows.map((r) => [
          r.day,
          r.operationName,
          r.siteName,
          r.plannedHours,
          r.proposedLostHours,
          r.proposedLimiting,
          r.lostHours,
          r.limiting,
          r.status,
          r.note,
          r.source,
          r.datasetName,
          r.confirmedBy,
          r.confirmedAt,
        ]),
      ),
    );
  }

  return (
    <Card className="flex flex-col gap-4 print:break-before-page" aria-labelledby="ledger-title">
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <h2 id="ledger-title" className="text-lg font-bold">
            Downtime ledger
          </h2>
          <p className="mt-1 max-w-3xl text-sm text-ink-soft">
            What happened, day by day at each worksite: all hours of a day are planned; hours not workable at OPLIM, or without data, count
            as lost.
            {isClient
              ? ' Confirmed days only.'
              : ' Only days that are over are proposed: from the newest observation covering the day, else from the forecast issues that covered it (marked “From forecast”). The last week’s days are proposed every hour by themselves; “Propose from data” does it at once for any month. The coordinator confirms or corrects each finished day.'}
          </p>
        </div>
      </div>
      <div className="no-print flex flex-wrap items-end gap-2">
        <div className="w-48">
          <FieldShell label="Month" htmlFor="ledger-month">
            <Input
              id="ledger-month"
              type="month"
              value={month}
              onChange={(e) => /^\d{4}-\d{2}$/.test(e.target.value) && onMonth(e.target.value)}
            />
          </FieldShell>
        </div>
        {canEdit ? (
          <Button onClick={() => propose.mutate(range)} disabled={propose.isPending}>
            {propose.isPending ? 'Proposing…' : 'Propose from data'}
          </Button>
        ) : null}
        <Button variant="secondary" onClick={downloadDays} disabled={rows.length === 0}>
          Download CSV
        </Button>
      </div>
      <p className="hidden text-sm font-semibold print:block">{monthWords(month)}</p>
      {propose.error ? <ErrorNotice error={propose.error} /> : null}
      {propose.data ? <ProposeResult answer={propose.data} /> : null}
      {canEdit ? <DaysWaiting projectId={projectId} rows={rows} /> : null}
      {ledger.error ? <ErrorNotice error={ledger.error} /> : null}
      {ledger.isPending ? <Spinner label="Reading the ledger" /> : null}
      {!ledger.isPending && rows.length === 0 ? (
        <Notice>
          {isClient
            ? `No confirmed day in ${monthWords(month)} yet.`
            : canEdit
              ? `Nothing recorded for ${monthWords(month)} yet: “Propose from data” fills the days the data covers.`
              : `Nothing recorded for ${monthWords(month)} yet.`}
        </Notice>
      ) : null}
      {rows.length > 0 && narrow ? (
        <ul
          className={`flex max-h-[40rem] flex-col gap-2 overflow-auto ${ledger.isFetching ? 'opacity-60' : ''}`}
          data-testid="ledger-list"
          aria-label={`Downtime ledger, ${monthWords(month)}`}
        >
          {entries}
        </ul>
      ) : null}
      {rows.length > 0 && !narrow ? (
        <div
          className={`max-h-[36rem] overflow-auto rounded-lg border border-line print:max-h-none print:overflow-visible ${ledger.isFetching ? 'opacity-60' : ''}`}
          // Scrolls with the keyboard too (focusable), also where it holds no button (clients, skippers).
          tabIndex={0}
          role="region"
          aria-label={`Downtime ledger, ${monthWords(month)}, scrolls`}
        >
          <table className="w-full min-w-[50rem] text-sm" data-testid="ledger-table">
            <caption className="sr-only">Downtime ledger, {monthWords(month)}</caption>
            <thead>
              <HeadingRow
                cellClassName={th}
                right={[2, 3]}
                headings={[
                  'Day',
                  'Operation at worksite',
                  'Planned',
                  'Lost',
                  'Limiting',
                  'Source',
                  'Status',
                  canEdit && { label: <span className="sr-only">Action</span>, className: `${th} no-print text-left` },
                ]}
              />
            </thead>
            <tbody>{entries}</tbody>
          </table>
        </div>
      ) : null}
      <MonthlyTotals
        rows={monthly.data?.rows}
        hindcast={monthly.data?.hindcast ?? null}
        error={monthly.error}
        isClient={isClient}
        month={month}
      />
    </Card>
  );
}

function ProposeResult({ answer }: { answer: LedgerProposeAnswer }) {
  const uncovered = answer.uncovered.reduce((a, u) => a + u.days.length, 0);
  const notOver = answer.notOver.reduce((a, u) => a + u.days.length, 0);
  return (
    <Notice tone="success">
      {answer.written} day{answer.written === 1 ? '' : 's'} proposed
      {answer.keptConfirmed > 0 ? `, ${answer.keptConfirmed} confirmed left as they were` : ''}
      {answer.sources.length > 0
        ? ` from ${answer.sources.map((s) => `${s.name} (${s.kind === 'observation' ? 'observed' : 'forecast'})`).join(', ')}`
        : ''}
      .
      {uncovered > 0
        ? ` ${uncovered} worksite-day${uncovered === 1 ? '' : 's'} had no observation or forecast covering the whole day and were left out.`
        : ''}
      {notOver > 0
        ? ` ${notOver} worksite-day${notOver === 1 ? ' is' : 's are'} not over yet and ${notOver === 1 ? 'was' : 'were'} left out.`
        : ''}
    </Notice>
  );
}

function LedgerRow({ projectId, row: r, canEdit, open, onOpen }: LedgerItemProps) {
  const { confirmed, lost, limiting, corrected } = shown(r);
  return (
    <>
      <tr className="border-t border-line/60 align-top">
        <th scope="row" className="px-2 py-1 text-left font-normal whitespace-nowrap">
          {dayWords(r.day, 'EEE d MMM')}
        </th>
        <td className="px-2 py-1">
          {r.operationName} <span className="text-ink-soft">at {r.siteName}</span>
          {r.note ? <div className="text-xs text-ink-soft">Note: {r.note}</div> : null}
        </td>
        <td className={td}>{hours(r.plannedHours, 0)}</td>
        <td className={`${td} font-semibold`}>
          {hours(lost, 1)}
          {corrected ? <div className="text-xs font-normal text-ink-soft">proposed {hours(r.proposedLostHours, 1)}</div> : null}
        </td>
        <td className="px-2 py-1">{limitingLabel(limiting)}</td>
        <td className="px-2 py-1 text-xs text-ink-soft" title={sourceTitle(r)}>
          {sourceWords(r)}
          {r.day >= todayDay() ? <div>day not over yet</div> : null}
        </td>
        <td className="px-2 py-1">
          <StatusBadge row={r} />
        </td>
        {canEdit ? (
          <td className="no-print px-1 py-0.5">
            {!confirmed && !open && r.day < todayDay() ? (
              <Button variant="secondary" onClick={() => onOpen(true)} aria-label={`Confirm ${r.day}, ${r.operationName} at ${r.siteName}`}>
                Confirm
              </Button>
            ) : null}
          </td>
        ) : null}
      </tr>
      {open && canEdit && !confirmed ? (
        <tr className="no-print bg-surface-2/50">
          <td colSpan={8} className="px-2 py-2">
            <ConfirmForm projectId={projectId} row={r} onDone={() => onOpen(false)} />
          </td>
        </tr>
      ) : null}
    </>
  );
}

/** Confirms a day as proposed, or corrected with a note; locks it. */
function ConfirmForm({ projectId, row, onDone }: { projectId: string; row: LedgerEntry; onDone: () => void }) {
  const confirm = useConfirmLedger(projectId);
  const [lost, setLost] = useState(String(row.proposedLostHours));
  const [limiting, setLimiting] = useState<string>(row.proposedLimiting ?? '');
  const [note, setNote] = useState('');
  const [errors, setErrors] = useState<Record<string, string>>({});
  const id = `confirm-${row.id}`;

  function submit() {
    const lostHours = lost.trim() === '' ? NaN : Number(lost.replace(',', '.'));
    const found: Record<string, string> = {};
    const parsed = LedgerConfirmInput.safeParse({ lostHours, limiting: limiting === '' ? null : limiting, note });
    if (!parsed.success) for (const i of parsed.error.issues) found[String(i.path[0] ?? 'note')] ??= i.message;
    if (!found.lostHours && lostHours > row.plannedHours) found.lostHours = `must be at most the ${row.plannedHours} h planned`;
    const changed = lostHours !== row.proposedLostHours || (limiting || null) !== row.proposedLimiting;
    if (changed && note.trim() === '') found.note = 'A corrected value needs a note saying why';
    setErrors(found);
    if (Object.keys(found).length > 0 || !parsed.success) return;
    confirm.mutate({ entryId: row.id, input: changed ? parsed.data : { note: parsed.data.note } }, { onSuccess: onDone });
  }

  return (
    <form
      className="flex flex-col gap-3"
      aria-label={`Confirm ${row.day}, ${row.operationName} at ${row.siteName}`}
      onSubmit={(e) => {
        e.preventDefault();
        submit();
      }}
    >
      <p className="text-sm">
        Proposed: {hours(row.proposedLostHours)} lost of {hours(row.plannedHours, 0)}, limiting {limitingLabel(row.proposedLimiting)}.
        Confirming locks the day.
      </p>
      <div className="grid gap-3 sm:grid-cols-[10rem_12rem_1fr]">
        <FieldShell label="Lost to weather" unit="h" htmlFor={`${id}-lost`} error={errors.lostHours}>
          <Input
            id={`${id}-lost`}
            inputMode="decimal"
            value={lost}
            invalid={!!errors.lostHours}
            onChange={(e) => setLost(e.target.value)}
          />
        </FieldShell>
        <FieldShell label="Limiting factor" htmlFor={`${id}-limiting`} error={errors.limiting}>
          <Select id={`${id}-limiting`} value={limiting} onChange={(e) => setLimiting(e.target.value)}>
            <option value="">None</option>
            <PlainOptions values={LEDGER_LIMITING_VALUES} labels={LEDGER_LIMITING_LABELS} />
          </Select>
        </FieldShell>
        <FieldShell label="Note" htmlFor={`${id}-note`} hint="Needed when you change the proposal." error={errors.note}>
          <Input id={`${id}-note`} value={note} invalid={!!errors.note} maxLength={2000} onChange={(e) => setNote(e.target.value)} />
        </FieldShell>
      </div>
      <SubmitOrCancel mutation={confirm} label="Confirm day" pendingLabel="Confirming…" onCancel={onDone} />
    </form>
  );
}

/** Confirmed lost hours of the month against the hindcast expectation (P50/P90 of a whole month). */
function MonthlyTotals({
  rows,
  hindcast,
  error,
  isClient,
  month,
}: {
  rows: LedgerMonthRow[] | undefined;
  hindcast: { id: string; name: string } | null;
  error: unknown;
  isClient: boolean;
  month: string;
}) {
  if (error) return <ErrorNotice error={error} />;
  if (!rows || rows.length === 0) return null;
  function download() {
    downloadCsv(
      `downtime-monthly-${month}.csv`,
      toCsv(
        [
          'month',
          'operation',
          'worksite',
          'days',
          'confirmed_days',
          'confirmed_planned_h',
          'confirmed_lost_h',
          ...(isClient ? [] : ['proposed_lost_h']),
          'month_h',
          'expected_p50_h',
          'expected_p90_h',
          'hindcast_years',
          'hindcast',
        ],
        rows!.map((r) => [
          r.month,
          r.operationName,
          r.siteName,
          r.days,
          r.confirmedDays,
          r.confirmedPlannedHours,
          r.confirmedLostHours,
          ...(isClient ? [] : [r.proposedLostHours]),
          r.monthHours,
          r.expectedP50Hours,
          r.expectedP90Hours,
          r.hindcastYears,
          hindcast?.name ?? null,
        ]),
      ),
    );
  }
  return (
    <div className="flex flex-col gap-2 border-t border-line pt-4">
      <div className="flex flex-wrap items-end justify-between gap-2">
        <div>
          <h3 className="text-base font-bold">Month against expectation</h3>
          <p className="text-sm text-ink-soft">
            Expected: lost hours in the whole calendar month over the years of {hindcast ? hindcast.name : 'a hindcast (none yet)'}, P50 and
            P90, on the page’s basis (stated at the top). The days above count what happened, at OPLIM.
          </p>
        </div>
        <Button variant="secondary" className="no-print" onClick={download}>
          Download CSV
        </Button>
      </div>
      <div className="overflow-x-auto rounded-lg border border-line">
        <table className="w-full min-w-[48rem] text-sm" data-testid="ledger-monthly-table">
          <caption className="sr-only">Confirmed downtime per month against the hindcast expectation</caption>
          <thead>
            <HeadingRow
              cellClassName={th}
              right={[1, 2, 3, 4, 5, 6]}
              headings={[
                'Operation at worksite',
                'Confirmed days',
                'Confirmed lost',
                !isClient && 'Still proposed',
                'Expected P50',
                'Expected P90',
                'Month',
              ]}
            />
          </thead>
          <tbody>
            {rows.map((r) => {
              const over = r.expectedP90Hours !== null && r.confirmedLostHours > r.expectedP90Hours;
              return (
                <tr key={`${r.month}-${r.operationId}-${r.siteId}`} className="border-t border-line/60">
                  <th scope="row" className="px-2 py-1 text-left font-normal">
                    {r.operationName} <span className="text-ink-soft">at {r.siteName}</span>
                    {rows.some((x) => x.month !== r.month) ? (
                      <span className="ml-1 text-xs text-ink-soft">({monthWords(r.month)})</span>
                    ) : null}
                  </th>
                  <td className={td}>
                    {r.confirmedDays} of {r.days}
                  </td>
                  <td className={`${td} font-semibold`}>
                    {hours(r.confirmedLostHours)}
                    {over ? <span className="ml-1 text-xs font-semibold text-danger">above P90</span> : null}
                  </td>
                  {!isClient ? <td className={td}>{hours(r.proposedLostHours)}</td> : null}
                  <td className={td}>{hours(r.expectedP50Hours)}</td>
                  <td className={td}>{hours(r.expectedP90Hours)}</td>
                  <td className={td}>{hours(r.monthHours, 0)}</td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <p className="text-xs text-ink-soft">
        A month with only some days confirmed is compared with the expectation for the whole month: read it against the share of days
        confirmed.
      </p>
    </div>
  );
}
