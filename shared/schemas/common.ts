import { z } from 'zod';

/** Trimmed, non-empty, single-line display text (names). */
export const nameText = (max = 120) =>
  z
    .string()
    .trim()
    .min(1, 'is required')
    .max(max, `must be at most ${max} characters`)
    .refine((s) => !/[\r\n]/.test(s), 'must be one line');

/** Free text (descriptions, notes). */
export const longText = (max = 4000) => z.string().trim().max(max, `must be at most ${max} characters`);

export const idParam = z.string().uuid();
