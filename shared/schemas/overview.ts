/** Input of the project Overview (the server parses its query with it). */
import { z } from 'zod';

export const OverviewQuery = z.object({
  /** true (default): Hs limits of weather-restricted operations at OPWF = alpha × OPLIM, as on the board. */
  alpha: z
    .enum(['true', 'false'], { error: 'alpha must be true or false' })
    .default('true')
    .transform((v) => v === 'true'),
});
export type OverviewQuery = z.infer<typeof OverviewQuery>;
