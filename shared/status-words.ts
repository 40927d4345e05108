/**
 * The one set of status words and letters: the board and its key, the alert e-mails, the daily
 * digest and the calendar feed all take theirs from here, so a crew reads the same word and the
 * same letter for a status wherever it appears (docs/domain.md#hourly-status).
 *
 * An occurrence of a recurring operation is judged over its TR (docs/domain.md#weather-restricted)
 * and said in the same words as an hour: "workable" when every hour of its TR is workable (the
 * engine's `go`), "not workable" when one is not (`no_go`), and so on. An operation that is not
 * weather-restricted gets "not weather-restricted" instead of a verdict.
 */
import type { HourStatus, OccurrenceStatus } from './api-types-plan';

export type StatusWord = HourStatus | 'information';

export interface StatusWording {
  /** The word in running text, lower case: "not workable". */
  word: string;
  /** One character beside the colour, so the status reads without colour. */
  letter: string;
  /** What it means, for the board's key. */
  explain: string;
}

export const STATUS_WORDS: Record<StatusWord, StatusWording> = {
  workable: { word: 'workable', letter: 'W', explain: 'every limit met, with the forecast limit OPWF on Hs' },
  marginal: {
    word: 'marginal',
    letter: 'M',
    explain: 'met at the operation limit OPLIM, not at the forecast limit OPWF: not workable on this forecast',
  },
  not_workable: { word: 'not workable', letter: 'X', explain: 'at least one limit broken' },
  no_data: { word: 'no data', letter: '?', explain: 'a value the limits need is missing: never counted as workable' },
  information: { word: 'not weather-restricted', letter: 'i', explain: 'the operation has no weather limits: shown for information' },
};

/** The hour statuses in the order of the board's key. */
export const HOUR_STATUS_ORDER: HourStatus[] = ['workable', 'marginal', 'not_workable', 'no_data'];

/** An occurrence's status in the words of an hour's (see the module comment). */
export const OCCURRENCE_STATUS_WORD: Record<OccurrenceStatus, StatusWord> = {
  go: 'workable',
  marginal: 'marginal',
  no_go: 'not_workable',
  no_data: 'no_data',
  information: 'information',
};

/** The verdicts an occurrence of a weather-restricted operation can get, in running text. */
export const OCCURRENCE_VERDICTS = `${STATUS_WORDS.workable.word}, ${STATUS_WORDS.marginal.word} or ${STATUS_WORDS.not_workable.word}`;

/** Words with a capital first letter, to start a sentence or a line. */
export const capitalised = (s: string) => s[0].toUpperCase() + s.slice(1);

/** The letter and the word, as a label: "X Not workable". */
export function statusLabel(status: StatusWord): string {
  return `${STATUS_WORDS[status].letter} ${capitalised(STATUS_WORDS[status].word)}`;
}

/** An occurrence's label: "X Not workable" for `no_go`. */
export const occurrenceLabel = (status: OccurrenceStatus) => statusLabel(OCCURRENCE_STATUS_WORD[status]);

/**
 * Whether and when an operation may start, in the alerts, the digest and on screen. `nextStart`
 * and `nextWindow` are followed by a date.
 */
export const START_WORDS = {
  startNow: 'may start now',
  noLongerStartNow: 'may no longer start now',
  nextStart: 'next start',
  noStart: 'no start possible in this forecast',
  nextWindow: 'next window',
  noWindow: 'no window in this forecast',
  newWindow: 'new window',
  windowLost: 'window lost',
  earliestMoved: 'earliest start moved',
  nextOccurrence: 'next occurrence',
} as const;

const MS_PER_HOUR = 3_600_000;

/**
 * When work begun at a go-start ends, the same words on the board and in the e-mails (lower case, to
 * start a sentence capitalise it): planned at
 * go-start + TPOP, at the latest (contingency used up) at go-start + TR. The go-start holds
 * [go-start, go-start + TR) workable (docs/domain.md#weather-windows), so both fall inside the
 * window. `when` writes an instant in the reader's words (date, time, zone as the page or e-mail has them).
 */
export function finishWords(goStartMs: number, tpopH: number, trH: number, when: (ms: number) => string): string {
  return `planned finish ${finishSpan(goStartMs, tpopH, trH, when)}`;
}

/** {@link finishWords} of a go-start that has not come yet: "If started at Tue 8 Dec 01:00: planned finish …". */
export function ifStartedWords(goStartMs: number, tpopH: number, trH: number, when: (ms: number) => string): string {
  return `If started at ${when(goStartMs)}: ${finishWords(goStartMs, tpopH, trH, when)}`;
}

/** {@link finishWords} without its label, for a field already labelled "Planned finish": "Wed 9 Dec 13:00, contingency to Thu 10 Dec 01:00". */
export function finishSpan(goStartMs: number, tpopH: number, trH: number, when: (ms: number) => string): string {
  const planned = when(goStartMs + tpopH * MS_PER_HOUR);
  return trH > tpopH ? `${planned}, contingency to ${when(goStartMs + trH * MS_PER_HOUR)}` : planned;
}

/**
 * Ensemble chances in words (docs/domain.md#forecast-uncertainty), the same on the board, in the
 * chain and in the alerts: a whole percentage of the runs (control and members).
 */
export const CHANCE_WORDS = {
  /** Beside an hour: "chance workable 62 %". */
  hour: 'chance workable',
  /** Beside a window: "chance to hold TR 48 %". */
  window: 'chance to hold TR',
  /** An alert when a window's chance drops below the subscriber's threshold. */
  fellBelow: 'window chance fell below',
} as const;

/** A chance 0-1 as a whole percentage: "62 %" (null: "no ensemble"). */
export function chancePercent(chance: number | null | undefined): string {
  return chance === null || chance === undefined ? 'no ensemble' : `${Math.round(chance * 100)} %`;
}
