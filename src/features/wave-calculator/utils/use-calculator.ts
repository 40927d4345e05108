import type { UseQueryResult } from '@tanstack/react-query';
import type { FieldValues } from 'react-hook-form';
import type { z } from 'zod';
import { serverFieldErrors } from './server-field-errors';
import { useWaveForm } from './use-wave-form';

/**
 * A calculator form and its answer: the form (`useWaveForm`), the query of its valid inputs, the
 * messages per field (the server's 400 details under the form's own), and whether the answer on
 * screen is for other inputs than those typed (`stale`). `otherError`: an error no field shows.
 */
export function useCalculator<T extends FieldValues & Record<string, string>, Out, A>(
  schema: z.ZodType<Out, T>,
  fields: T,
  onChange: (fields: T) => void,
  useAnswer: (inputs: Out | null) => UseQueryResult<A>,
) {
  const check = useWaveForm(schema, fields, onChange);
  const answer = useAnswer(check.data);
  const serverErrors = serverFieldErrors(answer.error);
  const errors: Partial<Record<keyof T, string>> = { ...serverErrors, ...check.errors };
  const otherError = Object.keys(serverErrors).length === 0 ? answer.error : null;
  return { check, answer, errors, otherError, stale: !check.data || answer.isPlaceholderData };
}
