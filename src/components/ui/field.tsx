import { messageUnderField } from '../../../shared/schemas/words';
import { forwardRef, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes, type TextareaHTMLAttributes } from 'react';

const control =
  'w-full min-h-11 rounded-lg border border-line bg-surface px-3 text-base text-ink placeholder:text-ink-soft/70 focus:border-accent aria-[invalid=true]:border-danger';

interface FieldShellProps {
  label: string;
  htmlFor: string;
  hint?: ReactNode;
  error?: string;
  unit?: string;
  children: ReactNode;
}

/** A labelled form control with its unit, hint and error message. */
export function FieldShell({ label, htmlFor, hint, error, unit, children }: FieldShellProps) {
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={htmlFor} className="text-sm font-semibold text-ink">
        {label}
        {unit ? <span className="ml-1 font-normal text-ink-soft">({unit})</span> : null}
      </label>
      {children}
      {error ? (
        <p role="alert" className="text-sm text-danger" id={`${htmlFor}-error`}>
          {messageUnderField(error)}
        </p>
      ) : hint ? (
        <p className="text-xs text-ink-soft">{hint}</p>
      ) : null}
    </div>
  );
}

export const Input = forwardRef<HTMLInputElement, InputHTMLAttributes<HTMLInputElement> & { invalid?: boolean }>(function Input(
  { invalid, className = '', ...props },
  ref,
) {
  return <input ref={ref} aria-invalid={invalid || undefined} className={`${control} ${className}`} {...props} />;
});

export const Select = forwardRef<HTMLSelectElement, SelectHTMLAttributes<HTMLSelectElement> & { invalid?: boolean }>(function Select(
  { invalid, className = '', ...props },
  ref,
) {
  return <select ref={ref} aria-invalid={invalid || undefined} className={`${control} ${className}`} {...props} />;
});

type InputProps = InputHTMLAttributes<HTMLInputElement>;

/**
 * A labelled text input in its `FieldShell`: the input is marked invalid while `error` is set.
 * The rest of the props (or react-hook-form's `register`) go to the input.
 */
export const TextField = forwardRef<
  HTMLInputElement,
  Omit<InputProps, 'id'> & { id: string; label: string; hint?: ReactNode; error?: string; unit?: string }
>(function TextField({ id, label, hint, error, unit, ...props }, ref) {
  return (
    <FieldShell label={label} htmlFor={id} hint={hint} error={error} unit={unit}>
      <Input ref={ref} id={id} invalid={!!error} {...props} />
    </FieldShell>
  );
});

/** A checkbox at least 44 px tall with its text in the label. */
export const Checkbox = forwardRef<HTMLInputElement, Omit<InputProps, 'type'> & { children: ReactNode }>(function Checkbox(
  { children, ...props },
  ref,
) {
  return (
    <label className="flex min-h-11 items-center gap-3 text-sm font-semibold">
      <input ref={ref} type="checkbox" className="size-5 accent-[var(--color-accent)]" {...props} />
      {children}
    </label>
  );
});

/** The options of a select, in order: each value as its own text (time zones, names), or its text from `labels`. */
export function PlainOptions<T extends string>({ values, labels }: { values: readonly T[]; labels?: Readonly<Record<T, ReactNode>> }) {
  return values.map((v) => (
    <option key={v} value={v}>
      {labels ? labels[v] : v}
    </option>
  ));
}

/** The `<option>`s of a list of named things (worksites, operations, datasets...): the id as value, the name as text. */
export function NamedOptions({ items }: { items: readonly { id: string; name: string }[] }) {
  return items.map((item) => (
    <option key={item.id} value={item.id}>
      {item.name}
    </option>
  ));
}

export const TextArea = forwardRef<HTMLTextAreaElement, TextareaHTMLAttributes<HTMLTextAreaElement> & { invalid?: boolean }>(
  function TextArea({ invalid, className = '', ...props }, ref) {
    return <textarea ref={ref} aria-invalid={invalid || undefined} className={`${control} py-2 ${className}`} {...props} />;
  },
);
