import type { HTMLAttributes, ReactNode } from 'react';

export function Card({ className = '', ...props }: HTMLAttributes<HTMLElement>) {
  return <section className={`rounded-[var(--radius-card)] border border-line bg-surface p-4 sm:p-5 ${className}`} {...props} />;
}

/**
 * A section card's heading: the h2 whose `id` names the card (its `aria-labelledby`), and the
 * intro paragraph under it (`narrow`: kept to a reading measure on a wide card).
 */
export function SectionHeading({ id, title, narrow, children }: { id: string; title: ReactNode; narrow?: boolean; children: ReactNode }) {
  return (
    <>
      <h2 id={id} className="text-lg font-bold">
        {title}
      </h2>
      <p className={narrow ? 'mt-1 max-w-3xl text-sm text-ink-soft' : 'mt-1 text-sm text-ink-soft'}>{children}</p>
    </>
  );
}

/** A card that is a region named by its heading: the title, the intro paragraph, then `children`. */
export function SectionCard({
  titleId,
  title,
  intro,
  children,
}: {
  titleId: string;
  title: ReactNode;
  intro: ReactNode;
  children: ReactNode;
}) {
  return (
    <Card aria-labelledby={titleId}>
      <SectionHeading id={titleId} title={title}>
        {intro}
      </SectionHeading>
      {children}
    </Card>
  );
}

export function PageHeader({ title, subtitle, actions }: { title: string; subtitle?: ReactNode; actions?: ReactNode }) {
  return (
    <header className="mb-5 flex flex-wrap items-end justify-between gap-3">
      <div>
        <h1 className="text-2xl font-bold tracking-tight">{title}</h1>
        {subtitle ? <p className="mt-1 text-sm text-ink-soft">{subtitle}</p> : null}
      </div>
      {actions ? <div className="flex flex-wrap gap-2">{actions}</div> : null}
    </header>
  );
}

export function Notice({ tone = 'info', children }: { tone?: 'info' | 'error' | 'success'; children: ReactNode }) {
  const tones = {
    info: 'border-line bg-surface-2 text-ink',
    error: 'border-danger bg-danger-soft text-ink',
    success: 'border-accent bg-ok-soft text-ink',
  };
  return (
    <div role={tone === 'error' ? 'alert' : 'status'} className={`rounded-lg border px-4 py-3 text-sm ${tones[tone]}`}>
      {children}
    </div>
  );
}

export function Spinner({ label = 'Loading' }: { label?: string }) {
  return (
    <div role="status" className="flex items-center gap-3 py-6 text-sm text-ink-soft">
      <span className="size-4 animate-spin rounded-full border-2 border-line border-t-accent" aria-hidden />
      {label}…
    </div>
  );
}
