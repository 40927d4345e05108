import ical from 'ical-generator';
import { formatInstant } from '../../shared/dates';
import { ifStartedWords } from '../../shared/status-words';

export interface CalendarEvent {
  uid: string;
  start: Date;
  end: Date;
  summary: string;
  description: string;
  url?: string;
}

/** An iCalendar (RFC 5545) document of events in UTC, through the ical-generator package. */
export function icsDocument(name: string, events: CalendarEvent[]): string {
  const cal = ical({ name, prodId: { company: 'Lullwatch', product: 'weather-windows', language: 'EN' } });
  for (const e of events) {
    cal.createEvent({ id: e.uid, start: e.start, end: e.end, summary: e.summary, description: e.description, url: e.url, timezone: 'UTC' });
  }
  return cal.toString();
}

/**
 * A window event's finish, in the worksite's zone: "If started at Tue 8 Dec 01:00: planned finish
 * Wed 9 Dec 13:00, contingency to Thu 10 Dec 01:00 (Europe/London)." (shared/status-words.ts).
 */
export function windowFinishSentence(windowStart: string, tpopH: number, trH: number, timeZone: string): string {
  return `${ifStartedWords(Date.parse(windowStart), tpopH, trH, (ms) => formatInstant(ms, timeZone, 'dateTime'))} (${timeZone}).`;
}
