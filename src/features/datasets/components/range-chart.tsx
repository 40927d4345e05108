import { lazy, Suspense } from 'react';
import { sub } from 'date-fns';
import { tz } from '@date-fns/tz';
import type { DatasetDetail } from '../../../../shared/api-types-datasets';
import { Button, ErrorNotice, Spinner } from '../../../components/ui';
import { DateEcho } from '../../../components/ui/date-echo';
import { useDatasetRecords, type RecordsRange } from '../api/get-dataset-records';
import { formatUtc, parseUtcDateInput, utcDateInput } from './format';
import { useDebounce } from 'use-debounce';

// The chart library is large: load it only when a chart is shown.
const SeriesChart = lazy(() => import('./series-chart'));

const DAY_MS = 86_400_000;
/** The API answers records for at most 366 days at a time (the monthly summary covers the rest). */
const MAX_SPAN_MS = 366 * DAY_MS;

/** A window of the dataset, UTC ms; null = the whole dataset. */
export type ChartView = { fromMs: number; toMs: number } | null;

const PRESETS: { label: string; duration: Duration | null }[] = [
  { label: 'All', duration: null },
  { label: '1 year', duration: { years: 1 } },
  { label: '1 month', duration: { months: 1 } },
  { label: '1 week', duration: { weeks: 1 } },
];

type Duration = { years?: number; months?: number; weeks?: number };

const clamp = (x: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, x));

/**
 * Range control (whole dataset, 1 year, 1 month, 1 week, dates, earlier/later, a scrub slider)
 * and the chart of that range. Each change asks the API for the records of the new range.
 */
export function RangeChart({
  projectId,
  dataset,
  view: chosenView,
  onView: chooseView,
}: {
  projectId: string;
  dataset: DatasetDetail;
  view: ChartView;
  onView: (v: ChartView) => void;
}) {
  const startMs = Date.parse(dataset.start);
  const endMs = Date.parse(dataset.end);
  const spanMs = Math.max(endMs - startMs, 1);
  // A dataset longer than the API's records span opens on its last year, and no view is longer.
  const tooLongForAll = endMs - startMs > MAX_SPAN_MS;
  const view: ChartView =
    chosenView ?? (tooLongForAll ? { fromMs: sub(new Date(endMs), { years: 1 }, { in: tz('UTC') }).getTime(), toMs: endMs } : null);
  const onView = (v: ChartView) => {
    if (v === null) return chooseView(null);
    chooseView(v.toMs - v.fromMs > MAX_SPAN_MS ? { fromMs: v.toMs - MAX_SPAN_MS, toMs: v.toMs } : v);
  };
  const stepMs = dataset.stepMinutes * 60_000;
  const current = view ?? { fromMs: startMs, toMs: endMs };
  const lengthMs = current.toMs - current.fromMs;

  // The value after 250 ms of quiet: the scrub slider changes on every pixel.
  const [settled] = useDebounce(view, 250);
  const range: RecordsRange = settled ? { from: new Date(settled.fromMs).toISOString(), to: new Date(settled.toMs).toISOString() } : {};
  const records = useDatasetRecords(projectId, dataset.id, range);
  const shown = records.data;
  const shownFrom = shown?.range.from ? Date.parse(shown.range.from) : startMs;
  const shownTo = shown?.range.to ? Date.parse(shown.range.to) : endMs;

  /** A window of the given length ending at the current window's end, kept inside the dataset. */
  function preset(duration: Duration | null) {
    if (duration === null) return onView(null);
    const toMs = current.toMs;
    const fromMs = sub(new Date(toMs), duration, { in: tz('UTC') }).getTime();
    if (fromMs <= startMs) {
      const len = toMs - fromMs;
      return onView(len >= spanMs ? null : { fromMs: startMs, toMs: startMs + len });
    }
    onView({ fromMs, toMs });
  }

  function shift(direction: -1 | 1) {
    const fromMs = clamp(current.fromMs + direction * lengthMs, startMs, endMs - lengthMs);
    onView({ fromMs, toMs: fromMs + lengthMs });
  }

  function pickDates(fromText: string, toText: string) {
    const f = parseUtcDateInput(fromText);
    const t = parseUtcDateInput(toText);
    if (Number.isNaN(f) || Number.isNaN(t)) return;
    const fromMs = clamp(f, startMs, endMs);
    const toMs = clamp(t + DAY_MS - 1, startMs, endMs);
    if (toMs <= fromMs) return;
    onView(fromMs <= startMs && toMs >= endMs ? null : { fromMs, toMs });
  }

  const activePreset = (duration: Duration | null) =>
    duration === null ? view === null : view !== null && sub(new Date(view.toMs), duration, { in: tz('UTC') }).getTime() === view.fromMs;
  const zoomed = view !== null;
  const tooShort = (d: Duration) => sub(new Date(endMs), d, { in: tz('UTC') }).getTime() <= startMs;

  return (
    <div id="range-chart" className="flex scroll-mt-4 flex-col gap-4">
      <div className="flex flex-col gap-3">
        <div className="flex flex-wrap items-center gap-2" role="group" aria-label="Range shown">
          {PRESETS.map((p) => (
            <Button
              key={p.label}
              variant={activePreset(p.duration) ? 'primary' : 'secondary'}
              aria-pressed={activePreset(p.duration)}
              disabled={p.duration === null ? tooLongForAll : tooShort(p.duration)}
              title={
                p.duration === null && tooLongForAll
                  ? 'Longer than a year: pick a year at a time, or see the monthly summary below'
                  : undefined
              }
              onClick={() => preset(p.duration)}
            >
              {p.label}
            </Button>
          ))}
          <span className="mx-1 hidden h-8 w-px bg-line sm:inline-block" aria-hidden />
          <Button variant="ghost" disabled={!zoomed || current.fromMs <= startMs} onClick={() => shift(-1)} aria-label="Earlier">
            ◀ Earlier
          </Button>
          <Button variant="ghost" disabled={!zoomed || current.toMs >= endMs} onClick={() => shift(1)} aria-label="Later">
            Later ▶
          </Button>
        </div>
        <div className="grid gap-3 sm:grid-cols-[auto_auto_1fr] sm:items-end">
          <DateRangeFields startMs={startMs} endMs={endMs} chosen={current} onPick={pickDates} />
          <label className="flex flex-col gap-1 text-sm font-semibold">
            Move through the dataset
            <input
              type="range"
              className="min-h-11 w-full accent-[var(--color-accent)] disabled:opacity-40"
              min={startMs}
              max={Math.max(startMs, endMs - lengthMs)}
              step={stepMs > 0 ? stepMs : 3_600_000}
              value={current.fromMs}
              disabled={!zoomed}
              aria-valuetext={`${formatUtc(current.fromMs)} to ${formatUtc(current.toMs)} UTC`}
              onChange={(e) => {
                const fromMs = Number(e.target.value);
                onView({ fromMs, toMs: fromMs + lengthMs });
              }}
            />
          </label>
        </div>
        <p className="text-sm text-ink-soft" aria-live="polite">
          Showing {formatUtc(current.fromMs)} – {formatUtc(current.toMs)}
          {records.isFetching ? ' (loading…)' : ''}
        </p>
      </div>
      {records.error ? <ErrorNotice error={records.error} /> : null}
      {!shown && records.isPending ? <Spinner label="Loading records" /> : null}
      {shown ? (
        shown.timeMs.length === 0 ? (
          <p className="rounded-lg border border-dashed border-line px-4 py-6 text-center text-sm text-ink-soft">
            No records in this range.
          </p>
        ) : (
          <div className={records.isPlaceholderData ? 'opacity-60 transition-opacity' : 'transition-opacity'}>
            <Suspense fallback={<Spinner label="Drawing the chart" />}>
              <SeriesChart columns={shown} fromMs={shownFrom} toMs={shownTo} stepMinutes={dataset.stepMinutes} />
            </Suspense>
          </div>
        )
      ) : null}
    </div>
  );
}

/**
 * The "From" and "To" UTC date inputs of a range inside [startMs, endMs], each with its date
 * echoed in words; `onPick` gets both dates (YYYY-MM-DD) when either changes.
 */
function DateRangeFields({
  startMs,
  endMs,
  chosen,
  onPick,
}: {
  startMs: number;
  endMs: number;
  chosen: NonNullable<ChartView>;
  onPick: (from: string, to: string) => void;
}) {
  const from = utcDateInput(chosen.fromMs);
  const to = utcDateInput(chosen.toMs);
  const ends = [
    { label: 'From', value: from, pick: (d: string) => onPick(d, to) },
    { label: 'To', value: to, pick: (d: string) => onPick(from, d) },
  ];
  return ends.map((end) => (
    <label key={end.label} className="flex flex-col gap-1 text-sm font-semibold">
      {end.label}
      <input
        type="date"
        className="min-h-11 rounded-lg border border-line bg-surface px-3 text-base font-normal text-ink"
        min={utcDateInput(startMs)}
        max={utcDateInput(endMs)}
        value={end.value}
        onChange={(e) => end.pick(e.target.value)}
      />
      <DateEcho value={end.value} />
    </label>
  ));
}
