// One set of status words everywhere: the board's key, the calendar feed (.ics), the alert e-mail
// and the daily digest are each rendered or read back as a user gets them, and the status words
// and letters found there are compared with the vocabulary (shared/status-words.ts), whose hour
// words are those of the project's notes (docs/domain.md#hourly-status).
import fs from 'node:fs';
import ICAL from 'ical.js';
import request from 'supertest';
import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { alertEmail } from '../../server/services/alert-mail';
import { digestLine, queueDigests } from '../../server/services/digests';
import { deliverDueMail } from '../../server/services/outbox';
import { HOUR_STATUS_ORDER, OCCURRENCE_STATUS_WORD, STATUS_WORDS, type StatusWord } from '../../shared/status-words';
import type { PlanSummary } from '../../shared/alerts/compare-plans';
import type { OccurrenceStatus } from '../../shared/api-types-plan';
import { BoardLegend } from '../../src/features/board/components/board-legend';
import { createTestApp, signInAll, type TestApp, textBody } from '../support/app';

/** "X Not workable" back to its status, or undefined when the pair is not in the vocabulary. */
function statusOfLabel(label: string): StatusWord | undefined {
  return (Object.keys(STATUS_WORDS) as StatusWord[]).find(
    (s) => `${STATUS_WORDS[s].letter} ${STATUS_WORDS[s].word}`.toLowerCase() === label.trim().toLowerCase(),
  );
}

describe('the vocabulary', () => {
  it('says the hour statuses in the words of docs/domain.md#hourly-status, one distinct letter each', () => {
    const notes = fs.readFileSync(new URL('../../docs/domain.md', import.meta.url), 'utf8');
    const section = notes.slice(notes.indexOf('<a id="hourly-status"></a>'), notes.indexOf('<a id="weather-windows"></a>'));
    const words = [...section.matchAll(/^- \*\*([a-z ]+)\*\*/gm)].map((m) => m[1]);
    expect(words).toEqual(['workable', 'marginal', 'not workable', 'no data']);
    expect(HOUR_STATUS_ORDER.map((s) => STATUS_WORDS[s].word)).toEqual(words);
    const letters = Object.values(STATUS_WORDS).map((w) => w.letter);
    expect(new Set(letters).size).toBe(letters.length);
  });
});

describe('the board key', () => {
  it('names every hour status with the vocabulary letter and word', () => {
    const html = renderToStaticMarkup(createElement(BoardLegend, { alpha: true }));
    const labels = [...html.matchAll(/<strong>([^<]*)<\/strong>/g)].map((m) => m[1]);
    const statuses = labels.map(statusOfLabel).filter(Boolean);
    expect(statuses).toEqual(HOUR_STATUS_ORDER);
    // The coloured box beside each shows the same letter.
    const boxes = [...html.matchAll(/<span class="[^"]*inline-flex size-6[^"]*" aria-hidden="true">([^<]*)<\/span>/g)].map((m) => m[1]);
    expect(boxes).toEqual(HOUR_STATUS_ORDER.map((s) => STATUS_WORDS[s].letter));
  });
});

describe('the alert e-mail', () => {
  it('says a lost occurrence with the vocabulary letter and word, in both parts', async () => {
    const plan = {
      projectId: 'p',
      operationId: 'o',
      siteId: 's',
      operationName: 'Crew change',
      siteName: 'Landing',
      timeZone: 'UTC',
      tr: 3,
      startNow: false,
      earliestStart: null,
      windows: [],
      occurrences: [{ start: '2026-12-04T06:00:00.000Z', status: 'no_go' }],
    } as unknown as PlanSummary;
    const change = {
      kind: 'occurrence_no_go',
      operationId: 'o',
      siteId: 's',
      key: 'k',
      start: '2026-12-04T06:00:00.000Z',
      end: null,
      hours: 3,
      reason: 'wind',
    };
    const mail = await alertEmail({
      plan,
      changes: [change as never],
      projectName: 'Reach',
      boardUrl: 'http://x/b',
      unsubscribeUrl: 'http://x/u',
    });
    const textPoint = mail.text
      .split('\n')
      .find((l) => l.startsWith('- '))!
      .slice(2);
    const htmlPoint = /<li[^>]*>([^<]*)<\/li>/.exec(mail.html)![1];
    for (const point of [textPoint, htmlPoint]) expect(statusOfLabel(point.split(':')[0])).toBe('not_workable');
    // The subject, in running text, uses the same word.
    expect(mail.subject).toContain(`(${STATUS_WORDS.not_workable.word} at Fri 4 Dec 06:00)`); // 4 Dec 2026 is a Friday (GNU date)
  });
});

describe('the alert e-mail: when the work ends', () => {
  const plan = (over: Partial<PlanSummary>) =>
    ({
      operationId: 'o',
      siteId: 's',
      operationName: 'Cable lay',
      siteName: 'KP 4.5',
      timeZone: 'UTC',
      tr: 48,
      tpop: 36,
      startNow: false,
      earliestStart: '2026-12-08T01:00:00.000Z',
      windows: [{ start: '2026-12-08T01:00:00.000Z', end: '2026-12-10T18:00:00.000Z', hours: 65 }],
      occurrences: [],
      ...over,
    }) as PlanSummary;
  const opened = {
    kind: 'window_opened',
    operationId: 'o',
    siteId: 's',
    key: 'k',
    start: '2026-12-08T01:00:00.000Z',
    end: '2026-12-10T18:00:00.000Z',
    hours: 65,
  };
  const mailOf = (p: PlanSummary) =>
    alertEmail({ plan: p, changes: [opened as never], projectName: 'Reach', boardUrl: 'http://x/b', unsubscribeUrl: 'http://x/u' });

  it('says when work begun at the next start is planned to finish (+ TPOP) and its contingency ends (+ TR)', async () => {
    // Tue 8 Dec 2026 01:00 UTC + 36 h = Wed 9 Dec 13:00; + 48 h = Thu 10 Dec 01:00 (calendar).
    const mail = await mailOf(plan({}));
    const line = 'If started at Tue 8 Dec 01:00: planned finish Wed 9 Dec 13:00, contingency to Thu 10 Dec 01:00.';
    expect(mail.text).toContain(`- ${line}`);
    expect(mail.html).toContain(line);
  });

  it('gives the daily digest the finish of work begun at the start of the next window', () => {
    expect(digestLine(plan({}), Date.parse('2026-12-05T07:00:00Z'))).toBe(
      'Cable lay at KP 4.5: next window Tue 8 Dec 01:00 (65 h, UTC), planned finish Wed 9 Dec 13:00, contingency to Thu 10 Dec 01:00',
    );
    expect(digestLine(plan({ tpop: undefined }), Date.parse('2026-12-05T07:00:00Z'))).toBe(
      'Cable lay at KP 4.5: next window Tue 8 Dec 01:00 (65 h, UTC)',
    );
  });

  it('says nothing of a finish without a start, or for a plan run stored before TPOP was kept', async () => {
    expect((await mailOf(plan({ earliestStart: null }))).text).not.toMatch(/planned finish/);
    expect((await mailOf(plan({ tpop: undefined }))).text).not.toMatch(/planned finish/);
  });
});

describe('the calendar feed and the digest of a recurring operation', () => {
  let t: TestApp;
  let as: Awaited<ReturnType<typeof signInAll>>;
  let now = new Date('2026-12-01T06:20:00Z');
  let ctvPlan: { operationId: string; occurrences: { start: string; status: OccurrenceStatus }[] };

  beforeAll(async () => {
    t = await createTestApp({ clock: () => now });
    as = await signInAll(t.app);
    const A = t.demo.projectId;
    const job = await as.admin.post('/api/admin/jobs/plan').send({ projectId: A });
    expect(job.status, job.text).toBe(200);
    expect(job.body.projects[0].status, job.text).toBe('planned');
    const plan = (await as.skipper.get(`/api/projects/${A}/plan`)).body;
    // The demo's crew transfer repeats on Mondays, Wednesdays and Fridays (seed/scenario-sites.ts).
    ctvPlan = plan.plans.find((p: { operationName: string }) => p.operationName.startsWith('Crew transfer'));
    expect(ctvPlan.occurrences.length, JSON.stringify(plan).slice(0, 600)).toBeGreaterThan(0);
  });
  afterAll(async () => {
    await t.close();
  });

  it('the .ics names each occurrence with the letter and word of its status', async () => {
    const created = await as.skipper.post('/api/me/calendar').send({});
    expect(created.status).toBe(201);
    const feed = await request(t.app).get(new URL(created.body.url).pathname).buffer(true).parse(textBody);
    const events = new ICAL.Component(ICAL.parse(feed.body as string)).getAllSubcomponents('vevent').map((e) => new ICAL.Event(e));
    const occurrences = events.filter((e) => e.uid.startsWith(`occurrence-${ctvPlan.operationId}-`));
    expect(occurrences.length).toBe(ctvPlan.occurrences.length);
    for (const e of occurrences) {
      const o = ctvPlan.occurrences.find((x) => x.start === e.startDate.toJSDate().toISOString())!;
      expect(statusOfLabel(e.summary.split(':')[0]), e.summary).toBe(OCCURRENCE_STATUS_WORD[o.status]);
    }
  });

  it('the digest names the next occurrence with the letter and word of its status', async () => {
    await as.skipper.put(`/api/projects/${t.demo.projectId}/subscription`).send({
      operationIds: [],
      siteIds: [],
      immediate: false,
      digest: true,
      digestTime: '06:00',
      digestTimeZone: 'UTC',
      active: true,
    });
    now = new Date('2026-12-01T07:00:00Z');
    const before = t.mailer.fake!.messages.length;
    expect(await queueDigests(t.deps)).toBe(1);
    await deliverDueMail(t.deps.db, t.deps.mailer, now, { maxAttempts: 3, log: t.deps.log, links: t.deps.config });
    const [digest] = t.mailer.fake!.messages.slice(before);
    const line = digest.text.split('\n').find((l) => l.startsWith('- Crew transfer'))!;
    const next = ctvPlan.occurrences.find((o) => Date.parse(o.start) >= now.getTime())!;
    const said = /next occurrence \w{3} \d{1,2} \w{3} \d\d:\d\d: ([^;]*)$/.exec(line)?.[1];
    expect(said, line).toBeDefined();
    expect(statusOfLabel(said!)).toBe(OCCURRENCE_STATUS_WORD[next.status]);
  });
});
