// Words, numbers and times of the watch board. Every time shown on the board is in the
// worksite's IANA time zone, through @date-fns/tz (`tz()` with date-fns `format`), never through
// hand-made offsets: days are the worksite's calendar days, and a daylight-saving change shows up
// as a repeated or missing hour label.
import { format } from 'date-fns';
import { tz } from '@date-fns/tz';
import { formatInstant } from '../../../../shared/dates';
import type { HourStatus, OccurrenceStatus } from '../../../../shared/api-types-plan';
import { limitWords } from '../../../../shared/limit-words';
import { HOUR_STATUS_ORDER, OCCURRENCE_STATUS_WORD, STATUS_WORDS, type StatusWording } from '../../../../shared/status-words';
import { TRANSFORM_FLAG } from '../../../../shared/waves/transform';
import { fixedWithUnit, formatAt, zoneShort } from '../../../lib/format';

const CELL: Record<HourStatus, string> = {
  workable: 'bg-st-workable text-deep',
  marginal: 'bg-st-marginal pattern-marginal text-deep',
  not_workable: 'bg-st-notworkable pattern-notworkable text-white',
  no_data: 'bg-st-nodata pattern-nodata text-ink',
};

/**
 * The status code of the board: our own colours and patterns, with the word, the letter and the
 * meaning of each status from the product's one vocabulary (shared/status-words.ts).
 */
export const STATUS_META: Record<HourStatus, StatusWording & { cell: string }> = Object.fromEntries(
  HOUR_STATUS_ORDER.map((s) => [s, { ...STATUS_WORDS[s], cell: CELL[s] }]),
) as Record<HourStatus, StatusWording & { cell: string }>;

export const STATUS_ORDER = HOUR_STATUS_ORDER;

const MARK: Record<OccurrenceStatus, string> = {
  go: 'bg-st-workable text-deep',
  marginal: 'bg-st-marginal text-deep',
  no_go: 'bg-st-notworkable text-white',
  no_data: 'bg-st-nodata text-ink',
  information: 'bg-surface-2 text-ink',
};

/**
 * An occurrence of a recurring operation, judged on [start, start + TR): the colour of its mark
 * on the board (the colours of the hour statuses it sums up), with the word and the letter of the
 * product's one vocabulary (shared/status-words.ts: an occurrence is said as an hour is).
 */
export const OCCURRENCE_META = Object.fromEntries(
  (Object.keys(MARK) as OccurrenceStatus[]).map((s) => [s, { ...STATUS_WORDS[OCCURRENCE_STATUS_WORD[s]], mark: MARK[s] }]),
) as Record<OccurrenceStatus, StatusWording & { mark: string }>;

/** The limit named in words, as the e-mails say it (shared/limit-words.ts). */
export const limitWord = limitWords;

/** An instant as text in a time zone, e.g. 'Tue 3 Dec 14:00' (date-fns pattern). */
export const formatIn = formatAt;
export { zoneShort };

/** Calendar day key of an instant in a zone ('yyyy-MM-dd'). */
export const dayKey = (ms: number, zone: string) => format(ms, 'yyyy-MM-dd', { in: tz(zone) });

/**
 * A start time in the product's date style, always with day and month ("Thu 3 Dec 14:00"), the
 * year added when it is not the year of now.
 */
export function formatStart(instant: string | number, zone: string, nowMs: number): string {
  const ms = typeof instant === 'number' ? instant : Date.parse(instant);
  const sameYear = formatIn(ms, zone, 'yyyy') === formatIn(nowMs, zone, 'yyyy');
  return formatInstant(ms, zone, sameYear ? 'dateTime' : 'dateTimeYear');
}

/** How long ago (or ahead) an instant is, e.g. '35 min ago', '6 h ago', '2 days ago', 'in 3 h'. */
export function relativeTime(instantMs: number, nowMs: number): string {
  const minutes = Math.round((nowMs - instantMs) / 60_000);
  const ahead = minutes < 0;
  const m = Math.abs(minutes);
  let text: string;
  if (m < 1) return 'just now';
  if (m < 60) text = `${m} min`;
  else if (m < 48 * 60) text = `${Math.round(m / 60)} h`;
  else text = `${Math.round(m / 1440)} days`;
  return ahead ? `in ${text}` : `${text} ago`;
}

/** A number with its unit, or '–' when missing. */
export const fmt = fixedWithUnit;

/** Hours as words: '31 h', or '3 days 4 h' from 72 h on. */
export function formatHours(h: number): string {
  if (h < 72) return `${Math.round(h * 10) / 10} h`;
  const d = Math.floor(h / 24);
  const rest = Math.round(h - d * 24);
  return rest ? `${d} days ${rest} h` : `${d} days`;
}

/**
 * The transformation flags of a record in words (TRANSFORM_FLAG bits of shared/waves/transform.ts).
 * `depthLimitM` and `transferFactor` are quoted when known.
 */
export function flagWords(flags: number, detail: { depthLimitM?: number | null; transferFactor?: number | null } = {}): string[] {
  const out: string[] = [];
  if (flags & TRANSFORM_FLAG.MISSING_INPUT)
    out.push('Missing input at the data point (Hs, Tp or a needed direction): no worksite values this hour.');
  if (flags & TRANSFORM_FLAG.TRANSFER_TABLE)
    out.push(
      `Transfer table from the worksite's wave study used instead of refraction and shoaling${detail.transferFactor != null ? ` (factor ${detail.transferFactor.toFixed(3)})` : ''}.`,
    );
  if (flags & TRANSFORM_FLAG.LANDWARD)
    out.push('Sea from the landward side (angle of incidence 90° or more): shoaling only, Kr = 1, direction kept.');
  if (flags & TRANSFORM_FLAG.REFRACTION_SKIPPED)
    out.push(
      'Refraction skipped: the worksite is deeper than the data point for this wave (Snell would need sin θ ≥ 1), so Kr = 1 and the direction is kept.',
    );
  if (flags & TRANSFORM_FLAG.DEPTH_LIMITED)
    out.push(`Depth-limited: Hs capped at γb × d${detail.depthLimitM != null ? ` = ${detail.depthLimitM.toFixed(2)} m` : ''} (breaking).`);
  return out;
}

/** Direction 'coming from', degrees. */
export const fmtDir = (deg: number | null | undefined) =>
  deg === null || deg === undefined || !Number.isFinite(deg) ? '–' : `${Math.round(deg)}° from`;

/** A response limit in words (docs/domain.md#vessel-response): "Roll most probable max (3 h) ≤ 4 deg". */
export function responseLimitWords(l: {
  label: string;
  statistic: 'significant' | 'mpm';
  durationH: number;
  max: number;
  unit: string;
}): string {
  const stat = l.statistic === 'significant' ? 'significant' : `most probable max (${l.durationH} h)`;
  return `${l.label} ${stat} ≤ ${l.max} ${l.unit}`;
}
/** A current direction: degrees true the water flows towards (oceanographic convention, docs/domain.md#tide), so no "from". */
export const fmtTowards = (deg: number | null | undefined) =>
  deg === null || deg === undefined || !Number.isFinite(deg) ? '–' : `${Math.round(deg)}°`;
