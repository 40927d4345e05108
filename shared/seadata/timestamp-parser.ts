/**
 * Timestamps of CSV sea-state files to UTC milliseconds.
 *
 * Accepted forms (blanks around the text are ignored; `T` or one or more blanks between date
 * and time; seconds and a fraction of a second are optional; a date alone means 00:00):
 * - ISO 8601 with an offset: `2020-01-31T06:00Z`, `2020-01-31 06:00:00+01:00`, `...+0100`,
 *   `...+01`, or a trailing ` UTC`/` GMT`. The offset in the text wins over the zone option.
 * - Year first without an offset: `2020-01-31 06:00[:ss]`, `2020/01/31 06:00`, `2020.01.31 06:00`.
 * - Year last: `31.01.2020 06:00` (dots: always day first, the European convention) and
 *   `31/01/2020 06:00` or `31-01-2020 06:00` only with an explicit `dateOrder` ('dmy' or
 *   'mdy'): 01/02/2020 is 1 February in Europe and January 2 in the US, so without the option
 *   such a row is refused as ambiguous rather than guessed. (`previewCsv` suggests the order
 *   when the first rows decide it, e.g. a day above 12.)
 *
 * Times without an offset are wall-clock times in `timeZone` (IANA name, default 'UTC'). The
 * zone's offsets come from the runtime's zone database through `tzOffset` of @date-fns/tz (no
 * offsets are written here). At a daylight-saving change:
 * - a wall time in the spring-forward gap (e.g. 02:30 on 26 March 2023 in Europe/Oslo) does not
 *   exist and is refused;
 * - a wall time in the fall-back overlap (02:00-02:59 on 29 October 2023 in Europe/Oslo) occurs
 *   twice: the earlier instant (summer time) is taken, unless the previous accepted record is
 *   already at or after it, then the later one (winter time). So an hourly local series
 *   01:00, 02:00, 02:00, 03:00 reads as four consecutive UTC hours.
 * Offsets are assumed constant over a local day unless they differ 1.5 days before and 2.5 days
 * after it (no zone changes its offset twice within four days); days that straddle a change are
 * resolved exactly.
 */
import { tzOffset } from '@date-fns/tz';
import { isValidTimeZone } from './time-zone';

/** Day order of year-last dates with '/' or '-' separators. */
export const DATE_ORDERS = ['dmy', 'mdy'] as const;
export type DateOrder = (typeof DATE_ORDERS)[number];

export interface TimestampOptions {
  /** IANA zone of timestamps without an offset; default 'UTC'. */
  timeZone?: string;
  /** Day order of year-last dates with '/' or '-'; without it they are refused as ambiguous. */
  dateOrder?: DateOrder;
}

const DAY_MS = 86_400_000;
// Years accepted: instrumental sea-state records and hindcasts start in the 20th century; the
// bounds only catch typos and keep Date.UTC away from its two-digit-year mapping.
const MIN_YEAR = 1800;
const MAX_YEAR = 2300;
const TIME_PART = String.raw`(?:(?:[Tt]|\s+)(\d{1,2}):(\d{2})(?::(\d{2})(?:[.,](\d{1,9}))?)?)?`;
const ZONE_PART = String.raw`\s*(Z|z|UTC|GMT|[+-]\d{2}(?::?\d{2})?)?`;
// Year first: 2020-01-31, 2020/01/31 or 2020.01.31 (same separator twice).
const YEAR_FIRST = new RegExp(String.raw`^(\d{4})([-/.])(\d{1,2})\2(\d{1,2})${TIME_PART}${ZONE_PART}$`);
// Year last: 31.01.2020, 31/01/2020, 01-31-2020.
const YEAR_LAST = new RegExp(String.raw`^(\d{1,2})([-/.])(\d{1,2})\2(\d{4})${TIME_PART}${ZONE_PART}$`);

function daysInMonth(year: number, month: number): number {
  return new Date(Date.UTC(year, month, 0)).getUTCDate();
}

const UTC_NAMES = new Set(['UTC', 'Etc/UTC', 'GMT', 'Etc/GMT', 'Etc/Universal', 'Universal', 'Zulu', 'Etc/Zulu']);

/**
 * Parses timestamps of one file. Keeps per-day offset caches, so one parser per file.
 * `parse` returns NaN when the text is refused; `error` then says why.
 */
export class TimestampParser {
  /** Why the last `parse` returned NaN ('' after a success). */
  error = '';
  private readonly zone: string;
  private readonly isUtc: boolean;
  private readonly dateOrder: DateOrder | undefined;
  // Per local (wall-clock) day: the zone offset in minutes, or NaN when the day straddles a change.
  private readonly dayOffset = new Map<number, number>();

  /** @throws RangeError for an unknown time zone. */
  constructor(options: TimestampOptions = {}) {
    this.zone = options.timeZone ?? 'UTC';
    if (!isValidTimeZone(this.zone)) throw new RangeError(`unknown time zone: ${this.zone}`);
    this.isUtc = UTC_NAMES.has(this.zone);
    this.dateOrder = options.dateOrder;
  }

  /**
   * @param text the timestamp text.
   * @param previousMs the previous accepted record's time (UTC ms, NaN if none), used only to
   *   resolve a wall time that occurs twice at a fall-back change.
   * @returns UTC ms, or NaN (see `error`).
   */
  parse(text: string, previousMs = NaN): number {
    const s = text.trim();
    let year: number;
    let month: number;
    let day: number;
    let m = YEAR_FIRST.exec(s);
    if (m !== null) {
      year = +m[1];
      month = +m[3];
      day = +m[4];
    } else {
      m = YEAR_LAST.exec(s);
      if (m === null) {
        this.error = s === '' ? 'missing time' : 'unparseable time';
        return NaN;
      }
      const a = +m[1];
      const b = +m[3];
      year = +m[4];
      const order: DateOrder | undefined = m[2] === '.' ? 'dmy' : this.dateOrder;
      if (order === undefined) {
        this.error = 'ambiguous date: day/month order unknown (choose DD/MM/YYYY or MM/DD/YYYY)';
        return NaN;
      }
      day = order === 'dmy' ? a : b;
      month = order === 'dmy' ? b : a;
    }
    const hour = m[5] === undefined ? 0 : +m[5];
    const minute = m[6] === undefined ? 0 : +m[6];
    const second = m[7] === undefined ? 0 : +m[7];
    const ms = m[8] === undefined ? 0 : Math.floor(+`0.${m[8]}` * 1000);
    if (month < 1 || month > 12 || day < 1 || day > daysInMonth(year, month) || hour > 23 || minute > 59 || second > 59) {
      this.error = 'invalid date or time of day';
      return NaN;
    }
    if (year < MIN_YEAR || year > MAX_YEAR) {
      this.error = `year outside ${MIN_YEAR}-${MAX_YEAR}`;
      return NaN;
    }
    const wall = Date.UTC(year, month - 1, day, hour, minute, second, ms);
    const zone = m[9];
    if (zone !== undefined) {
      this.error = '';
      if (zone === 'Z' || zone === 'z' || zone === 'UTC' || zone === 'GMT') return wall;
      const sign = zone[0] === '-' ? -1 : 1;
      const oh = +zone.slice(1, 3);
      const om = zone.length > 3 ? +zone.slice(zone.length - 2) : 0;
      if (oh > 23 || om > 59) {
        this.error = 'invalid UTC offset';
        return NaN;
      }
      return wall - sign * (oh * 60 + om) * 60_000;
    }
    return this.fromWallTime(wall, previousMs);
  }

  /** UTC ms of a wall-clock time (given as if it were UTC) in this parser's zone. */
  private fromWallTime(wall: number, previousMs: number): number {
    this.error = '';
    if (this.isUtc) return wall;
    const dayKey = Math.floor(wall / DAY_MS);
    let offset = this.dayOffset.get(dayKey);
    if (offset === undefined) {
      const dayStart = dayKey * DAY_MS;
      const before = tzOffset(this.zone, new Date(dayStart - 1.5 * DAY_MS));
      const after = tzOffset(this.zone, new Date(dayStart + 2.5 * DAY_MS));
      offset = before === after ? before : NaN;
      if (this.dayOffset.size > 200_000) this.dayOffset.clear();
      this.dayOffset.set(dayKey, offset);
    }
    if (!Number.isNaN(offset)) return wall - offset * 60_000;
    // A day near an offset change: try each offset in force around it.
    const candidates: number[] = [];
    for (const dt of [-1.5 * DAY_MS, 2.5 * DAY_MS]) {
      const o = tzOffset(this.zone, new Date(wall + dt));
      const t = wall - o * 60_000;
      if (tzOffset(this.zone, new Date(t)) === o && !candidates.includes(t)) candidates.push(t);
    }
    if (candidates.length === 0) {
      this.error = `local time does not exist in ${this.zone} (clocks were put forward)`;
      return NaN;
    }
    if (candidates.length === 1) return candidates[0];
    candidates.sort((x, y) => x - y);
    // Occurs twice (clocks put back): the first occurrence unless the series has passed it.
    return !Number.isNaN(previousMs) && previousMs >= candidates[0] ? candidates[1] : candidates[0];
  }
}

/**
 * Suggests the day order of year-last dates with '/' or '-' from sample timestamps: 'dmy' when
 * some first number exceeds 12 and no second one does, 'mdy' in the opposite case, undefined when
 * the samples do not decide it (or contradict each other).
 * @example suggestDateOrder(['01/02/2020 00:00', '13/02/2020 00:00']) // 'dmy'
 */
export function suggestDateOrder(samples: readonly string[]): DateOrder | undefined {
  let dayFirst = false;
  let monthFirst = false;
  for (const s of samples) {
    const m = YEAR_LAST.exec(s.trim());
    if (m === null || m[2] === '.') continue;
    if (+m[1] > 12) dayFirst = true;
    if (+m[3] > 12) monthFirst = true;
  }
  if (dayFirst === monthFirst) return undefined;
  return dayFirst ? 'dmy' : 'mdy';
}
