import { useRef, type KeyboardEvent } from 'react';

export interface ModeOption<M extends string> {
  id: M;
  label: string;
}

/**
 * A segmented control acting as tabs (WAI-ARIA tabs pattern: arrow keys, Home and End move
 * between modes). Every tab is at least 44 px tall; on a phone the three share the width.
 */
export function ModeTabs<M extends string>({
  modes,
  value,
  onChange,
  label,
  idPrefix,
}: {
  modes: readonly ModeOption<M>[];
  value: M;
  onChange: (mode: M) => void;
  label: string;
  idPrefix: string;
}) {
  const refs = useRef<(HTMLButtonElement | null)[]>([]);
  const onKeyDown = (e: KeyboardEvent<HTMLDivElement>) => {
    const i = modes.findIndex((m) => m.id === value);
    const next =
      e.key === 'ArrowRight'
        ? (i + 1) % modes.length
        : e.key === 'ArrowLeft'
          ? (i - 1 + modes.length) % modes.length
          : e.key === 'Home'
            ? 0
            : e.key === 'End'
              ? modes.length - 1
              : -1;
    if (next < 0) return;
    e.preventDefault();
    onChange(modes[next].id);
    refs.current[next]?.focus();
  };
  return (
    <div
      role="tablist"
      aria-label={label}
      onKeyDown={onKeyDown}
      className="no-print grid w-full auto-cols-fr grid-flow-col gap-1 rounded-xl border border-line bg-surface-2 p-1 sm:inline-grid sm:w-auto"
    >
      {modes.map((m, i) => {
        const selected = m.id === value;
        return (
          <button
            key={m.id}
            ref={(el) => {
              refs.current[i] = el;
            }}
            type="button"
            role="tab"
            id={`${idPrefix}-tab-${m.id}`}
            aria-selected={selected}
            aria-controls={selected ? `${idPrefix}-panel-${m.id}` : undefined}
            tabIndex={selected ? 0 : -1}
            onClick={() => onChange(m.id)}
            className={`min-h-11 rounded-lg px-3 text-sm font-semibold whitespace-nowrap transition sm:px-5 ${
              selected ? 'bg-surface text-ink shadow-sm ring-1 ring-line' : 'text-ink-soft hover:text-ink'
            }`}
          >
            {m.label}
          </button>
        );
      })}
    </div>
  );
}
