/**
 * Adapter of Lullwatch's own sea-state exchange (forecast-schema.ts,
 * docs/domain.md#forecast-service): the request path and the conversion of a validated answer to
 * forecast records. A real provider with another shape gets an adapter of its own in this folder,
 * implementing the same {@link ForecastAdapter}, and is chosen in `createForecastProvider`.
 */
import { ForecastServiceError } from '../forecast-service-error';
import {
  EXCHANGE_PATH,
  EXCHANGE_SERIES,
  EXCHANGE_SERIES_KEYS,
  seaStateExchangeSchema,
  type ExchangeSeriesSpec,
  type SeaStateExchange,
} from '../forecast-schema';
import type { ForecastAdapter, ForecastIssue, ForecastRecords } from '../types';

/** At most this many validation problems are listed in an error. */
const MAX_DETAILS = 5;

/** Columns of a validated answer as records; nulls become NaN, 360 deg becomes 0; a left-out optional member has no column. */
export function exchangeToRecords(data: SeaStateExchange): ForecastRecords {
  const n = data.series.time.length;
  const timeMs = new Float64Array(n);
  for (let i = 0; i < n; i++) timeMs[i] = Date.parse(data.series.time[i]);
  return columnsToRecords(timeMs, data.series);
}

/** One run's columns (the control's or a member's) on the given times. */
function columnsToRecords(timeMs: Float64Array, columns: object): ForecastRecords {
  const n = timeMs.length;
  const records = { timeMs } as ForecastRecords;
  const wire = columns as Record<string, (number | null)[] | undefined>;
  for (const key of EXCHANGE_SERIES_KEYS) {
    const spec: ExchangeSeriesSpec = EXCHANGE_SERIES[key];
    const values = wire[key];
    if (!values && !spec.required) continue;
    const out = new Float64Array(n).fill(NaN);
    if (values) {
      for (let i = 0; i < n; i++) {
        const v = values[i];
        out[i] = v === null ? NaN : spec.direction && v === 360 ? 0 : v;
      }
    }
    records[key] = out;
  }
  return records;
}

export const seaStateExchangeAdapter: ForecastAdapter = {
  requestUrl(base, { latitude, longitude, members }) {
    const url = new URL(EXCHANGE_PATH, base);
    url.searchParams.set('lat', String(latitude));
    url.searchParams.set('lon', String(longitude));
    if (members) url.searchParams.set('members', String(members));
    return url;
  },
  toIssue(json: unknown): ForecastIssue {
    const parsed = seaStateExchangeSchema.safeParse(json);
    if (!parsed.success) {
      const details = parsed.error.issues.slice(0, MAX_DETAILS).map((issue) => `${issue.path.join('.') || '(root)'}: ${issue.message}`);
      throw new ForecastServiceError(
        'malformed',
        `The forecast service sent a forecast that failed validation (${details[0]}). Nothing was stored; try again later.`,
        { details, cause: parsed.error },
      );
    }
    const data = parsed.data;
    const records = exchangeToRecords(data);
    return {
      issuedAtMs: Date.parse(data.issuedAt),
      latitude: data.position.lat,
      longitude: data.position.lon,
      records,
      members: (data.members ?? [])
        .map((m) => ({ member: m.member, records: columnsToRecords(records.timeMs, m.series) }))
        .sort((a, b) => a.member - b.member),
    };
  },
};
