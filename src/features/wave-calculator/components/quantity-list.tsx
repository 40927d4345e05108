import type { ReactNode } from 'react';
import { formatSig } from '../utils/format-number';

export interface QuantityItem {
  /** Stable name, also the test id (`quantity-<id>`). */
  id: string;
  /** Plain words, e.g. "Group celerity". */
  label: string;
  /** The handbook symbol, e.g. <>C<sub>g</sub></>. */
  symbol?: ReactNode;
  value: number | null | undefined;
  /** Unit beside the number; "–" for dimensionless. */
  unit: string;
  /** Significant figures (default 4). */
  sig?: number;
  /** A short second line: formula or note. */
  note?: ReactNode;
}

/** A titled group of results: words and symbol on the left, number and unit on the right. */
export function QuantityList({ title, items }: { title: ReactNode; items: QuantityItem[] }) {
  return (
    <section>
      <h3 className="mb-1 text-sm font-bold text-accent">{title}</h3>
      <dl className="divide-y divide-line">
        {items.map((q) => (
          <div key={q.id} className="flex items-baseline justify-between gap-3 py-1.5" data-testid={`quantity-${q.id}`}>
            <dt className="min-w-0 text-sm">
              <span>{q.label}</span>
              {q.symbol ? <span className="ml-1 font-serif italic">{q.symbol}</span> : null}
              {q.note ? <span className="block text-xs text-ink-soft">{q.note}</span> : null}
            </dt>
            <dd className="shrink-0 text-right tabular-nums">
              <span className="font-semibold" data-testid="value">
                {formatSig(q.value, q.sig ?? 4, true)}
              </span>
              <span className="ml-1 inline-block min-w-10 text-left text-sm text-ink-soft">{q.unit}</span>
            </dd>
          </div>
        ))}
      </dl>
    </section>
  );
}
