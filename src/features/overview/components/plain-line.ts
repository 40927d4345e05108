// The Overview's one line per operation and worksite, in plain words. Times are read in the
// worksite's zone in the product's date style (shared/dates.ts); limits are named as in alerts.
import { formatInstant } from '../../../../shared/dates';
import { limitWords } from '../../../../shared/limit-words';
import type { OverviewChange, OverviewLine } from '../../../../shared/api-types-overview';
import { START_WORDS, STATUS_WORDS } from '../../../../shared/status-words';

const MS_PER_HOUR = 3_600_000;

/** Hours as words: "35 h", "6.5 h"; from 72 h on "3 days 4 h". */
export function hoursWords(h: number): string {
  if (h < 72) return `${Math.round(h * 10) / 10} h`;
  const d = Math.floor(h / 24);
  const rest = Math.round(h - d * 24);
  return rest ? `${d} days ${rest} h` : `${d} days`;
}

/** How far ahead an instant is: "in 35 min", "in 20 h", "in 3 days 4 h". */
export function aheadWords(instantMs: number, nowMs: number): string {
  const minutes = Math.max(0, Math.round((instantMs - nowMs) / 60_000));
  if (minutes < 60) return `in ${minutes} min`;
  return `in ${hoursWords(Math.round(minutes / 60))}`;
}

/** A go-start in the date style, the year added when it is not this year ("Thu 4 Dec 14:00"). */
export function startWords(instant: string | number, timeZone: string, nowMs: number): string {
  const sameYear = formatInstant(instant, timeZone, 'dayYear').slice(-4) === formatInstant(nowMs, timeZone, 'dayYear').slice(-4);
  return formatInstant(instant, timeZone, sameYear ? 'dateTime' : 'dateTimeYear');
}

/** The answer of the line alone: "may start now", "next go-start … (in 20 h), window 35 h", "no window in this forecast (to Sun 13 Dec)". */
export function startSentence(line: OverviewLine, nowMs: number, forecastEnd: string | null): string {
  if (line.informationOnly) return 'not weather-restricted: statuses for information, no go-start planned';
  const window = line.windowHours !== null ? `, window ${hoursWords(line.windowHours)}` : '';
  if (line.startNow) return `may start now${window}`;
  if (line.earliestStart) return `next go-start ${goStartWords(line, nowMs, forecastEnd)}${window}`;
  return goStartWords(line, nowMs, forecastEnd);
}

/**
 * The go-start alone, for a field already labelled "Next go-start": "Thu 4 Dec 14:00 (in 20 h)",
 * "now", "no window in this forecast (to Sun 13 Dec)".
 */
export function goStartWords(line: OverviewLine, nowMs: number, forecastEnd: string | null): string {
  if (line.informationOnly) return 'none planned: not weather-restricted';
  if (line.startNow) return 'now';
  if (line.earliestStart)
    return `${startWords(line.earliestStart, line.timeZone, nowMs)} (${aheadWords(Date.parse(line.earliestStart), nowMs)})`;
  const to = forecastEnd ? ` (to ${formatInstant(forecastEnd, line.timeZone, 'day')})` : '';
  return `no window in this forecast${to}`;
}

/**
 * The whole plain line: the answer, then what limits it and, where an ensemble forecast gives
 * one, the chance of the go-start, e.g.
 * "next go-start Thu 4 Dec 14:00 (in 20 h), window 35 h; limited by wave height (Hs)".
 */
export function plainLine(line: OverviewLine, nowMs: number, forecastEnd: string | null): string {
  const parts = [startSentence(line, nowMs, forecastEnd)];
  const limit = line.informationOnly || line.startNow ? null : limitWords(line.limiting);
  if (limit) parts.push(`limited by ${limit}`);
  if (line.chance !== null && !line.informationOnly) parts.push(`chance ${Math.round(line.chance * 100)} %`);
  return parts.join('; ');
}

/** "Forecast issued Thu 3 Dec 06:00, 5 h old" (the forecast's age), or why there is none. */
export function forecastAgeWords(issuedAt: string | null, timeZone: string, nowMs: number): string {
  if (!issuedAt) return 'Forecast issue time unknown';
  const hours = (nowMs - Date.parse(issuedAt)) / MS_PER_HOUR;
  const age = hours < 1 ? `${Math.max(0, Math.round(hours * 60))} min` : hoursWords(Math.round(hours));
  return `Forecast issued ${formatInstant(issuedAt, timeZone, 'dateTime')}, ${age} old`;
}

/** Each change kind of a planning run, in the order said, as one change and as several. */
const CHANGE_KIND_WORDS: [kind: string, one: string, many: string][] = [
  ['window_opened', START_WORDS.newWindow, `${START_WORDS.newWindow}s`],
  ['window_lost', START_WORDS.windowLost, 'windows lost'],
  ['earliest_moved', START_WORDS.earliestMoved, START_WORDS.earliestMoved],
  ['start_now_changed', `“${START_WORDS.startNow}” changed`, `“${START_WORDS.startNow}” changed`],
  ['occurrence_no_go', `occurrence ${STATUS_WORDS.not_workable.word}`, `occurrences ${STATUS_WORDS.not_workable.word}`],
];

/** A planning run's changes at one operation and worksite, counted: "4 new windows, 2 occurrences not workable". */
export function changeCountWords(change: OverviewChange): string {
  const known = new Set(CHANGE_KIND_WORDS.map(([kind]) => kind));
  const parts = CHANGE_KIND_WORDS.filter(([kind]) => (change.counts[kind] ?? 0) > 0).map(([kind, one, many]) => {
    const n = change.counts[kind]!;
    return n === 1 ? `1 ${one}` : `${n} ${many}`;
  });
  const other = Object.entries(change.counts).reduce((sum, [kind, n]) => sum + (known.has(kind) ? 0 : (n ?? 0)), 0);
  if (other > 0) parts.push(other === 1 ? '1 other change' : `${other} other changes`);
  return parts.join(', ');
}
