import { z } from 'zod';
import './words';

// Query schemas of the wave calculator; the client form validates with the same ranges.
const num = (name: string, min: number, max: number, unit: string) =>
  z.coerce
    .number({ error: `${name} must be a number` })
    .refine(Number.isFinite, `${name} must be a number`)
    .refine((v) => v >= min && v <= max, `${name} must be between ${min} and ${max} ${unit}`);

export const WAVE_RANGES = {
  periodS: { min: 0.5, max: 30 },
  heightM: { min: 0, max: 40 },
  depthM: { min: 0.05, max: 6000 },
  dOverL0: { min: 1e-4, max: 100 },
} as const;

export const RegularWaveQuery = z
  .object({
    period: num('period', WAVE_RANGES.periodS.min, WAVE_RANGES.periodS.max, 's'),
    height: num('height', WAVE_RANGES.heightM.min, WAVE_RANGES.heightM.max, 'm'),
    depth: num('depth', WAVE_RANGES.depthM.min, WAVE_RANGES.depthM.max, 'm'),
    z: num('z', -6000, 0, 'm (upward from still water level, so 0 or below)').optional(),
  })
  .refine((q) => q.z === undefined || q.z >= -q.depth, { message: 'z must not be below the seabed (z >= -depth)', path: ['z'] });
export type RegularWaveQuery = z.infer<typeof RegularWaveQuery>;

export const WAVE_TABLE_MAX_ROWS = 2000;

export const WaveTableQuery = z
  .object({
    from: num('from', WAVE_RANGES.dOverL0.min, WAVE_RANGES.dOverL0.max, '(d/L0)'),
    to: num('to', WAVE_RANGES.dOverL0.min, WAVE_RANGES.dOverL0.max, '(d/L0)'),
    step: num('step', 1e-5, 100, '(d/L0)'),
  })
  .refine((q) => q.to >= q.from, { message: 'to must not be below from', path: ['to'] })
  .refine((q) => Math.floor((q.to - q.from) / q.step + 1e-9) + 1 <= WAVE_TABLE_MAX_ROWS, {
    message: `at most ${WAVE_TABLE_MAX_ROWS} rows: widen the step or narrow the range`,
    path: ['step'],
  });
export type WaveTableQuery = z.infer<typeof WaveTableQuery>;

export const SeaStateQuery = z
  .object({
    hs: num('hs', 0, 25, 'm'),
    tp: num('tp', 0.5, 40, 's').optional(),
    tz: num('tz', 0.5, 40, 's').optional(),
    te: num('te', 0.5, 40, 's').optional(),
    gamma: num('gamma', 1, 7, '').optional(),
    depth: num('depth', WAVE_RANGES.depthM.min, WAVE_RANGES.depthM.max, 'm'),
  })
  .refine((q) => q.tp !== undefined || q.tz !== undefined || q.te !== undefined, {
    message: 'give at least one of tp, tz, te',
    path: ['tp'],
  });
export type SeaStateQuery = z.infer<typeof SeaStateQuery>;

/**
 * The wave calculator's form over the text of its number fields, read by the shared query schema
 * above (the one the server parses the request with): a blank field is "not given", a decimal
 * comma is read as a point (1,5 = 1.5), and a blank required field gets its own message. The page
 * validates with it through react-hook-form's zod resolver, so it shows the server's own range
 * messages before it asks.
 */
export function typedNumberForm<K extends string, S extends z.ZodType>(
  keys: readonly K[],
  query: S,
  required: Partial<Record<K, string>>,
): z.ZodType<z.output<S>, Record<K, string>> {
  const shape: Record<string, z.ZodString> = {};
  for (const k of keys) shape[k] = z.string();
  return z
    .object(shape)
    .superRefine((raw: Record<string, string>, ctx) => {
      for (const k of keys) {
        const message = required[k];
        if (message && raw[k].trim() === '') ctx.addIssue({ code: 'custom', path: [k], message });
      }
    })
    .transform((raw: Record<string, string>) => {
      const out: Record<string, string | undefined> = {};
      for (const k of keys) {
        const text = raw[k].trim().replace(',', '.');
        out[k] = text === '' ? undefined : text;
      }
      return out;
    })
    .pipe(query as unknown as z.ZodType<z.output<S>, Record<string, string | undefined>>) as unknown as z.ZodType<
    z.output<S>,
    Record<K, string>
  >;
}

export const RegularWaveForm = typedNumberForm(['period', 'height', 'depth', 'z'], RegularWaveQuery, {
  period: 'Enter the wave period',
  height: 'Enter the wave height',
  depth: 'Enter the water depth',
});
export const SeaStateForm = typedNumberForm(['hs', 'tp', 'tz', 'te', 'gamma', 'depth'], SeaStateQuery, {
  hs: 'Enter the significant wave height',
  depth: 'Enter the water depth',
});
export const WaveTableForm = typedNumberForm(['from', 'to', 'step'], WaveTableQuery, {
  from: 'Enter the first d/L0',
  to: 'Enter the last d/L0',
  step: 'Enter the step of d/L0',
});
