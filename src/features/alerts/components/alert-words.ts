// An alert in words, as a crew reads it: a headline, the times in the worksite's zone, and the
// limiting factor when the change is a loss. The wording follows the alert e-mails.
import type { AlertDetails, AlertKind } from '../api/types';
import { STATUS_WORDS } from '../../../../shared/status-words';
import { hoursText, limitWords, timeIn } from './format';

const NOT_WORKABLE = STATUS_WORDS.not_workable;

export type AlertTone = 'good' | 'bad' | 'moved';

export interface AlertText {
  headline: string;
  /** one letter beside the colour, so the list reads without colour */
  mark: string;
  tone: AlertTone;
  body: string;
}

/**
 * @param kind the change kind
 * @param d the change's details (times ISO UTC, hours h)
 * @param timeZone the worksite's IANA zone the times are shown in
 * @param trH the operation's reference period TR, h, when known
 */
export function alertText(kind: AlertKind | string, d: AlertDetails, timeZone: string, trH: number | null): AlertText {
  const span = d.start && d.end ? `${timeIn(d.start, timeZone)} to ${timeIn(d.end, timeZone)} (${hoursText(d.hours)})` : '';
  const why = limitWords(d.reason) ? `, limited by ${limitWords(d.reason)}` : '';
  const tr = trH !== null ? ` TR is ${hoursText(trH)}.` : '';
  switch (kind) {
    case 'window_opened':
      return { headline: 'New window', mark: '+', tone: 'good', body: `${span}.${tr}` };
    case 'window_lost':
      return {
        headline: 'Window lost',
        mark: '−',
        tone: 'bad',
        body: `${span} is no longer workable${trH !== null ? ` for ${hoursText(trH)}` : ''}${why}.`,
      };
    case 'earliest_moved': {
      const shift = d.start && d.previous ? (Date.parse(d.start) - Date.parse(d.previous)) / 3_600_000 : null;
      const dir = shift === null ? '' : ` (${shift > 0 ? 'later' : 'earlier'} by ${hoursText(Math.abs(shift))})`;
      return {
        headline: 'Earliest start moved',
        mark: '→',
        tone: 'moved',
        body: `From ${timeIn(d.previous, timeZone)} to ${timeIn(d.start, timeZone)}${dir}.`,
      };
    }
    case 'start_now_changed':
      return d.startNow
        ? { headline: 'May start now', mark: '+', tone: 'good', body: `The next TR hours are workable.${tr}` }
        : { headline: 'May no longer start now', mark: '−', tone: 'bad', body: `The next TR hours are not all workable${why}.${tr}` };
    case 'occurrence_no_go':
      return {
        headline: `Occurrence ${NOT_WORKABLE.word}`,
        mark: NOT_WORKABLE.letter,
        tone: 'bad',
        body: `The ${timeIn(d.start, timeZone)} occurrence is ${NOT_WORKABLE.word} over its TR of ${hoursText(d.hours ?? trH)}${why}.`,
      };
    default:
      return { headline: String(kind).replace(/_/g, ' '), mark: '•', tone: 'moved', body: span };
  }
}

export const TONE_CLASS: Record<AlertTone, string> = {
  good: 'bg-st-workable text-white',
  bad: 'bg-danger text-white',
  moved: 'bg-st-marginal text-deep',
};

/** Short words for a change kind (re-plan summary). */
export const KIND_WORDS: Record<string, string> = {
  window_opened: 'New window',
  window_lost: 'Window lost',
  earliest_moved: 'Earliest start moved',
  start_now_changed: '“May start now” changed',
  occurrence_no_go: `Occurrence ${STATUS_WORDS.not_workable.word}`,
};
