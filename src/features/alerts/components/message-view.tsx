// One e-mail opened: its header lines, and its body as plain text or as HTML. The HTML is shown
// in an iframe with an empty sandbox (no scripts, no forms, no same-origin access, links inert),
// so a message can never act inside the app.
import { useEffect, useRef, useState, type ReactNode } from 'react';
import { Button } from '../../../components/ui';
import { Tabs } from '../../../components/ui/tabs';

interface Props {
  /** The e-mail: its subject and its text and HTML bodies (the HTML may be missing). */
  message: { subject: string; text: string; html: string | null };
  /** header lines shown under the subject: label and value */
  meta: { label: string; value: ReactNode }[];
  onClose: () => void;
}

export function MessageView({ message: { subject, text, html }, meta, onClose }: Props) {
  const hasHtml = !!html && html.trim().length > 0;
  const [tab, setTab] = useState<'text' | 'html'>(hasHtml ? 'html' : 'text');
  const heading = useRef<HTMLHeadingElement>(null);
  useEffect(() => {
    heading.current?.focus();
    heading.current?.scrollIntoView({ block: 'nearest', behavior: 'smooth' });
  }, [subject]);
  const shown = tab === 'html' && hasHtml ? 'html' : 'text';

  return (
    <section
      className="rounded-[var(--radius-card)] border border-accent bg-surface p-4"
      aria-label="Opened e-mail"
      data-testid="message-view"
    >
      <div className="flex flex-wrap items-start justify-between gap-2">
        <h3 ref={heading} tabIndex={-1} className="min-w-0 break-words text-base font-bold outline-none">
          {subject || '(no subject)'}
        </h3>
        <Button variant="secondary" onClick={onClose}>
          Close
        </Button>
      </div>
      <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-sm">
        {meta.map((m) => (
          <div key={m.label} className="contents">
            <dt className="text-ink-soft">{m.label}</dt>
            <dd className="min-w-0 break-words">{m.value}</dd>
          </div>
        ))}
      </dl>
      <Tabs
        label="Message body"
        tabs={[
          { id: 'html', label: hasHtml ? 'HTML' : 'No HTML part', disabled: !hasHtml },
          { id: 'text', label: 'Plain text' },
        ]}
        selected={shown}
        onSelect={setTab}
        listClassName="mt-3 mb-3 flex gap-1 rounded-lg bg-surface-2 p-1"
      >
        {shown === 'html' ? (
          <iframe
            title={`HTML of “${subject}”`}
            sandbox=""
            srcDoc={html ?? ''}
            referrerPolicy="no-referrer"
            className="h-[28rem] w-full rounded-lg border border-line bg-white"
          />
        ) : (
          <pre className="max-h-[28rem] overflow-auto whitespace-pre-wrap break-words rounded-lg border border-line bg-surface-2 p-3 font-mono text-sm">
            {text || '(no plain-text part)'}
          </pre>
        )}
      </Tabs>
    </section>
  );
}
