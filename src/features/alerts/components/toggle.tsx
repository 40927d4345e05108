import type { ReactNode } from 'react';

/** An on/off switch at least 44 px tall, with its state in words beside the colour. */
export function Toggle({
  id,
  on,
  onChange,
  label,
  hint,
  disabled,
}: {
  id: string;
  on: boolean;
  onChange: (on: boolean) => void;
  label: ReactNode;
  hint?: ReactNode;
  disabled?: boolean;
}) {
  return (
    <button
      id={id}
      type="button"
      role="switch"
      aria-checked={on}
      disabled={disabled}
      onClick={() => onChange(!on)}
      className="flex min-h-11 w-full items-center gap-3 rounded-lg border border-line bg-surface px-3 py-2 text-left text-sm hover:border-accent disabled:cursor-not-allowed disabled:opacity-50"
    >
      <span className={`relative inline-flex h-6 w-10 shrink-0 items-center rounded-full transition ${on ? 'bg-accent' : 'bg-st-nodata'}`} aria-hidden>
        <span className={`absolute size-5 rounded-full bg-white shadow transition-all ${on ? 'left-[1.15rem]' : 'left-0.5'}`} />
      </span>
      <span className="flex flex-col">
        <span className="font-semibold">
          {label}
          <span className="ml-2 font-normal text-ink-soft">{on ? 'on' : 'off'}</span>
        </span>
        {hint ? <span className="text-xs text-ink-soft">{hint}</span> : null}
      </span>
    </button>
  );
}

/** A tick box with its label, the whole row at least 44 px tall. */
export function CheckRow({
  checked,
  onChange,
  children,
  disabled,
}: {
  checked: boolean;
  onChange: (checked: boolean) => void;
  children: ReactNode;
  disabled?: boolean;
}) {
  return (
    <label className="flex min-h-11 cursor-pointer items-center gap-3 rounded-lg border border-line bg-surface px-3 py-2 text-sm hover:border-accent has-[:checked]:border-accent has-[:checked]:bg-ok-soft">
      <input type="checkbox" className="size-5 shrink-0 accent-[var(--color-accent)]" checked={checked} disabled={disabled} onChange={(e) => onChange(e.target.checked)} />
      <span className="min-w-0">{children}</span>
    </label>
  );
}
