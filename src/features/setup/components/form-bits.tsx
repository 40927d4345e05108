import { type InputHTMLAttributes, type ReactNode } from 'react';
import { get, type FieldErrors, type FieldValues, type Path, type Resolver, type UseFormSetError } from 'react-hook-form';
import { ApiError } from '../../../lib/api';
import { Button } from '../../../components/ui';

/** The message of the error at a dotted path of a form's errors ('limits.hsTpCurve.2.0'), if any. */
export function errorAt(errors: FieldErrors, path: string): string | undefined {
  const e = get(errors, path) as { message?: unknown; root?: { message?: unknown } } | undefined;
  if (!e) return undefined;
  if (typeof e.message === 'string' && e.message) return e.message;
  if (e.root && typeof e.root.message === 'string') return e.root.message;
  return undefined;
}

/**
 * Puts the server's field errors (400 `details`, 409 `details` naming a field) onto the form's
 * fields. The form's field names follow the request body's paths, so `limits.hsMax` or
 * `transferTable.factors.1.2` land beside the right input. Returns how many were placed.
 */
export function applyServerErrors<T extends FieldValues>(error: unknown, setError: UseFormSetError<T>): number {
  if (!(error instanceof ApiError) || !error.details) return 0;
  let placed = 0;
  for (const d of error.details) {
    if (!d.field || d.field === '(body)') continue;
    setError(d.field as Path<T>, { type: 'server', message: d.message ?? 'Refused by the server' });
    placed++;
  }
  return placed;
}

const cellClass =
  'min-h-11 w-20 min-w-16 rounded-md border border-line bg-surface px-2 text-right text-base tabular-nums text-ink focus:border-accent aria-[invalid=true]:border-danger aria-[invalid=true]:bg-danger-soft';

/** A compact, controlled number cell for grids (curve points, bands, tables). */
export function CellInput({
  label,
  value,
  onValue,
  error,
  className = '',
  ...rest
}: Omit<InputHTMLAttributes<HTMLInputElement>, 'value' | 'onChange'> & {
  label: string;
  value: string;
  onValue: (text: string) => void;
  error?: string;
}) {
  return (
    <input
      aria-label={label}
      title={error ?? label}
      inputMode="decimal"
      autoComplete="off"
      value={value}
      onChange={(e) => onValue(e.target.value)}
      aria-invalid={error ? true : undefined}
      className={`${cellClass} ${className}`}
      {...rest}
    />
  );
}

/** Messages of a grid's cells, listed under it in reading order. */
export function GridErrors({ messages }: { messages: { where: string; message: string }[] }) {
  if (messages.length === 0) return null;
  return (
    <ul role="alert" className="mt-2 list-disc pl-5 text-sm text-danger">
      {messages.map((m, i) => (
        <li key={i}>
          <span className="font-semibold">{m.where}:</span> {m.message}
        </li>
      ))}
    </ul>
  );
}

/** A small label in the list rows. */
export function Tag({ children, tone = 'plain' }: { children: ReactNode; tone?: 'plain' | 'accent' | 'warn' }) {
  const tones = {
    plain: 'border-line bg-surface-2 text-ink-soft',
    accent: 'border-accent/40 bg-ok-soft text-ink',
    warn: 'border-st-marginal/60 bg-st-marginal/15 text-ink',
  };
  return (
    <span className={`inline-flex items-center rounded-full border px-2 py-0.5 text-xs font-semibold ${tones[tone]}`}>{children}</span>
  );
}

/**
 * The question before a deletion, in place: "Delete “Berth A”?" with the consequence, then the
 * real delete and a way back; the server's refusal (e.g. a 409) is shown inside it.
 */
export function ConfirmBox({
  what,
  consequence,
  onConfirm,
  onCancel,
  pending,
  error,
}: {
  what: string;
  consequence: string;
  onConfirm: () => void;
  onCancel: () => void;
  pending: boolean;
  error?: unknown;
}) {
  return (
    <div
      role="group"
      aria-label={`Confirm deleting ${what}`}
      className="flex flex-col gap-2 rounded-lg border border-danger bg-danger-soft p-3 text-sm text-ink"
    >
      <p>
        <span className="font-semibold">Delete {what}?</span> {consequence}
      </p>
      {error ? (
        <p role="alert" className="font-semibold text-danger">
          {error instanceof Error ? error.message : String(error)}
        </p>
      ) : null}
      <div className="flex flex-wrap gap-2">
        <Button variant="danger" onClick={onConfirm} disabled={pending}>
          {pending ? 'Deleting…' : 'Yes, delete'}
        </Button>
        <Button variant="secondary" onClick={onCancel} disabled={pending}>
          Keep it
        </Button>
      </div>
    </div>
  );
}

/** A titled group inside a form with an optional line of explanation and a group-level error. */
export function FormSection({
  id,
  title,
  hint,
  children,
  error,
}: {
  id: string;
  title: string;
  hint?: ReactNode;
  children: ReactNode;
  error?: string;
}) {
  return (
    <section role="group" aria-labelledby={`${id}-title`} className="flex min-w-0 flex-col gap-3 border-t border-line pt-4">
      <div>
        <h3 id={`${id}-title`} className="text-base font-bold">
          {title}
        </h3>
        {hint ? <div className="mt-0.5 text-sm text-ink-soft">{hint}</div> : null}
      </div>
      {error ? (
        <p role="alert" className="text-sm font-semibold text-danger">
          {error}
        </p>
      ) : null}
      {children}
    </section>
  );
}

/**
 * Wraps a resolver so that a blank required number reads "TPOP is required" rather than the
 * shared schema's "TPOP must be a number" (the schema sees NaN for both blank and malformed text).
 */
export function blankAware<TIn extends FieldValues, TCtx, TOut>(resolver: Resolver<TIn, TCtx, TOut>): Resolver<TIn, TCtx, TOut> {
  return async (values, context, options) => {
    const result = await resolver(values, context, options);
    const visit = (node: unknown, path: string) => {
      if (!node || typeof node !== 'object') return;
      const e = node as { message?: unknown };
      if (typeof e.message === 'string' && e.message.endsWith(' must be a number')) {
        const typed = get(values, path) as unknown;
        if (typeof typed === 'string' && typed.trim() === '') e.message = e.message.replace(/ must be a number$/, ' is required');
      }
      for (const [k, v] of Object.entries(node)) if (k !== 'ref' && k !== 'message' && k !== 'type') visit(v, path ? `${path}.${k}` : k);
    };
    visit(result.errors, '');
    return result;
  };
}

/** A shared-schema message that starts without its subject ("is required") given one: "Name is required". */
export function withSubject(subject: string, message: string | undefined): string | undefined {
  if (!message) return message;
  return /^[a-z]/.test(message) ? `${subject} ${message}` : message;
}
