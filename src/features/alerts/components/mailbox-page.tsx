// `/admin/mailbox` (admins): the e-mails the local mailbox received while no real SMTP server
// is configured, newest first. Open one to read its text and its HTML (sandboxed).
import { useState } from 'react';
import { Button, ErrorNotice, Notice, PageHeader, Spinner } from '../../../components/ui';
import { useMailbox } from '../api/get-mailbox';
import { DATE_STYLE } from '../../../../shared/dates';
import { browserTimeZone, timeIn } from './format';
import { usePageZone } from '../../../components/page-zone';
import { zoneStatement } from '../../../../shared/dates';
import { MessageView } from './message-view';

export function MailboxPage() {
  const mailbox = useMailbox();
  const [openId, setOpenId] = useState<number | string | null>(null);
  const here = browserTimeZone();
  usePageZone(zoneStatement(here, 'your own clock'));
  const messages = mailbox.data ?? [];
  const open = messages.find((m) => m.id === openId) ?? null;

  return (
    <div className="flex flex-col gap-5 dark:scheme-dark">
      <PageHeader
        title="Mailbox"
        subtitle={`E-mails received by the local mailbox, a built-in stand-in for an SMTP server in development and tests.`}
        actions={
          mailbox.data !== null ? (
            <Button variant="secondary" onClick={() => void mailbox.refetch()} disabled={mailbox.isFetching}>
              {mailbox.isFetching ? 'Reading…' : 'Refresh'}
            </Button>
          ) : null
        }
      />
      {mailbox.isPending ? <Spinner label="Reading the mailbox" /> : null}
      {mailbox.error ? <ErrorNotice error={mailbox.error} /> : null}
      {mailbox.data === null ? <Notice>A real SMTP server is configured; nothing is caught here.</Notice> : null}
      {mailbox.data && messages.length === 0 ? (
        <Notice>No e-mail caught yet. Alert e-mails arrive here after a planning run finds changes for someone subscribed.</Notice>
      ) : null}
      {messages.length > 0 ? (
        <div className="grid items-start gap-5 lg:grid-cols-[minmax(0,2fr)_minmax(0,3fr)]">
          <section className="overflow-hidden rounded-[var(--radius-card)] border border-line bg-surface" aria-label="Caught e-mails">
            <p className="border-b border-line px-4 py-3 text-sm text-ink-soft">
              {messages.length} e-mail{messages.length === 1 ? '' : 's'}, newest first
            </p>
            <ul className="divide-y divide-line" data-testid="mailbox-list">
              {messages.map((m) => {
                const selected = m.id === openId;
                return (
                  <li key={m.id}>
                    <button
                      type="button"
                      onClick={() => setOpenId(selected ? null : m.id)}
                      aria-expanded={selected}
                      className={`flex min-h-11 w-full flex-col gap-0.5 px-4 py-3 text-left hover:bg-surface-2 ${selected ? 'bg-ok-soft' : ''}`}
                    >
                      <span className="break-words font-semibold">{m.subject || '(no subject)'}</span>
                      <span className="break-all text-sm">To {m.to.join(', ')}</span>
                      <span className="text-xs text-ink-soft">{timeIn(m.receivedAt, here, DATE_STYLE.dateTimeSeconds)}</span>
                    </button>
                  </li>
                );
              })}
            </ul>
          </section>
          {open ? (
            <MessageView
              key={open.id}
              message={open}
              onClose={() => setOpenId(null)}
              meta={[
                { label: 'To', value: open.to.join(', ') },
                { label: 'Received', value: timeIn(open.receivedAt, here, DATE_STYLE.dateTimeSeconds) },
              ]}
            />
          ) : (
            <p className="hidden text-sm text-ink-soft lg:block">Choose an e-mail to read it.</p>
          )}
        </div>
      ) : null}
    </div>
  );
}
