import ical from 'ical-generator';

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
