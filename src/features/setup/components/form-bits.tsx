import { type FormEventHandler, type InputHTMLAttributes, type ReactNode } from 'react';
import {
  get,
  type FieldErrors,
  type FieldValues,
  type Path,
  type Resolver,
  type UseFormRegisterReturn,
  type UseFormSetError,
} from 'react-hook-form';
import { ApiError } from '../../../lib/api';
import { Button, FieldShell, Input } from '../../../components/ui';
import { EDIT_FORM_ACTIONS, SubmitOrCancel } from '../../../components/ui/form-actions';

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

/**
 * An editor of a list of [from, to] pairs (curve points, bands): the pairs as typed, the list to
 * keep after an edit, and the error at a suffix of the list's path ('' the list, '.2.0' a cell).
 */
export interface PairListEditorProps {
  value: [string, string][];
  onChange: (next: [string, string][]) => void;
  errorOf: (suffix: string) => string | undefined;
}

/** A [from, to] pair of a list with one side replaced by what was typed. */
export function setPairAt(list: [string, string][], i: number, side: 0 | 1, text: string): [string, string][] {
  return list.map((p, r) => (r === i ? (side === 0 ? [text, p[1]] : [p[0], text]) : p));
}

/** A list without its item at `i` (a removed row or column). */
export const withoutAt = <T,>(list: readonly T[], i: number): T[] => list.filter((_, k) => k !== i);

/** The two cells of a [from, to] pair side by side ("6 – 10"), each with its own label and error. */
export function PairCells({
  pair,
  labels,
  errors,
  onValue,
  className,
}: {
  pair: [string, string];
  labels: [string, string];
  errors: [string | undefined, string | undefined];
  onValue: (side: 0 | 1, text: string) => void;
  className: string;
}) {
  return (
    <>
      <CellInput label={labels[0]} value={pair[0]} onValue={(t) => onValue(0, t)} error={errors[0]} className={className} />
      <span aria-hidden>–</span>
      <CellInput label={labels[1]} value={pair[1]} onValue={(t) => onValue(1, t)} error={errors[1]} className={className} />
    </>
  );
}

/**
 * The small "Remove" (or other words) button of a grid's row or column, named for screen readers
 * by `label`; `what` it removes gives its tooltip ("Remove this point").
 */
export function RemoveButton({
  label,
  onClick,
  disabled,
  what,
  className = '',
  children,
}: {
  label: string;
  onClick: () => void;
  disabled?: boolean;
  what?: string;
  className?: string;
  children?: ReactNode;
}) {
  return (
    <Button
      variant="ghost"
      className={`${className} !px-2 text-xs text-ink-soft`.trim()}
      onClick={onClick}
      disabled={disabled}
      aria-label={label}
      title={what ? `Remove this ${what}` : undefined}
    >
      {children ?? 'Remove'}
    </Button>
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

/** "0.1–20 m": a range of the shared limits with its unit, for a field's hint. */
export const rangeHint = (r: { min: number; max: number }, unit: string) => `${r.min}–${r.max} ${unit}`;

/** One decimal field of a form: the field's name (also its error's path), its id, label, unit and hint. */
export interface DecimalSpec<N extends string> {
  name: N;
  id: string;
  label: string;
  unit?: string;
  hint?: ReactNode;
}

/** A decimal input (text with a decimal keypad) in its labelled shell: unit, hint, error. */
export function DecimalField({
  id,
  label,
  unit,
  hint,
  error,
  registration,
  disabled,
}: Omit<DecimalSpec<string>, 'name'> & { error?: string; registration: UseFormRegisterReturn; disabled?: boolean }) {
  return (
    <FieldShell label={label} unit={unit} htmlFor={id} error={error} hint={hint}>
      <Input id={id} inputMode="decimal" {...registration} disabled={disabled} invalid={!!error} />
    </FieldShell>
  );
}

/**
 * Decimal fields in the order of their specs (the caller's grid holds them). `bind` gives each its
 * element id, its error and its registration.
 */
export function DecimalFields<N extends string>({
  fields,
  bind,
  disabled,
}: {
  fields: readonly DecimalSpec<N>[];
  bind: (spec: DecimalSpec<N>) => { id: string; error?: string; registration: UseFormRegisterReturn };
  disabled?: boolean;
}) {
  return fields.map((spec) => (
    <DecimalField key={spec.name} label={spec.label} unit={spec.unit} hint={spec.hint} {...bind(spec)} disabled={disabled} />
  ));
}

/** A form's "Name" field: the thing's own name, never filled in by the browser. */
export function NameField({ id, error, registration }: { id: string; error?: string; registration: UseFormRegisterReturn }) {
  return (
    <FieldShell label="Name" htmlFor={id} error={withSubject('Name', error)}>
      <Input id={id} autoComplete="off" {...registration} invalid={!!error} />
    </FieldShell>
  );
}

/** Ticks on a list of things (worksites, people) in two columns: `chosen` holds the ids ticked. */
export function TickList<T>({
  items,
  idOf,
  chosen,
  onChange,
  children,
}: {
  items: readonly T[];
  idOf: (item: T) => string;
  chosen: readonly string[];
  onChange: (next: string[]) => void;
  /** What stands beside an item's tick. */
  children: (item: T) => ReactNode;
}) {
  return (
    <div className="grid gap-x-4 sm:grid-cols-2">
      {items.map((item) => {
        const id = idOf(item);
        return (
          <label key={id} className="flex min-h-11 items-center gap-3 text-sm">
            <input
              type="checkbox"
              className="size-5 accent-[var(--color-accent)]"
              checked={chosen.includes(id)}
              onChange={(e) => onChange(e.target.checked ? [...chosen, id] : chosen.filter((x) => x !== id))}
            />
            {children(item)}
          </label>
        );
      })}
    </div>
  );
}

/**
 * An add-or-edit form of the setup ("New worksite", or "Edit worksite Berth A" when `editing`
 * names the one edited): its fields, then the error of its submission, Add or Save, and Cancel.
 */
export function EditForm({
  thing,
  editing,
  onSubmit,
  mutation,
  onCancel,
  children,
}: {
  thing: string;
  editing: string | undefined;
  onSubmit: FormEventHandler<HTMLFormElement>;
  mutation: { isPending: boolean; error: unknown };
  onCancel: () => void;
  children: ReactNode;
}) {
  const isEdit = editing !== undefined;
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-label={isEdit ? `Edit ${thing} ${editing}` : `New ${thing}`}>
      {children}
      <SubmitOrCancel {...EDIT_FORM_ACTIONS} mutation={mutation} label={`${isEdit ? 'Save' : 'Add'} ${thing}`} onCancel={onCancel} />
    </form>
  );
}

/**
 * A file chooser shown as a button-like label (`children`): `onFile` gets the file chosen, and the
 * same file can be chosen again after a fix.
 */
export function FilePicker({
  id,
  accept,
  onFile,
  children,
}: {
  id: string;
  accept: string;
  onFile: (file: File | undefined) => void;
  children: ReactNode;
}) {
  return (
    <>
      <label
        htmlFor={id}
        className="inline-flex min-h-11 cursor-pointer items-center rounded-lg border border-line bg-surface-2 px-4 text-sm font-semibold hover:border-accent"
      >
        {children}
      </label>
      <input
        id={id}
        type="file"
        accept={accept}
        className="sr-only"
        onChange={(e) => {
          onFile(e.target.files?.[0]);
          e.target.value = '';
        }}
      />
    </>
  );
}
