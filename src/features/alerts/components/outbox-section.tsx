// "Outbox" (coordinators and admins): every alert e-mail of the project as written before sending,
// with its delivery status. Failed ones (given up after the set number of tries) are highlighted
// with the last SMTP error; any one can be opened to read its text and HTML.
import { useState } from 'react';
import { Button, Card, ErrorNotice, Notice, SectionHeading, Spinner } from '../../../components/ui';
import { useOutbox } from '../api/get-outbox';
import type { OutboxRow, OutboxStatus } from '../api/types';
import { DATE_STYLE } from '../../../../shared/dates';
import { timeIn } from './format';
import { MessageView } from './message-view';
import { HeadingRow } from '../../../components/ui/table';

const STATUS: Record<OutboxStatus, { label: string; className: string }> = {
  pending: { label: 'Waiting', className: 'bg-st-marginal text-deep' },
  sent: { label: 'Sent', className: 'bg-st-workable text-white' },
  failed: { label: 'Failed', className: 'bg-danger text-white' },
};

export function OutboxSection({ projectId, zone: here }: { projectId: string; zone: string }) {
  const outbox = useOutbox(projectId);
  const [openId, setOpenId] = useState<string | null>(null);
  const rows = outbox.data ?? [];
  const open = rows.find((r) => r.id === openId) ?? null;
  const count = (s: OutboxStatus) => rows.filter((r) => r.status === s).length;
  const failed = count('failed');

  return (
    <Card aria-labelledby="outbox-title">
      <div className="flex flex-wrap items-start justify-between gap-2">
        <div>
          <SectionHeading id="outbox-title" title="Outbox">
            Every alert e-mail is written here first, then sent; a failed send is retried with growing pauses.
          </SectionHeading>
        </div>
        <Button variant="secondary" onClick={() => void outbox.refetch()} disabled={outbox.isFetching}>
          {outbox.isFetching ? 'Reading…' : 'Refresh'}
        </Button>
      </div>
      <div className="mt-4 flex flex-col gap-3">
        {outbox.isPending ? <Spinner label="Reading the outbox" /> : null}
        {outbox.error ? <ErrorNotice error={outbox.error} /> : null}
        {outbox.data ? (
          <p className="text-sm" data-testid="outbox-counts">
            {rows.length} e-mail{rows.length === 1 ? '' : 's'} (latest 100): {count('sent')} sent, {count('pending')} waiting, {failed}{' '}
            failed.
          </p>
        ) : null}
        {failed > 0 ? (
          <Notice tone="error">
            {failed} e-mail{failed === 1 ? ' was' : 's were'} given up after the last try. Check the SMTP server settings and the addresses;
            the people concerned have not been told.
          </Notice>
        ) : null}
        {outbox.data && rows.length === 0 ? <p className="text-sm text-ink-soft">No alert e-mails yet.</p> : null}
        {rows.length > 0 ? (
          <div className="overflow-x-auto">
            <table className="w-full border-collapse text-left text-sm">
              <thead>
                <HeadingRow
                  className="border-b border-line text-xs uppercase tracking-wide text-ink-soft"
                  cellClassName="py-2 pr-3"
                  headings={[
                    'Status',
                    'E-mail',
                    { label: 'Tries', className: 'hidden py-2 pr-3 md:table-cell' },
                    { label: 'Written · sent', className: 'hidden py-2 pr-3 md:table-cell' },
                    { label: <span className="sr-only">Open</span>, className: 'py-2' },
                  ]}
                />
              </thead>
              <tbody>
                {rows.map((r) => (
                  <OutboxLine
                    key={r.id}
                    row={r}
                    here={here}
                    open={r.id === openId}
                    onOpen={() => setOpenId(r.id === openId ? null : r.id)}
                  />
                ))}
              </tbody>
            </table>
          </div>
        ) : null}
        {open ? (
          <MessageView
            key={open.id}
            message={open}
            onClose={() => setOpenId(null)}
            meta={[
              { label: 'To', value: open.toEmail },
              { label: 'Status', value: `${STATUS[open.status].label} after ${open.attempts} ${open.attempts === 1 ? 'try' : 'tries'}` },
              { label: 'Written', value: timeIn(open.createdAt, here, DATE_STYLE.dateTimeYear) },
              ...(open.sentAt ? [{ label: 'Sent', value: timeIn(open.sentAt, here, DATE_STYLE.dateTimeYear) }] : []),
              ...(open.lastError ? [{ label: 'Last error', value: <span className="text-danger">{open.lastError}</span> }] : []),
            ]}
          />
        ) : null}
      </div>
    </Card>
  );
}

/** When it was sent, or when it is tried next, or that it was given up. */
function sentWords(row: OutboxRow, here: string): string {
  if (row.sentAt) return `sent ${timeIn(row.sentAt, here)}`;
  if (row.status === 'failed') return 'given up';
  if (row.attempts > 0 && row.nextAttemptAt) return `next try ${timeIn(row.nextAttemptAt, here)}`;
  return 'not sent yet';
}

function OutboxLine({ row, here, open, onOpen }: { row: OutboxRow; here: string; open: boolean; onOpen: () => void }) {
  const st = STATUS[row.status];
  return (
    <tr className={`border-b border-line align-top ${row.status === 'failed' ? 'bg-danger-soft' : ''}`} data-status={row.status}>
      <td className="py-2 pr-3">
        <span className={`inline-block rounded-full px-2 py-0.5 text-xs font-bold ${st.className}`}>{st.label}</span>
      </td>
      <td className="min-w-0 py-2 pr-3">
        <p className="break-words font-semibold">{row.subject}</p>
        <p className="break-all text-ink-soft">{row.toEmail}</p>
        {row.lastError ? <p className="text-danger">Last error: {row.lastError}</p> : null}
        <p className="text-xs text-ink-soft md:hidden">
          {row.attempts} {row.attempts === 1 ? 'try' : 'tries'} · written {timeIn(row.createdAt, here)} · {sentWords(row, here)}
        </p>
      </td>
      <td className="hidden py-2 pr-3 md:table-cell">{row.attempts}</td>
      <td className="hidden py-2 pr-3 whitespace-nowrap md:table-cell">
        {timeIn(row.createdAt, here)}
        <br />
        <span className="text-ink-soft">{sentWords(row, here)}</span>
      </td>
      <td className="py-2 text-right">
        <Button variant={open ? 'primary' : 'secondary'} onClick={onOpen} aria-expanded={open}>
          {open ? 'Hide' : 'Read'}
        </Button>
      </td>
    </tr>
  );
}
