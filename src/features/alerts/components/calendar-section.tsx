// "Calendar feed": the caller's secret iCalendar (RFC 5545) address of usable windows and
// recurring-operation occurrences, to subscribe to in a phone's calendar app. It can be replaced
// (the old address stops working) or revoked.
import { useState } from 'react';
import { OCCURRENCE_VERDICTS } from '../../../../shared/status-words';
import { Button, ErrorNotice, Input, Notice, SectionCard, Spinner } from '../../../components/ui';
import { useCalendarFeed } from '../api/get-calendar-feed';
import { useCreateCalendarFeed } from '../api/create-calendar-feed';
import { useRevokeCalendarFeed } from '../api/revoke-calendar-feed';

type Confirm = null | 'replace' | 'revoke';

export function CalendarSection() {
  const feed = useCalendarFeed();
  const create = useCreateCalendarFeed();
  const revoke = useRevokeCalendarFeed();
  const [confirm, setConfirm] = useState<Confirm>(null);
  const [copied, setCopied] = useState(false);
  const url = feed.data?.url ?? null;
  const busy = create.isPending || revoke.isPending;

  async function copy() {
    if (!url) return;
    try {
      await navigator.clipboard.writeText(url);
      setCopied(true);
      setTimeout(() => setCopied(false), 2500);
    } catch {
      // No clipboard (plain http, or refused): select the address so it can be copied by hand.
      const el = document.getElementById('calendar-url') as HTMLInputElement | null;
      el?.select();
    }
  }

  return (
    <SectionCard
      titleId="cal-title"
      title="Calendar feed"
      intro={
        <>
          Usable weather windows and recurring-operation occurrences ({OCCURRENCE_VERDICTS}) of everything you hear about, in every project
          you belong to, kept up to date in your calendar.
        </>
      }
    >
      <div className="mt-4 flex flex-col gap-3">
        {feed.isPending ? <Spinner label="Reading your feed address" /> : null}
        {feed.error ? <ErrorNotice error={feed.error} /> : null}
        {feed.data && !url ? (
          <>
            <p className="text-sm">You have no feed address yet.</p>
            <div>
              <Button onClick={() => create.mutate()} disabled={busy}>
                Create my feed address
              </Button>
            </div>
          </>
        ) : null}
        {url ? (
          <>
            <label htmlFor="calendar-url" className="text-sm font-semibold">
              Your feed address
            </label>
            <div className="flex flex-col gap-2 sm:flex-row">
              <Input
                id="calendar-url"
                readOnly
                value={url}
                className="font-mono text-sm"
                onFocus={(e) => e.currentTarget.select()}
                data-testid="calendar-url"
              />
              <Button variant="secondary" onClick={() => void copy()} className="shrink-0">
                {copied ? 'Copied' : 'Copy'}
              </Button>
            </div>
            <ol className="list-decimal space-y-1 pl-5 text-sm">
              <li>Copy the address.</li>
              <li>
                Use your calendar app&apos;s option to subscribe by web address, and paste it. On a phone you can also{' '}
                <a className="font-semibold text-accent underline" href={url.replace(/^https?:/, 'webcal:')}>
                  open it in the calendar app
                </a>
                .
              </li>
              <li>
                Calendar apps refresh a subscription on their own schedule, often every few hours; the board is always the latest plan.
              </li>
            </ol>
            <Notice>Keep the address to yourself: anyone who has it can read your windows. If it got out, make a new one.</Notice>
            {confirm === null ? (
              <div className="flex flex-wrap gap-2">
                <Button variant="secondary" onClick={() => setConfirm('replace')} disabled={busy}>
                  New address
                </Button>
                <Button variant="ghost" onClick={() => setConfirm('revoke')} disabled={busy}>
                  Revoke
                </Button>
              </div>
            ) : (
              <div className="rounded-lg border border-danger bg-danger-soft p-3 text-sm" role="group" aria-label="Confirm">
                <p className="font-semibold">
                  {confirm === 'replace'
                    ? 'Make a new address? The current one stops working at once: calendars subscribed to it stop updating and must be given the new address.'
                    : 'Revoke the address? Calendars subscribed to it stop updating. You can make a new one later.'}
                </p>
                <div className="mt-2 flex flex-wrap gap-2">
                  <Button
                    variant="danger"
                    disabled={busy}
                    onClick={() =>
                      confirm === 'replace'
                        ? create.mutate(undefined, { onSettled: () => setConfirm(null) })
                        : revoke.mutate(undefined, { onSettled: () => setConfirm(null) })
                    }
                  >
                    {confirm === 'replace' ? 'Yes, make a new address' : 'Yes, revoke'}
                  </Button>
                  <Button variant="secondary" onClick={() => setConfirm(null)}>
                    Keep the current address
                  </Button>
                </div>
              </div>
            )}
          </>
        ) : null}
        {create.error ? <ErrorNotice error={create.error} /> : null}
        {revoke.error ? <ErrorNotice error={revoke.error} /> : null}
      </div>
    </SectionCard>
  );
}
