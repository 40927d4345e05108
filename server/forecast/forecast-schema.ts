/**
 * The sea-state exchange: Lullwatch's own JSON shape for a forecast at one position
 * (docs/domain.md#forecast-service). The forecast client asks `GET {base}/exchange/sea-state?lat=&lon=`
 * and validates every answer with {@link seaStateExchangeSchema} (zod) before anything is used or
 * stored; the local fake serves exactly this shape. A provider that answers another shape gets an
 * adapter beside `adapters/sea-state-exchange.ts` instead.
 *
 * ```json
 * { "position": { "lat": 50.25, "lon": -5.5 },
 *   "issuedAt": "2026-12-01T06:00:00Z",
 *   "series": { "time": ["2026-12-01T06:00:00Z", "2026-12-01T07:00:00Z", ...],
 *               "hs": [1.42, 1.45, ...], "tp": [9.1, null, ...], "dir": [251, ...],
 *               "wind": [7.4, ...], "windDir": [238, ...] } }
 * ```
 *
 * - `position`: the point the forecast is for (a service may snap to its model grid), deg.
 * - `issuedAt`: the issue (analysis) time. Times are ISO 8601 UTC with `Z`.
 * - `series.time`: each record's valid time, strictly increasing. There is no single step field:
 *   the step may change part-way (hourly for the first days, then 3-hourly), and each record's
 *   time says so.
 * - Every other `series` member is one variable, an array as long as `time`; `null` marks a
 *   missing value. The members, their units and plausibility bounds (the importer's) are the rows
 *   of {@link EXCHANGE_SERIES}; directions may be written 360 for north and are read as 0.
 * - `members` (optional, asked for with `&members=N`): an ensemble's perturbed runs beside the
 *   control (the `series` above is the control, member 0), each `{ "member": 1, "series": { "hs":
 *   [...], ... } }` with the same variables, aligned with `series.time` (no times of its own).
 *   Member numbers are distinct integers from 1 (docs/domain.md#forecast-uncertainty).
 */
import { z } from 'zod';

/** Longest forecast accepted, in records: 40 days hourly (services answer 7-16 days). */
export const MAX_FORECAST_STEPS = 40 * 24;

/** Most ensemble members accepted in one answer (beside the control). */
export const MAX_EXCHANGE_MEMBERS = 100;

/** The path of the exchange below the configured base URL (no leading slash). */
export const EXCHANGE_PATH = 'exchange/sea-state';

export interface ExchangeSeriesSpec {
  /** What the values are, for the documentation and error messages. */
  label: string;
  unit: string;
  /** Plausibility bounds, inclusive. */
  min: number;
  max: number;
  /** A direction in degrees, nautical coming-from (360 on the wire is read as 0). */
  direction: boolean;
  /** false: an answer may leave the member out, and every value is then missing. */
  required: boolean;
}

/**
 * The variables of the exchange, one row each (name on the wire = name in the forecast records).
 * Adding a variable is one row here: the schema, the type of the answer, the conversion to
 * records and the fake's answer all follow from this table.
 */
export const EXCHANGE_SERIES = {
  hs: { label: 'significant wave height Hm0', unit: 'm', min: 0, max: 25, direction: false, required: true },
  tp: { label: 'peak period', unit: 's', min: 0.5, max: 40, direction: false, required: true },
  dir: { label: 'mean wave direction, coming from', unit: 'deg', min: 0, max: 360, direction: true, required: true },
  wind: { label: 'wind speed at 10 m', unit: 'm/s', min: 0, max: 100, direction: false, required: true },
  windDir: { label: 'wind direction, coming from', unit: 'deg', min: 0, max: 360, direction: true, required: true },
  // Partitions (docs/domain.md#partitions): Hs 0 = the partition is absent that hour.
  'windSea.hs': { label: 'wind sea Hs', unit: 'm', min: 0, max: 25, direction: false, required: false },
  'windSea.tp': { label: 'wind sea peak period', unit: 's', min: 0.5, max: 40, direction: false, required: false },
  'windSea.dir': { label: 'wind sea direction, coming from', unit: 'deg', min: 0, max: 360, direction: true, required: false },
  'swell1.hs': { label: 'primary swell Hs', unit: 'm', min: 0, max: 25, direction: false, required: false },
  'swell1.tp': { label: 'primary swell peak period', unit: 's', min: 0.5, max: 40, direction: false, required: false },
  'swell1.dir': { label: 'primary swell direction, coming from', unit: 'deg', min: 0, max: 360, direction: true, required: false },
  'swell2.hs': { label: 'secondary swell Hs', unit: 'm', min: 0, max: 25, direction: false, required: false },
  'swell2.tp': { label: 'secondary swell peak period', unit: 's', min: 0.5, max: 40, direction: false, required: false },
  'swell2.dir': { label: 'secondary swell direction, coming from', unit: 'deg', min: 0, max: 360, direction: true, required: false },
} as const satisfies Record<string, ExchangeSeriesSpec>;

export type ExchangeSeriesKey = keyof typeof EXCHANGE_SERIES;

/** The variable names in table order. */
export const EXCHANGE_SERIES_KEYS = Object.keys(EXCHANGE_SERIES) as ExchangeSeriesKey[];

export type RequiredKey = { [K in ExchangeSeriesKey]: (typeof EXCHANGE_SERIES)[K]['required'] extends true ? K : never }[ExchangeSeriesKey];

/** One forecast answer as it travels on the wire. */
export interface SeaStateExchange {
  position: { lat: number; lon: number };
  issuedAt: string;
  series: { time: string[] } & { [K in RequiredKey]: (number | null)[] } & {
    [K in Exclude<ExchangeSeriesKey, RequiredKey>]?: (number | null)[];
  };
  /** Ensemble members beside the control, aligned with `series.time`. */
  members?: { member: number; series: ExchangeMemberSeries }[];
}

/** One member's variables (no times: those of the control's `series.time`). */
export type ExchangeMemberSeries = Omit<SeaStateExchange['series'], 'time'>;

const isoUtc = z.iso.datetime({ offset: false, local: false });

const seriesShape: Record<string, z.ZodType> = { time: z.array(isoUtc).min(1).max(MAX_FORECAST_STEPS) };
const memberShape: Record<string, z.ZodType> = {};
for (const key of EXCHANGE_SERIES_KEYS) {
  const spec: ExchangeSeriesSpec = EXCHANGE_SERIES[key];
  const column = z.array(z.number().min(spec.min).max(spec.max).nullable()).max(MAX_FORECAST_STEPS);
  seriesShape[key] = spec.required ? column : column.optional();
  memberShape[key] = seriesShape[key];
}
const memberSchema = z.object({ member: z.number().int().min(1).max(1000), series: z.object(memberShape) });

/** Schema of one exchange answer; see the module comment for the shape and bounds. */
export const seaStateExchangeSchema = z
  .object({
    position: z.object({ lat: z.number().min(-90).max(90), lon: z.number().min(-180).max(180) }),
    issuedAt: isoUtc,
    series: z.object(seriesShape),
    members: z.array(memberSchema).max(MAX_EXCHANGE_MEMBERS).optional(),
  })
  .superRefine((data, ctx) => {
    const series = data.series as Record<string, unknown[] | undefined>;
    const time = series.time as string[];
    const n = time.length;
    for (const key of EXCHANGE_SERIES_KEYS) {
      const column = series[key];
      if (column && column.length !== n) {
        ctx.addIssue({ code: 'custom', path: ['series', key], message: `has ${column.length} values but series.time has ${n}` });
      }
    }
    const seen = new Set<number>();
    (data.members ?? []).forEach((m, k) => {
      if (seen.has(m.member)) ctx.addIssue({ code: 'custom', path: ['members', k, 'member'], message: `member ${m.member} appears twice` });
      seen.add(m.member);
      const columns = m.series as Record<string, unknown[] | undefined>;
      for (const key of EXCHANGE_SERIES_KEYS) {
        const column = columns[key];
        if (column && column.length !== n) {
          ctx.addIssue({
            code: 'custom',
            path: ['members', k, 'series', key],
            message: `has ${column.length} values but series.time has ${n}`,
          });
        }
      }
    });
    let previous = -Infinity;
    for (let i = 0; i < n; i++) {
      const t = Date.parse(time[i]);
      if (Number.isNaN(t)) {
        ctx.addIssue({ code: 'custom', path: ['series', 'time', i], message: `${time[i]} is not a calendar date` });
        break;
      }
      if (!(t > previous)) {
        ctx.addIssue({
          code: 'custom',
          path: ['series', 'time', i],
          message: `times must be strictly increasing (${time[i]} follows ${time[i - 1]})`,
        });
        break;
      }
      previous = t;
    }
  }) as unknown as z.ZodType<SeaStateExchange>;
