/**
 * The JSON answered by the hosted marine forecast service (our own, generic wire format), as a
 * zod 4 schema. The client validates every answer with it before anything is used or stored, and
 * the local fake serves exactly this shape.
 *
 * ```json
 * { "latitude": 50.25, "longitude": -5.5, "issuedAt": "2026-12-01T06:00:00Z", "stepMinutes": 60,
 *   "hourly": { "time": ["2026-12-01T06:00:00Z", ...], "waveHeightM": [1.42, ...],
 *               "peakPeriodS": [9.1, ...], "waveDirectionDeg": [251, ...],
 *               "windSpeedMps": [7.4, ...], "windDirectionDeg": [238, ...] } }
 * ```
 *
 * Plausibility bounds (the same as the importer's): Hs 0-25 m, Tp 0.5-40 s, directions 0-360 deg
 * (360 accepted on the wire and read as 0, since some services write north that way), wind
 * 0-100 m/s. `null` marks a missing value. Times are ISO 8601 UTC with `Z`, strictly increasing.
 */
import { z } from 'zod';

/** Longest forecast accepted, in hourly steps: 40 days (services answer 7-16). */
export const MAX_FORECAST_STEPS = 40 * 24;

const isoUtc = z.iso.datetime({ offset: false, local: false });

/** A nullable number within [min, max]. */
const value = (min: number, max: number) => z.number().min(min).max(max).nullable();

const hourlySchema = z.object({
  time: z.array(isoUtc).min(1).max(MAX_FORECAST_STEPS),
  waveHeightM: z.array(value(0, 25)),
  peakPeriodS: z.array(value(0.5, 40)),
  waveDirectionDeg: z.array(value(0, 360)),
  windSpeedMps: z.array(value(0, 100)),
  windDirectionDeg: z.array(value(0, 360)),
});

const VALUE_KEYS = ['waveHeightM', 'peakPeriodS', 'waveDirectionDeg', 'windSpeedMps', 'windDirectionDeg'] as const;

/** Schema of one forecast answer; see the module comment for the shape and bounds. */
export const forecastResponseSchema = z
  .object({
    latitude: z.number().min(-90).max(90),
    longitude: z.number().min(-180).max(180),
    issuedAt: isoUtc,
    stepMinutes: z.literal(60),
    hourly: hourlySchema,
  })
  .superRefine((data, ctx) => {
    const { hourly } = data;
    const n = hourly.time.length;
    for (const key of VALUE_KEYS) {
      if (hourly[key].length !== n) {
        ctx.addIssue({
          code: 'custom',
          path: ['hourly', key],
          message: `has ${hourly[key].length} values but hourly.time has ${n}`,
        });
      }
    }
    let previous = -Infinity;
    for (let i = 0; i < n; i++) {
      const t = Date.parse(hourly.time[i]);
      if (Number.isNaN(t)) {
        ctx.addIssue({ code: 'custom', path: ['hourly', 'time', i], message: `${hourly.time[i]} is not a calendar date` });
        break;
      }
      if (!(t > previous)) {
        ctx.addIssue({
          code: 'custom',
          path: ['hourly', 'time', i],
          message: `times must be strictly increasing (${hourly.time[i]} follows ${hourly.time[i - 1]})`,
        });
        break;
      }
      previous = t;
    }
  });

/** One forecast answer as it travels on the wire. */
export type ForecastResponse = z.infer<typeof forecastResponseSchema>;
