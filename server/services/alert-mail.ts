import crypto from 'node:crypto';
import { formatInstant } from '../../shared/dates';
import type { PlanChange, PlanSummary } from '../../shared/alerts/compare-plans';
import { limitWords } from '../../shared/limit-words';
import {
  CHANCE_WORDS,
  START_WORDS,
  capitalised,
  chancePercent,
  ifStartedWords,
  statusLabel,
  STATUS_WORDS,
} from '../../shared/status-words';
import { renderMail } from '../mail/message';

/** A time in the worksite's zone, short and readable on a phone: "Tue 3 Dec 14:00". */
export function localTime(instant: string | number, timeZone: string): string {
  return formatInstant(instant, timeZone, 'dateTime');
}

export interface ChangeWithReason extends PlanChange {
  /** The limit that decides in the new plan (window lost, occurrence no-go). */
  reason?: string | null;
}

const sentence = capitalised;

/** "from Thu 3 Dec 15:00 to Thu 3 Dec 20:00" (or "at …" when only one start is left). */
function startsWords(c: ChangeWithReason, timeZone: string): string {
  const from = c.usableFrom ?? c.start!;
  const last = c.lastStart ?? null;
  if (last === null) return `from ${localTime(from, timeZone)}`;
  return from === last ? `only at ${localTime(from, timeZone)}` : `from ${localTime(from, timeZone)} to ${localTime(last, timeZone)}`;
}

export function describeChange(c: ChangeWithReason, p: PlanSummary): string {
  const z = p.timeZone;
  const span = c.start && c.end ? `${localTime(c.start, z)} to ${localTime(c.end, z)} (${c.hours} h)` : '';
  const why = c.reason ? `, limited by ${limitWords(c.reason)}` : '';
  switch (c.kind) {
    case 'window_opened':
      return `${sentence(START_WORDS.newWindow)}: ${span}. TR is ${p.tr} h: starts possible ${startsWords(c, z)}.`;
    case 'window_lost':
      return `${sentence(START_WORDS.windowLost)}: ${span} is no longer ${STATUS_WORDS.workable.word} for ${p.tr} h${why}.`;
    case 'earliest_moved':
      return `${sentence(START_WORDS.earliestMoved)} from ${localTime(c.previous!, z)} to ${localTime(c.start!, z)}.`;
    case 'start_now_changed':
      return c.startNow
        ? `${sentence(START_WORDS.startNow)}: the next TR hours are ${STATUS_WORDS.workable.word}.`
        : `${sentence(START_WORDS.noLongerStartNow)}${why}.`;
    case 'occurrence_no_go':
      return `${statusLabel('not_workable')}: the ${localTime(c.start!, z)} occurrence over its TR of ${p.tr} h${why}.`;
    case 'window_chance_fell':
      return `${sentence(CHANCE_WORDS.fellBelow)} ${chancePercent(c.threshold)}: the window ${span} now has a ${CHANCE_WORDS.window} of ${chancePercent(c.chance)} (was ${chancePercent(c.previousChance)}). The plan still counts it ${STATUS_WORDS.workable.word}; the ensemble doubts it.`;
  }
}

/** A change in a few words, for the subject line a phone shows. */
export function shortChange(c: ChangeWithReason, timeZone: string): string {
  switch (c.kind) {
    case 'window_opened':
      return `${START_WORDS.newWindow}, starts from ${localTime(c.usableFrom ?? c.start!, timeZone)}`;
    case 'window_lost':
      return `${START_WORDS.windowLost} (${localTime(c.start!, timeZone)})`;
    case 'earliest_moved':
      return `earliest start now ${localTime(c.start!, timeZone)}`;
    case 'start_now_changed':
      return c.startNow ? START_WORDS.startNow : START_WORDS.noLongerStartNow;
    case 'occurrence_no_go':
      return `${STATUS_WORDS.not_workable.word} at ${localTime(c.start!, timeZone)}`;
    case 'window_chance_fell':
      return `${CHANCE_WORDS.fellBelow} ${chancePercent(c.threshold)} (${localTime(c.start!, timeZone)})`;
  }
}

/**
 * Stored e-mails carry this mark where the recipient's unsubscribe link goes; delivery puts a
 * fresh signed link there (server/services/outbox.ts), so the outbox, which coordinators read,
 * never holds a working link, and a link's validity counts from when it was sent.
 */
export const UNSUBSCRIBE_LINK_MARK = '{{unsubscribe-link}}';
/** Days an unsubscribe link works after its e-mail is sent. */
export const UNSUBSCRIBE_LINK_DAYS = 60;

/** Signed unsubscribe link: HMAC-SHA256 over the user, the project and the expiry (Unix seconds). */
export function unsubscribeToken(secret: string, userId: string, projectId: string, expiresSec: number): string {
  return crypto.createHmac('sha256', secret).update(`unsubscribe:${userId}:${projectId}:${expiresSec}`).digest('base64url');
}

/** The one-click unsubscribe address for one recipient and project, valid UNSUBSCRIBE_LINK_DAYS days from `nowMs`. */
export function unsubscribeUrl(baseUrl: string, secret: string, userId: string, projectId: string, nowMs: number): string {
  const e = Math.floor(nowMs / 1000) + UNSUBSCRIBE_LINK_DAYS * 86_400;
  const q = new URLSearchParams({ u: userId, p: projectId, e: String(e), sig: unsubscribeToken(secret, userId, projectId, e) });
  return `${baseUrl}/api/unsubscribe?${q}`;
}

/** 'ok', or why a link is refused: a bad signature, or past its expiry. */
export function verifyUnsubscribe(
  secret: string,
  userId: string,
  projectId: string,
  expires: string,
  sig: string,
  nowMs: number,
): 'ok' | 'invalid' | 'expired' {
  if (!/^\d{1,12}$/.test(expires)) return 'invalid';
  const expected = Buffer.from(unsubscribeToken(secret, userId, projectId, Number(expires)));
  const given = Buffer.from(sig);
  if (expected.length !== given.length || !crypto.timingSafeEqual(expected, given)) return 'invalid';
  return Number(expires) * 1000 < nowMs ? 'expired' : 'ok';
}

/**
 * The next start still possible in the new plan, with its date, for the subject line: "may start
 * now", "next start Thu 3 Dec 15:00", or "no start possible in this forecast".
 */
export function nextStartWords(plan: PlanSummary): string {
  if (plan.startNow) return START_WORDS.startNow;
  if (plan.earliestStart) return `${START_WORDS.nextStart} ${localTime(plan.earliestStart, plan.timeZone)}`;
  return START_WORDS.noStart;
}

/**
 * When work begun at the plan's next start ends (shared/status-words.ts `finishWords`): "If started at
 * Tue 8 Dec 01:00: planned finish Wed 9 Dec 13:00, contingency to Thu 10 Dec 01:00."; null without
 * a start or without TPOP (a plan run stored before it was kept).
 */
export function finishLine(plan: PlanSummary): string | null {
  if (!plan.earliestStart || plan.tpop === undefined) return null;
  const z = plan.timeZone;
  return `${ifStartedWords(Date.parse(plan.earliestStart), plan.tpop, plan.tr, (ms) => localTime(ms, z))}.`;
}

/**
 * One e-mail for one recipient about one operation at one worksite. The subject names the
 * project, the operation and worksite, the next start still possible (with its date) and what
 * changed.
 */
export async function alertEmail(args: {
  plan: PlanSummary;
  changes: ChangeWithReason[];
  projectName: string;
  boardUrl: string;
  unsubscribeUrl: string;
}): Promise<{ subject: string; text: string; html: string }> {
  const { plan, changes } = args;
  const more = changes.length > 1 ? ` (+${changes.length - 1} more)` : '';
  const headline = `${shortChange(changes[0], plan.timeZone)}${more}`;
  const subject = `${args.projectName}: ${plan.operationName} at ${plan.siteName}, ${nextStartWords(plan)} (${headline})`;
  const finish = finishLine(plan);
  const parts = await renderMail({
    heading: `${plan.operationName} at ${plan.siteName}`,
    subheading: `${args.projectName} · times are ${plan.timeZone}`,
    textHead: [`${plan.operationName} at ${plan.siteName} (${args.projectName})`, `Times are ${plan.timeZone}.`],
    points: [...changes.map((c) => describeChange(c, plan)), ...(finish ? [finish] : [])],
    action: { label: 'Open the watch board', textLabel: 'Board', url: args.boardUrl },
    unsubscribeUrl: args.unsubscribeUrl,
  });
  return { subject, ...parts };
}
