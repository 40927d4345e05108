import { beforeAll, describe, expect, it } from 'vitest';
import type { CampaignOutlookAnswer } from '../../shared/api-types-downtime';
import { outlookMoveEmail } from '../../server/services/campaign-outlook';

const answer = {
  asOf: '2026-12-01T07:30:00.000Z',
  forecastIssuedAt: '2026-12-01T06:00:00.000Z',
  samples: 20,
  censored: 1,
  finish: { p10: '2027-01-02T00:00:00.000Z', p50: '2027-01-12T12:00:00.000Z', p90: '2027-02-01T00:00:00.000Z' },
} as CampaignOutlookAnswer;

describe('the "P50 finish moved" e-mail', () => {
  const mailPromise = outlookMoveEmail({
    projectName: 'Varrow <Reach>',
    campaignName: 'Lay & "berm"',
    previousP50: '2027-01-02T12:00:00.000Z',
    answer,
    timeZone: 'Europe/London',
    pageUrl: 'http://localhost:3000/projects/p/downtime',
    unsubscribeUrl: 'http://localhost:3000/api/unsubscribe?u=1&p=2&sig=3',
  });

  let mail: Awaited<typeof mailPromise>;
  beforeAll(async () => {
    mail = await mailPromise;
  });

  it('says how far and which way the P50 moved, with the dates in the campaign zone', () => {
    // 2 Jan 12:00 to 12 Jan 12:00 is 10 days later (counted by hand).
    expect(mail.subject).toBe('Lay & "berm": P50 finish moved 10 days later, now Tue 12 Jan 2027');
    expect(mail.text).toContain('P50 finish: Tue 12 Jan 2027 (was Sat 2 Jan 2027, 10 days later).');
    expect(mail.text).toContain('P90 finish: Mon 1 Feb 2027.');
    expect(mail.text).toContain('20 samples, 1 censored. Dates are Europe/London.');
    expect(mail.text).toContain('Stop these e-mails: http://localhost:3000/api/unsubscribe');
  });

  it('escapes the names a user typed in the HTML part (OWASP output encoding, from memory)', () => {
    expect(mail.html).toContain('Lay &amp; &quot;berm&quot;');
    expect(mail.html).toContain('Varrow &lt;Reach&gt;');
    expect(mail.html).not.toContain('<Reach>');
  });
});
