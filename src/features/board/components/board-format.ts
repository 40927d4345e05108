// Words, numbers and times of the watch board. Every time shown on the board is in the
// worksite's IANA time zone, through @date-fns/tz (`tz()` with date-fns `format`), never through
// hand-made offsets: days are the worksite's calendar days, and a daylight-saving change shows up
// as a repeated or missing hour label.
import { format } from 'date-fns';
import { tz } from '@date-fns/tz';
import { formatInstant } from '../../../../shared/dates';
import type { HourStatus, LimitCheck, OccurrenceStatus } from '../../../../shared/api-types-plan';
import { TRANSFORM_FLAG } from '../../../../shared/waves/transform';
import { fixedWithUnit, formatAt, zoneShort } from '../../../lib/format';

/** The status code of the board: our own colours, a letter and a pattern for each status. */
export const STATUS_META: Record<HourStatus, { word: string; letter: string; cell: string; explain: string }> = {
  workable: {
    word: 'workable',
    letter: 'W',
    cell: 'bg-st-workable text-deep',
    explain: 'every limit met, with the forecast limit OPWF on Hs',
  },
  marginal: {
    word: 'marginal',
    letter: 'M',
    cell: 'bg-st-marginal pattern-marginal text-deep',
    explain: 'met at the operation limit OPLIM, not at the forecast limit OPWF: not workable on this forecast',
  },
  not_workable: {
    word: 'not workable',
    letter: 'X',
    cell: 'bg-st-notworkable pattern-notworkable text-white',
    explain: 'at least one limit broken',
  },
  no_data: {
    word: 'no data',
    letter: '?',
    cell: 'bg-st-nodata pattern-nodata text-ink',
    explain: 'a value the limits need is missing: never counted as workable',
  },
};

export const STATUS_ORDER: HourStatus[] = ['workable', 'marginal', 'not_workable', 'no_data'];

/**
 * An occurrence of a recurring operation, judged on [start, start + TR): the word, the letter and
 * the colour of its mark on the board (the colours of the hour statuses it sums up).
 */
export const OCCURRENCE_META: Record<OccurrenceStatus, { word: string; letter: string; mark: string }> = {
  go: { word: 'go', letter: 'G', mark: 'bg-st-workable text-deep' },
  marginal: { word: 'marginal', letter: 'M', mark: 'bg-st-marginal text-deep' },
  no_go: { word: 'no-go', letter: 'X', mark: 'bg-st-notworkable text-white' },
  no_data: { word: 'no data', letter: '?', mark: 'bg-st-nodata text-ink' },
  information: { word: 'not weather-restricted (information)', letter: 'i', mark: 'bg-surface-2 text-ink' },
};

/** Plain words for the limit names the engine reports as the limiting factor. */
export const LIMIT_WORDS: Record<LimitCheck['limit'], string> = {
  hs: 'Hs',
  hsTpCurve: 'the Hs-Tp curve',
  tpMin: 'Tp min',
  tpMax: 'Tp max',
  tpBand: 'an excluded Tp band',
  bedVelocity: 'bed velocity',
  wind: 'wind',
  minDepth: 'min depth',
  maxDepth: 'max depth',
  current: 'current',
  tideWindow: 'the tide window',
};

export function limitWord(name: string | null | undefined): string | null {
  if (!name) return null;
  return (LIMIT_WORDS as Record<string, string>)[name] ?? name;
}

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
  if (flags & TRANSFORM_FLAG.MISSING_INPUT) out.push('Missing input at the data point (Hs, Tp or a needed direction): no worksite values this hour.');
  if (flags & TRANSFORM_FLAG.TRANSFER_TABLE)
    out.push(`Transfer table from the worksite's wave study used instead of refraction and shoaling${detail.transferFactor != null ? ` (factor ${detail.transferFactor.toFixed(3)})` : ''}.`);
  if (flags & TRANSFORM_FLAG.LANDWARD) out.push('Sea from the landward side (angle of incidence 90° or more): shoaling only, Kr = 1, direction kept.');
  if (flags & TRANSFORM_FLAG.REFRACTION_SKIPPED) out.push('Refraction skipped: the worksite is deeper than the data point for this wave (Snell would need sin θ ≥ 1), so Kr = 1 and the direction is kept.');
  if (flags & TRANSFORM_FLAG.DEPTH_LIMITED)
    out.push(`Depth-limited: Hs capped at γb × d${detail.depthLimitM != null ? ` = ${detail.depthLimitM.toFixed(2)} m` : ''} (breaking).`);
  return out;
}

/** Direction 'coming from', degrees. */
export const fmtDir = (deg: number | null | undefined) => (deg === null || deg === undefined || !Number.isFinite(deg) ? '–' : `${Math.round(deg)}° from`);
