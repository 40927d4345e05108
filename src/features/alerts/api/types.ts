// Response shapes of the alert routes, as the client reads them. The server's own types live in
// server/ and jobs/, which the client may not import, so the shapes are written out here.
import type { SubscriptionInput } from '../../../../shared/schemas/alerts';
import type { RecurrenceInput } from '../../../../shared/recurrence';

/** GET/PUT /api/projects/:projectId/subscription. `stored` false: the default (skippers: their assigned operations). */
export interface SubscriptionResponse extends SubscriptionInput {
  stored: boolean;
}

/** The kinds of change the planning job reports (shared/alerts/compare-plans.ts). */
export type AlertKind = 'window_opened' | 'window_lost' | 'earliest_moved' | 'start_now_changed' | 'occurrence_no_go';

/** What changed, as the job stored it; times ISO 8601 UTC, hours in h. */
export interface AlertDetails {
  start: string | null;
  end: string | null;
  /** window length, or the TR of an occurrence, h */
  hours: number | null;
  /** earliest start moved: the earliest start before the change */
  previous: string | null;
  startNow?: boolean;
  /** the engine's name of the limit that decided (hs, wind, ...), or null */
  reason?: string | null;
}

/** GET /api/projects/:projectId/alerts: one change found by a planning run. */
export interface AlertResponse {
  id: string;
  kind: AlertKind | string;
  operationId: string;
  siteId: string;
  message: string;
  details: AlertDetails;
  createdAt: string;
}

/** POST /api/projects/:projectId/replan: one project's part of a planning run. */
export interface ProjectJobResult {
  projectId: string;
  status: 'planned' | 'skipped' | 'failed';
  reason?: string;
  forecast?: { issuedAt: string; isNew: boolean } | null;
  /** number of operation × worksite plans */
  plans?: number;
  alerts?: { kind: AlertKind | string; operationId: string; siteId: string; start: string | null }[];
  /** alert e-mails written to the outbox */
  queued?: number;
}

export interface JobResult {
  startedAt: string;
  projects: ProjectJobResult[];
  /** e-mail delivery after planning (all projects): due, sent and failed now */
  mail: { due: number; sent: number; failed: number };
}

export type OutboxStatus = 'pending' | 'sent' | 'failed';

/** GET /api/projects/:projectId/outbox: an alert e-mail and its delivery. */
export interface OutboxRow {
  id: string;
  toEmail: string;
  subject: string;
  text: string;
  html: string;
  status: OutboxStatus;
  attempts: number;
  lastError: string | null;
  nextAttemptAt?: string;
  createdAt: string;
  sentAt: string | null;
}

/** GET/POST /api/me/calendar */
export interface CalendarFeedResponse {
  url: string | null;
}

/** An operation's recurrence as stored: the input plus its RFC 5545 text. */
export interface StoredRecurrence extends RecurrenceInput {
  text: string;
}

/** GET /api/dev/mailbox: one message the local mailbox received. */
export interface MailboxMessage {
  /** the local mailbox's running number */
  id: number | string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
  receivedAt: string;
}
