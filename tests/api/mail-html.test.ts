// The alert and digest e-mails as they arrive: read from the local SMTP fake (smtp-server and
// mailparser, the real delivery path), not from the functions that write them. Names a user typed
// must reach the HTML part as text, escaped, and the plain-text part as typed.
import { beforeAll, describe, expect, it } from 'vitest';
import { queueDigests } from '../../server/services/digests';
import { deliverDueMail } from '../../server/services/outbox';
import { planAndReadMail, subscribeSkipperToDigest, useSignedInApp } from '../support/app';
import type { CaughtMessage } from '../../server/mail/fake-smtp';

// Just after the fake forecast service's 06:00 issue.
let now = new Date('2026-12-01T06:20:00Z');

/** Markup characters and both quotes: what HTML escaping must turn into character references. */
const MARKUP = `<b>&"'`;
const OP_NAME = (i: number) => `${MARKUP} lift ${i}`;
const PROJECT_NAME = `${MARKUP} Reach`;

/**
 * Character references back to characters, for the five that escaping writes: &lt; &gt; &amp;
 * &quot; and &#x27; (WHATWG HTML, named and numeric character references; the list is from memory).
 */
const decode = (html: string) =>
  html.replace(
    /&(lt|gt|quot|#x27|#39|amp);/g,
    (_, name: string) => ({ lt: '<', gt: '>', quot: '"', '#x27': "'", '#39': "'", amp: '&' })[name]!,
  );

/** The list items of the HTML part, as a reader sees them. */
const listItems = (html: string) => [...html.matchAll(/<li[^>]*>([\s\S]*?)<\/li>/g)].map((m) => decode(m[1]));
/** The dash list of the plain-text part. */
const textPoints = (text: string) =>
  text
    .split('\n')
    .filter((l) => l.startsWith('- '))
    .map((l) => l.slice(2));

/** Every check that the HTML part holds the user's text as text. */
function expectEscaped(m: CaughtMessage, typed: string[]) {
  // No tag or attribute break-out from a name: the raw characters never appear.
  expect(m.html).not.toContain('<b>');
  expect(m.html).not.toContain(`&"'`);
  for (const name of typed) {
    expect(m.html).toContain(name.replace('<b>&"\'', '&lt;b&gt;&amp;&quot;&#x27;'));
    expect(m.text).toContain(name);
  }
  // Read back, the HTML list says what the plain-text part says.
  expect(listItems(m.html)).toEqual(textPoints(m.text));
  expect(listItems(m.html).length).toBeGreaterThan(0);
  // The unsubscribe link: '&' between query parameters is written &amp; in the attribute and
  // decodes to the address of the List-Unsubscribe header (RFC 2369: "<url>").
  const href = /href="([^"]*\/api\/unsubscribe\?[^"]*)"/.exec(m.html)?.[1];
  expect(href).toBeDefined();
  expect(href).toContain('&amp;');
  expect(`<${decode(href!)}>`).toBe(m.listUnsubscribe);
  expect(m.text).toContain(`Stop these e-mails: ${decode(href!)}`);
}

const ctx = useSignedInApp({ clock: () => now });
beforeAll(async () => {
  const A = ctx.t.demo.projectId;
  const project = (await ctx.as.coordinator.get(`/api/projects/${A}`)).body;
  expect(
    (
      await ctx.as.coordinator
        .put(`/api/projects/${A}/settings`)
        .send({ ...project, name: PROJECT_NAME, description: project.description ?? '' })
    ).status,
  ).toBe(200);
  const ops = (await ctx.as.coordinator.get(`/api/projects/${A}/operations`)).body as { id: string; skipperIds: string[] }[];
  for (const [i, op] of ops.filter((o) => o.skipperIds.includes(ctx.t.demo.users.skipper)).entries()) {
    expect((await ctx.as.coordinator.patch(`/api/projects/${A}/operations/${op.id}`).send({ name: OP_NAME(i) })).status).toBe(200);
  }
});

describe('e-mails read back from the SMTP fake', () => {
  it('alert e-mails carry the names as escaped text in HTML and as typed in plain text', async () => {
    for (const m of await planAndReadMail(ctx)) {
      const op = /^.*?: (.*? lift \d+) at /.exec(m.subject)?.[1];
      expect(op, m.subject).toBeDefined();
      // The subject is a header, not HTML: the names as typed.
      expect(m.subject.startsWith(`${PROJECT_NAME}: ${op}`)).toBe(true);
      expectEscaped(m, [PROJECT_NAME, op!]);
    }
  });

  it('the daily digest does the same', async () => {
    await subscribeSkipperToDigest(ctx, '06:00');
    now = new Date('2026-12-01T07:00:00Z');
    const before = ctx.t.mailer.fake!.messages.length;
    expect(await queueDigests(ctx.t.deps)).toBe(1);
    await deliverDueMail(ctx.t.deps.db, ctx.t.deps.mailer, now, { maxAttempts: 3, log: ctx.t.deps.log, links: ctx.t.deps.config });
    const [digest] = ctx.t.mailer.fake!.messages.slice(before);
    expect(digest.subject).toBe(`${PROJECT_NAME}: windows for Tue 1 Dec`); // 1 December 2026 is a Tuesday (GNU date)
    expectEscaped(digest, [`${PROJECT_NAME}, daily summary`, OP_NAME(0)]);
  });
});
