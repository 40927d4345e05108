/**
 * Input schemas of the downtime schedule: campaigns (ordered steps, each an operation at a
 * worksite) and the confirmation of a downtime-ledger day (docs/domain.md#hindcast-statistics).
 * The server parses bodies and queries with them; the client forms reuse them, so both refuse the
 * same values with the same messages.
 */
import { z } from 'zod';
import { LIMIT_NAME_LIST } from '../engine/types';
import { canonicalTimeZone } from './site-fields';
import { longText, nameText, patchSchema } from './common';

/** Most steps a campaign may have. */
export const CAMPAIGN_MAX_STEPS = 50;

/** Most days one ledger proposal or listing may span (a quarter and a bit). */
export const LEDGER_MAX_DAYS = 93;

/**
 * Most hours one ledger day may hold: the planned hours of a day are its real length in the
 * worksite's time zone, 23 to 25 h on daylight-saving change days (see shared/ledger/days.ts).
 */
export const LEDGER_MAX_DAY_HOURS = 25;

/** Limiting factors a ledger day may name: the engine's limit names, or no data. */
export const LEDGER_LIMITING_VALUES = [...LIMIT_NAME_LIST, 'noData'] as const;
export type LedgerLimiting = (typeof LEDGER_LIMITING_VALUES)[number];

/** Words for each limiting factor, for tables and the report. */
export const LEDGER_LIMITING_LABELS: Record<LedgerLimiting, string> = {
  hs: 'Hs',
  hsTpCurve: 'Hs–Tp curve',
  tpMin: 'Tp min',
  tpMax: 'Tp max',
  tpBand: 'Tp band',
  bedVelocity: 'Bed velocity',
  wind: 'Wind',
  minDepth: 'Min depth',
  maxDepth: 'Max depth',
  current: 'Current',
  tideWindow: 'Tide window',
  hsTarget: 'Hs (partition)',
  response: 'Vessel response',
  noData: 'No data',
};

const uuid = (what: string) => z.string({ error: `${what} is required` }).uuid(`must be ${what === 'operation' ? 'an' : 'a'} ${what} id`);

/** One campaign step: an operation at one of its worksites. */
export const CampaignStepInput = z.object({
  operationId: uuid('operation'),
  siteId: uuid('worksite'),
});
export type CampaignStepInput = z.infer<typeof CampaignStepInput>;

/** An IANA time zone, returned as the runtime spells it ('utc' -> 'UTC'). */
export const timeZoneInput = z
  .string()
  .trim()
  .transform((s, ctx) => {
    const zone = canonicalTimeZone(s);
    if (!zone) {
      ctx.addIssue({ code: 'custom', message: 'must be an IANA time zone such as Europe/London or UTC' });
      return z.NEVER;
    }
    return zone;
  });

const campaignFields = {
  name: nameText(),
  steps: z
    .array(CampaignStepInput, { error: 'steps must be a list' })
    .min(1, 'a campaign needs at least one step')
    .max(CAMPAIGN_MAX_STEPS, `a campaign has at most ${CAMPAIGN_MAX_STEPS} steps`),
  /** Planned start, ISO 8601 with offset; null = none. Sets the calendar dates of the finish estimates. */
  plannedStart: z.iso.datetime({ offset: true, error: 'must be an ISO 8601 time, e.g. 2027-04-01T00:00:00Z' }).nullable(),
  /** Zone of the simulated start dates (the 1st at 00:00); UTC by default (docs/domain.md#convention-15). */
  timeZone: timeZoneInput,
  /** The finish date promised in the plan, ISO 8601 with offset; null = none. Drawn on the outlook chart. */
  plannedFinish: z.iso.datetime({ offset: true, error: 'must be an ISO 8601 time, e.g. 2027-06-30T00:00:00Z' }).nullable(),
};

/** POST /api/projects/:projectId/campaigns */
export const CampaignInput = z.object({
  ...campaignFields,
  plannedStart: campaignFields.plannedStart.optional().default(null),
  timeZone: campaignFields.timeZone.optional().default('UTC'),
  plannedFinish: campaignFields.plannedFinish.optional().default(null),
});
export type CampaignInput = z.infer<typeof CampaignInput>;
/** What a form holds before parsing (defaults not yet applied). */
export type CampaignFormValues = z.input<typeof CampaignInput>;

/** PATCH /api/projects/:projectId/campaigns/:campaignId: any subset; `steps` replaced whole. */
export const CampaignPatchInput = patchSchema(campaignFields);
export type CampaignPatchInput = z.infer<typeof CampaignPatchInput>;

const isoTime = z.iso.datetime({ offset: true, error: 'must be an ISO 8601 time, e.g. 2027-04-03T14:00:00Z' });

/**
 * PATCH /api/projects/:projectId/campaigns/:campaignId/steps/:index: a step's progress with its
 * actual times. Without `doneAt`, 'done' takes the end from the confirmed ledger days when they
 * show the step's TPOP worked; without `startedAt`, 'started' starts now.
 */
export const StepProgressInput = z.object({
  status: z.enum(['planned', 'started', 'done'], { error: "must be 'planned', 'started' or 'done'" }),
  startedAt: isoTime.optional(),
  doneAt: isoTime.optional(),
});
export type StepProgressInput = z.infer<typeof StepProgressInput>;

/** `?alpha=true|false` of the outlook (default true: the forecast's go-starts with alpha). */
export const OutlookQuery = z.object({
  alpha: z
    .enum(['true', 'false'], { error: "must be 'true' or 'false'" })
    .default('true')
    .transform((v) => v === 'true'),
});

/** A calendar date YYYY-MM-DD that exists. */
export const isoDay = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'must be a date YYYY-MM-DD')
  .refine((s) => {
    const [y, m, d] = s.split('-').map(Number);
    const t = new Date(Date.UTC(y, m - 1, d));
    return t.getUTCFullYear() === y && t.getUTCMonth() === m - 1 && t.getUTCDate() === d && y >= 1900 && y <= 2200;
  }, 'is not a calendar date');

/** Days between two YYYY-MM-DD dates (to - from), whole days. */
export function daysBetween(from: string, to: string): number {
  const ms = (s: string) => Date.UTC(Number(s.slice(0, 4)), Number(s.slice(5, 7)) - 1, Number(s.slice(8, 10)));
  return Math.round((ms(to) - ms(from)) / 86_400_000);
}

/** `?from=YYYY-MM-DD&to=YYYY-MM-DD`, both inclusive, in each worksite's time zone. */
export const LedgerRangeQuery = z
  .object({ from: isoDay, to: isoDay })
  .refine((q) => q.from <= q.to, { message: 'must not be before from', path: ['to'] })
  .refine((q) => daysBetween(q.from, q.to) < LEDGER_MAX_DAYS, {
    message: `the range may span at most ${LEDGER_MAX_DAYS} days`,
    path: ['to'],
  });
export type LedgerRangeQuery = z.infer<typeof LedgerRangeQuery>;

/**
 * POST /api/projects/:projectId/ledger/:entryId/confirm. Without `lostHours` and `limiting` the
 * proposal is confirmed as it stands; a value that differs from the proposal is a correction and
 * needs a note (the server checks that against the stored proposal).
 */
export const LedgerConfirmInput = z.object({
  lostHours: z
    .number({ error: 'lost hours must be a number' })
    .min(0, 'must be at least 0 h')
    .max(LEDGER_MAX_DAY_HOURS, `must be at most ${LEDGER_MAX_DAY_HOURS} h (and at most the day's planned hours)`)
    .optional(),
  limiting: z
    .enum(LEDGER_LIMITING_VALUES, {
      error:
        'must be a limiting factor (hs, hsTpCurve, tpMin, tpMax, tpBand, bedVelocity, wind, minDepth, maxDepth, current, tideWindow, hsTarget, response, noData)',
    })
    .nullable()
    .optional(),
  note: longText(2000).optional().default(''),
});
export type LedgerConfirmInput = z.infer<typeof LedgerConfirmInput>;

/**
 * POST …/ledger/confirm-day: every proposed entry of one day (of one worksite, or of all) confirmed
 * as proposed, all or none; the note goes with each.
 */
export const LedgerConfirmDayInput = z.object({
  day: isoDay,
  siteId: z.string().uuid('must be a worksite id').optional(),
  note: longText(2000).optional().default(''),
});
export type LedgerConfirmDayInput = z.infer<typeof LedgerConfirmDayInput>;
