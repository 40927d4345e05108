import type { ReactNode } from 'react';
import type { UseFormRegisterReturn } from 'react-hook-form';
import { Card, FieldShell, Input } from '../../../components/ui';
import { FirstAnswerStatus } from './result-status';

interface NumberFieldProps {
  id: string;
  label: string;
  unit?: string;
  /** The field's react-hook-form registration (name, onChange, onBlur, ref). */
  registration: UseFormRegisterReturn;
  error?: string;
  hint?: ReactNode;
  placeholder?: string;
}

/** A decimal input (text, so a half-typed "0." or "1,5" is kept as typed) with unit, hint and error. */
export function NumberField({ id, label, unit, registration, error, hint, placeholder }: NumberFieldProps) {
  return (
    <FieldShell label={label} htmlFor={id} unit={unit} error={error} hint={hint}>
      <Input
        id={id}
        type="text"
        inputMode="decimal"
        autoComplete="off"
        spellCheck={false}
        className="tabular-nums"
        placeholder={placeholder}
        {...registration}
        invalid={!!error}
        aria-describedby={error ? `${id}-error` : undefined}
      />
    </FieldShell>
  );
}

/** One field of a `NumberFields` list: the form key it edits, and what `NumberField` shows. */
export interface NumberFieldSpec<K extends string> extends Omit<NumberFieldProps, 'registration' | 'error'> {
  name: K;
}

interface NumberFieldsProps<K extends string> {
  fields: readonly NumberFieldSpec<K>[];
  register: (name: K) => UseFormRegisterReturn;
  errors: Partial<Record<K, string>>;
  className: string;
}

/** A grid of number fields, one per spec, in the given order: registration and error by the spec's form key. */
export function NumberFields<K extends string>({ fields, register, errors, className }: NumberFieldsProps<K>) {
  return (
    <div className={className}>
      {fields.map(({ name, ...field }) => (
        <NumberField key={field.id} {...field} registration={register(name)} error={errors[name]} />
      ))}
    </div>
  );
}

/** A calculator's inputs: a card named by a heading for screen readers only, holding its number fields. */
export function InputsCard<K extends string>({ titleId, title, ...fields }: { titleId: string; title: string } & NumberFieldsProps<K>) {
  return (
    <Card aria-labelledby={titleId}>
      <h2 id={titleId} className="sr-only">
        {title}
      </h2>
      <NumberFields {...fields} />
    </Card>
  );
}

/** A calculator's answer as `useCalculator` gives it: the form, the query, the messages by field and the error no field shows. */
interface Calculation<K extends string, A> {
  check: { register: (name: K) => UseFormRegisterReturn };
  answer: { data: A | undefined; isFetching: boolean };
  errors: Partial<Record<K, string>>;
  otherError: unknown;
}

/**
 * A calculator mode's panel: its inputs card, before the first answer the error no field shows or
 * a spinner (`computingLabel`), then the results drawn from the answer, and `after` them, always.
 */
export function CalculatorPanel<K extends string, A>({
  inputs,
  calculation: { check, answer, errors, otherError },
  computingLabel = 'Computing',
  results,
  after,
}: {
  inputs: { titleId: string; title: string; className: string; fields: readonly NumberFieldSpec<K>[] };
  calculation: Calculation<K, A>;
  computingLabel?: string;
  results: (answer: A) => ReactNode;
  after?: ReactNode;
}) {
  const a = answer.data;
  return (
    <div className="grid grid-cols-1 gap-4">
      <InputsCard {...inputs} register={check.register} errors={errors} />
      <FirstAnswerStatus error={otherError} computing={!a && answer.isFetching} label={computingLabel} />
      {a ? results(a) : null}
      {after}
    </div>
  );
}
