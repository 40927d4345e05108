// The board itself: one row per operation and worksite, one button per hour, days and hours in
// the worksite's time zone, usable windows outlined. Rows are grouped by time zone so each group
// has a header it can truthfully label.
import { memo, useCallback, useMemo, useRef, useState, type CSSProperties, type KeyboardEvent } from 'react';
import { Link } from 'react-router-dom';
import type { OperationSitePlan } from '../../../../shared/api-types-plan';
import { OCCURRENCE_META, STATUS_META, formatIn, formatStart, limitWord } from './board-format';
import { dayRuns, firstAtOrAfter, occurrenceMarks, recordEndMs, startWords, windowBoxes, type VisibleRange } from './board-model';
import { Term } from '../../../components/ui/term';
import { CHANCE_WORDS, START_WORDS, capitalised, chancePercent } from '../../../../shared/status-words';

export interface SelectedHour {
  operationId: string;
  siteId: string;
  /** Index into the plan's times. */
  index: number;
}

interface BoardGridProps {
  projectId: string;
  plans: OperationSitePlan[];
  timesMs: number[];
  stepMs: number;
  range: VisibleRange;
  nowMs: number;
  alpha: boolean;
  /** Width of an hour, px. */
  cellPx: number;
  selected: SelectedHour | null;
  onSelect: (hour: SelectedHour) => void;
}

const rowKey = (p: { operationId: string; siteId: string }) => `${p.operationId}:${p.siteId}`;

/** Aria label of an hour: 'Tue 3 Dec 14:00, not workable, limited by Hs'. */
export function hourLabel(plan: OperationSitePlan, index: number, timeMs: number): string {
  const status = plan.status[index];
  const when = formatIn(timeMs, plan.timeZone);
  const word = STATUS_META[status].word;
  const limit = limitWord(plan.limiting[index]);
  const margin = plan.marginRel[index];
  const chance = plan.chance ? `, ${CHANCE_WORDS.hour} ${chancePercent(plan.chance[index])}` : '';
  if (status === 'no_data') return `${when}, no data${chance}`;
  if (status === 'workable') {
    return `${when}, workable${limit ? `, closest limit ${limit}` : ''}${margin !== null ? ` (margin ${Math.round(margin * 100)} %)` : ''}${chance}`;
  }
  return `${when}, ${word}${limit ? `, limited by ${limit}` : ''}${chance}`;
}

export function BoardGrid(props: BoardGridProps) {
  const { plans } = props;
  const groups = useMemo(() => {
    const byZone = new Map<string, { plan: OperationSitePlan; row: number }[]>();
    for (const plan of plans) {
      const list = byZone.get(plan.timeZone) ?? [];
      list.push({ plan, row: 0 });
      byZone.set(plan.timeZone, list);
    }
    // Rows are numbered in the order they are drawn, so the arrow keys go to the row below.
    let row = 0;
    for (const list of byZone.values()) for (const r of list) r.row = row++;
    return [...byZone.entries()];
  }, [plans]);

  // One tab stop for the whole board; arrow keys move between hours and rows (roving tabindex).
  const [active, setActive] = useState<{ row: number; col: number } | null>(null);
  const rootRef = useRef<HTMLDivElement>(null);
  const activeRow = active && active.row < plans.length ? active.row : 0;
  const activeCol = active && active.col >= props.range.from && active.col < props.range.to ? active.col : props.range.from;
  const onActivate = useCallback((row: number, col: number) => setActive({ row, col }), []);

  function onKeyDown(e: KeyboardEvent<HTMLDivElement>) {
    const target = e.target as HTMLElement;
    const at = target.dataset.cell?.split(':').map(Number);
    if (!at) return;
    let [row, col] = at;
    const { from, to } = props.range;
    const page = Math.max(1, Math.round(86_400_000 / props.stepMs));
    switch (e.key) {
      case 'ArrowLeft':
        col = Math.max(from, col - 1);
        break;
      case 'ArrowRight':
        col = Math.min(to - 1, col + 1);
        break;
      case 'ArrowUp':
        row = Math.max(0, row - 1);
        break;
      case 'ArrowDown':
        row = Math.min(plans.length - 1, row + 1);
        break;
      case 'Home':
        col = from;
        break;
      case 'End':
        col = to - 1;
        break;
      case 'PageUp':
        col = Math.max(from, col - page);
        break;
      case 'PageDown':
        col = Math.min(to - 1, col + page);
        break;
      default:
        return;
    }
    e.preventDefault();
    setActive({ row, col });
    const next = rootRef.current?.querySelector<HTMLElement>(`[data-cell="${row}:${col}"]`);
    next?.focus();
    next?.scrollIntoView({ block: 'nearest', inline: 'nearest' });
  }

  return (
    <div ref={rootRef} className="flex flex-col gap-5" onKeyDown={onKeyDown} style={{ '--cell': `${props.cellPx}px` } as CSSProperties}>
      <p className="sr-only">
        Each hour is a button that opens the reasons behind its status. Arrow keys move between hours and rows; Page Up and Page Down move a
        day.
      </p>
      {groups.map(([zone, rows]) => (
        <ZoneGroup key={zone} zone={zone} rows={rows} {...props} activeRow={activeRow} activeCol={activeCol} onActivate={onActivate} />
      ))}
    </div>
  );
}

interface ZoneGroupProps extends BoardGridProps {
  zone: string;
  rows: { plan: OperationSitePlan; row: number }[];
  activeRow: number;
  activeCol: number;
  onActivate: (row: number, col: number) => void;
}

function ZoneGroup({ zone, rows, timesMs, range, nowMs, stepMs, selected, activeRow, activeCol, ...rest }: ZoneGroupProps) {
  const days = useMemo(() => dayRuns(timesMs, range, zone), [timesMs, range, zone]);
  const dayStarts = useMemo(() => new Set(days.slice(1).map((d) => d.start)), [days]);
  const hourLabels = useMemo(() => {
    const every = rest.cellPx >= 20 ? 3 : 6;
    const out: { index: number; text: string }[] = [];
    for (let i = range.from; i < range.to; i++) {
      const h = Number(formatIn(timesMs[i], zone, 'H'));
      if (h % every === 0 && Number(formatIn(timesMs[i], zone, 'm')) === 0) out.push({ index: i, text: formatIn(timesMs[i], zone, 'HH') });
    }
    return out;
  }, [timesMs, range, zone, rest.cellPx]);
  const firstMs = timesMs[range.from];
  // One cell per record: now sits in the cell of the record covering it, at its fraction of that record.
  let nowOffset: number | null = null;
  if (range.to > range.from && nowMs >= firstMs && nowMs < recordEndMs(timesMs, range.to - 1, stepMs)) {
    const k = Math.max(range.from, firstAtOrAfter(timesMs, nowMs + 1) - 1);
    const end = recordEndMs(timesMs, k, stepMs);
    nowOffset = (k - range.from + (nowMs - timesMs[k]) / (end - timesMs[k])) * rest.cellPx;
  }

  return (
    <section
      aria-label={`Operations at worksites in ${zone}`}
      className="overflow-hidden rounded-[var(--radius-card)] border border-line bg-surface"
    >
      <p className="border-b border-line px-3 py-2 text-xs text-ink-soft sm:px-4">Scroll sideways for later hours.</p>
      <div className="overflow-x-auto overscroll-x-contain" data-testid="board-scroll">
        <div className="w-max min-w-full">
          {/* Header: days and hours of the worksite. */}
          <div className="flex border-b border-line" aria-hidden>
            <div className="sticky left-0 z-20 hidden w-80 shrink-0 border-r border-line bg-surface lg:block" />
            <div className="relative">
              <div className="flex">
                {days.map((d) => (
                  <div
                    key={d.key}
                    className="shrink-0 border-l-2 border-ink/60 px-1.5 pt-1 text-xs font-bold whitespace-nowrap first:border-l-0"
                    style={{ width: `calc(var(--cell) * ${d.count})` }}
                  >
                    <span className={d.count * rest.cellPx < 70 ? 'sr-only' : undefined}>{d.label}</span>
                  </div>
                ))}
              </div>
              {/* hour numbers on the first line, the "now" tag on a line of its own below them, so it never covers a label */}
              <div className="relative h-9">
                {hourLabels.map((h) => (
                  <span
                    key={h.index}
                    className="absolute top-0.5 pl-0.5 text-[10px] leading-none text-ink-soft tabular-nums"
                    style={{ left: `calc(var(--cell) * ${h.index - range.from})` }}
                  >
                    {h.text}
                  </span>
                ))}
                {nowOffset !== null ? (
                  <span
                    className="absolute top-4 z-10 rounded-r bg-lamp px-1 text-[10px] font-bold leading-4 text-deep"
                    style={{ left: nowOffset }}
                    data-testid="now-tag"
                  >
                    now
                  </span>
                ) : null}
              </div>
            </div>
          </div>
          {rows.map(({ plan, row }) => (
            <BoardRow
              key={rowKey(plan)}
              plan={plan}
              row={row}
              timesMs={timesMs}
              range={range}
              nowMs={nowMs}
              stepMs={stepMs}
              nowOffset={nowOffset}
              dayStarts={dayStarts}
              selectedIndex={selected && selected.operationId === plan.operationId && selected.siteId === plan.siteId ? selected.index : -1}
              activeCol={row === activeRow ? activeCol : -1}
              {...rest}
            />
          ))}
        </div>
      </div>
    </section>
  );
}

interface BoardRowProps {
  plan: OperationSitePlan;
  row: number;
  projectId: string;
  timesMs: number[];
  range: VisibleRange;
  nowMs: number;
  stepMs: number;
  nowOffset: number | null;
  /** Indices of the first hour of each worksite day after the first on screen. */
  dayStarts: Set<number>;
  alpha: boolean;
  cellPx: number;
  /** The hour whose chain is open, when it is in this row; else -1. */
  selectedIndex: number;
  onSelect: (hour: SelectedHour) => void;
  /** The hour holding the board's tab stop, when it is in this row; else -1. */
  activeCol: number;
  onActivate: (row: number, col: number) => void;
}

const linkClass =
  'inline-flex min-h-11 items-center gap-1 rounded-lg px-2 text-xs font-semibold text-accent underline-offset-2 hover:bg-surface-2 hover:underline';

const BoardRow = memo(function BoardRow({
  plan,
  row,
  projectId,
  timesMs,
  range,
  nowMs,
  stepMs,
  nowOffset,
  dayStarts,
  alpha,
  cellPx,
  selectedIndex,
  onSelect,
  activeCol,
  onActivate,
}: BoardRowProps) {
  const words = startWords(plan, nowMs);
  const boxes = windowBoxes(plan.windows, timesMs, range);
  const marks = occurrenceMarks(plan.occurrences, timesMs, stepMs, range, plan.tr);
  const ics = `/api/projects/${projectId}/plan/windows.ics?${new URLSearchParams({ operationId: plan.operationId, siteId: plan.siteId, alpha: String(alpha) })}`;
  const showLetters = cellPx >= 20;

  const cells = [];
  for (let i = range.from; i < range.to; i++) {
    const status = plan.status[i];
    const meta = STATUS_META[status];
    const past = recordEndMs(timesMs, i, stepMs) <= nowMs;
    const label = hourLabel(plan, i, timesMs[i]) + (past ? ' (past)' : '');
    const isSelected = i === selectedIndex;
    cells.push(
      <button
        key={i}
        type="button"
        data-cell={`${row}:${i}`}
        data-status={status}
        data-testid="hour-cell"
        tabIndex={i === activeCol ? 0 : -1}
        aria-label={label}
        aria-controls={isSelected ? 'hour-chain' : undefined}
        title={label}
        onClick={() => {
          onActivate(row, i);
          onSelect({ operationId: plan.operationId, siteId: plan.siteId, index: i });
        }}
        className={`relative flex min-h-11 w-[var(--cell)] shrink-0 items-center justify-center self-stretch text-[11px] font-bold leading-none ${meta.cell} ${
          dayStarts.has(i) ? 'shadow-[inset_2px_0_0_var(--color-ink)]' : ''
        } ${past ? 'opacity-50' : ''} ${isSelected ? 'z-10 outline-3 -outline-offset-3 outline-lamp' : ''} hover:brightness-110 focus-visible:z-10`}
      >
        {showLetters ? <span aria-hidden>{meta.letter}</span> : null}
        {plan.chance ? (
          // The ensemble chance of workable as a thin bar along the cell's foot: its length is the
          // share (readable without colour); the words are in the cell's label.
          <span
            aria-hidden
            data-testid="chance-bar"
            data-chance={plan.chance[i]}
            className="absolute inset-x-0.5 bottom-0.5 h-1 rounded-sm bg-surface/70"
          >
            <span className="block h-full rounded-sm bg-ink" style={{ width: `${Math.round(plan.chance[i] * 100)}%` }} />
          </span>
        ) : null}
      </button>,
    );
  }

  return (
    <div
      role="group"
      aria-label={`${plan.operationName} at ${plan.siteName}`}
      data-testid="board-row"
      data-operation-id={plan.operationId}
      data-site-id={plan.siteId}
      className="flex flex-col border-b border-line last:border-b-0 lg:flex-row"
    >
      <div className="sticky left-0 z-20 w-[calc(100vw-2.75rem)] bg-surface px-3 pt-2 sm:px-4 lg:w-80 lg:shrink-0 lg:border-r lg:border-line lg:pb-0">
        <p className="text-sm leading-snug font-bold">{plan.operationName}</p>
        <p className="text-xs text-ink-soft">
          at {plan.siteName} · <Term k="tr" /> {plan.tr} h{' '}
          <span className="whitespace-nowrap">
            (<Term k="tpop" /> {plan.tpop} h + <Term k="tc" /> {plan.tc} h)
          </span>
        </p>
        <p
          className={`mt-1 text-sm font-semibold ${words.tone === 'now' ? 'text-accent' : words.tone === 'none' ? 'text-ink-soft' : 'text-ink'}`}
          title={words.detail}
          data-testid="start-words"
        >
          {words.tone === 'now' ? <span aria-hidden>▶ </span> : null}
          {words.text}
          <span className="sr-only"> {words.detail}</span>
        </p>
        {words.finish ? (
          <p className="text-xs text-ink-soft" data-testid="finish-words">
            {words.finish}
          </p>
        ) : null}
        {plan.windows[0] && plan.windows[0].chance !== null && plan.windows[0].chance !== undefined ? (
          <p className="text-xs text-ink-soft" data-testid="window-chance">
            {capitalised(START_WORDS.nextWindow)} {formatStart(plan.windows[0].start, plan.timeZone, nowMs)}: {CHANCE_WORDS.window}{' '}
            <strong className="text-ink">{chancePercent(plan.windows[0].chance)}</strong>
          </p>
        ) : null}
        <div className="-ml-2 flex flex-wrap">
          {plan.windows.length > 0 ? (
            <a className={linkClass} href={ics} download>
              <span aria-hidden>⤓</span> Download windows (.ics)
              <span className="sr-only">
                {' '}
                of {plan.operationName} at {plan.siteName}
              </span>
            </a>
          ) : (
            <span className="inline-flex min-h-11 items-center px-2 text-xs text-ink-soft">No windows to download</span>
          )}
          <Link className={linkClass} to={`/projects/${projectId}/conditions/${plan.siteId}`}>
            <span aria-hidden>↗</span> Conditions<span className="sr-only"> at {plan.siteName}</span>
          </Link>
        </div>
      </div>
      <div className="relative flex min-h-14 lg:min-h-0">
        {cells}
        {boxes.map((b) => (
          <div
            key={b.window.start}
            aria-hidden
            data-testid="window-box"
            className="pointer-events-none absolute inset-y-0.5 z-10 rounded-md border-[3px] border-ink shadow-[0_0_0_1px_var(--color-surface)]"
            style={{ left: `calc(var(--cell) * ${b.start - range.from})`, width: `calc(var(--cell) * ${b.count})` }}
          >
            {b.window.chance !== null && b.window.chance !== undefined ? (
              <span className="absolute -top-0.5 right-0 rounded-bl-md bg-ink px-1 text-[10px] leading-4 font-bold text-surface">
                {chancePercent(b.window.chance)}
              </span>
            ) : null}
          </div>
        ))}
        {marks.map((m) => {
          const meta = OCCURRENCE_META[m.status];
          const said = `Occurrence ${formatStart(m.start, plan.timeZone, nowMs)}: ${meta.word}, judged on ${plan.tr} h from its start`;
          return (
            <span
              key={m.start}
              role="img"
              aria-label={said}
              data-testid="occurrence-mark"
              data-status={m.status}
              data-start={m.start}
              className="pointer-events-none absolute top-0 z-[15] flex h-3.5 items-center overflow-hidden rounded-b-sm border border-t-0 border-ink/70"
              style={{ left: `calc(var(--cell) * ${m.from - range.from})`, width: `calc(var(--cell) * ${m.count})` }}
            >
              <span className={`flex h-full shrink-0 items-center px-0.5 text-[9px] leading-none font-bold ${meta.mark}`} aria-hidden>
                {m.clippedStart ? '…' : '↻'}
                {meta.letter}
              </span>
              <span className={`h-full flex-1 opacity-60 ${meta.mark}`} aria-hidden />
            </span>
          );
        })}
        {nowOffset !== null ? (
          <div aria-hidden className="pointer-events-none absolute inset-y-0 z-10 w-0.5 bg-lamp" style={{ left: nowOffset }} />
        ) : null}
      </div>
    </div>
  );
});
