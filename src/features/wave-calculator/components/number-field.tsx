import type { ReactNode } from 'react';
import type { UseFormRegisterReturn } from 'react-hook-form';
import { FieldShell, Input } from '../../../components/ui';

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
