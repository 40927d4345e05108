import { useEffect, useMemo, useState } from 'react';
import { useForm, type DefaultValues, type FieldValues, type Path, type Resolver } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useDebounce } from 'use-debounce';
import type { z } from 'zod';
import { readable } from './validate-fields';

/** Debounce of the inputs before a request, ms: results follow typing without a request per key. */
export const TYPING_DEBOUNCE_MS = 250;

/**
 * One calculator form on react-hook-form with the shared zod schema (shared/schemas/wave.ts, the
 * text of the fields read by the server's own query schema). Results follow typing: the values
 * are debounced and parsed with the same schema; `data` is null while any field is wrong, and the
 * page keeps showing the last valid answer. Every field re-checks the others (deps), since some
 * rules join fields (z above the bed, Tp or Tz or Te, to above from).
 */
export function useWaveForm<T extends FieldValues & Record<string, string>, Out>(
  schema: z.ZodType<Out, T>,
  fields: T,
  onChange: (fields: T) => void,
) {
  const form = useForm<T, unknown, Out>({
    resolver: zodResolver(schema as never) as unknown as Resolver<T, unknown, Out>,
    mode: 'onChange',
    defaultValues: fields as DefaultValues<T>,
  });
  const [values, setValues] = useState<T>(fields);
  useEffect(
    () =>
      form.subscribe({
        formState: { values: true },
        callback: ({ values: v }) => {
          const next = { ...v } as T;
          setValues(next);
          onChange(next);
        },
      }),
    [form, onChange],
  );
  const [debounced] = useDebounce(values, TYPING_DEBOUNCE_MS);
  const parsed = useMemo(() => schema.safeParse(debounced), [schema, debounced]);
  const keys = Object.keys(fields) as Path<T>[];
  const register = (key: Path<T>) => form.register(key, { deps: keys.filter((k) => k !== key) });
  const errors: Partial<Record<keyof T, string>> = {};
  for (const key of keys) {
    const message = form.formState.errors[key]?.message;
    if (typeof message === 'string') errors[key as keyof T] = readable(message);
  }
  /** Sets one field from code (a choice that resets another), validated as if typed. */
  const setValue = (key: Path<T>, value: string) => form.setValue(key, value as never, { shouldValidate: true, shouldDirty: true });
  return { register, setValue, values, errors, typing: debounced !== values, data: parsed.success ? parsed.data : null };
}
