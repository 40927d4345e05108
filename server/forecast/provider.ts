/**
 * Forecast providers: the small interface the rest of the server uses to get the latest forecast
 * for a data point, and its HTTP implementation for the hosted marine forecast service.
 */
import { ForecastServiceError } from './forecast-service-error';
import { seaStateExchangeAdapter } from './adapters/sea-state-exchange';
import type { ForecastAdapter, ForecastIssue, ForecastProvider, ForecastQuery } from './types';

export type { ForecastAdapter, ForecastIssue, ForecastProvider, ForecastQuery, ForecastRecords } from './types';

export interface HttpForecastProviderOptions {
  /** Reads the provider's shape; default our own sea-state exchange (adapters/sea-state-exchange.ts). */
  adapter?: ForecastAdapter;
  /** Time limit for the whole exchange (connect, headers and body), ms; default 15,000. */
  timeoutMs?: number;
  /** The fetch to use (tests may pass a stub); default the global fetch. */
  fetchImpl?: typeof fetch;
  /** Sent as `authorization: Bearer <apiKey>` when given. */
  apiKey?: string;
  /** Provider name, default 'marine-forecast-service'. */
  name?: string;
  /** Largest answer accepted, bytes; default 8 MiB (a 16-day hourly answer is about 60 kB). */
  maxBytes?: number;
}

const DEFAULT_TIMEOUT_MS = 15_000;
const DEFAULT_MAX_BYTES = 8 * 1024 * 1024;

/** Plain-language names of the usual socket errors, for the user-facing message. */
const NETWORK_REASONS: Record<string, string> = {
  ECONNREFUSED: 'connection refused',
  ECONNRESET: 'connection reset',
  ENOTFOUND: 'host name not found',
  EAI_AGAIN: 'host name lookup failed',
  ETIMEDOUT: 'connection timed out',
  EHOSTUNREACH: 'host unreachable',
  ENETUNREACH: 'network unreachable',
  UND_ERR_SOCKET: 'connection closed by the service',
};

function formatSeconds(ms: number): string {
  const s = ms / 1000;
  return Number.isInteger(s) ? `${s} s` : `${s.toFixed(1)} s`;
}

/** Finds a socket error code in an error or its causes (undici wraps them in `cause`). */
function networkCode(err: unknown): string | undefined {
  let e: unknown = err;
  for (let depth = 0; depth < 4 && e && typeof e === 'object'; depth++) {
    const code = (e as { code?: unknown }).code;
    if (typeof code === 'string') return code;
    e = (e as { cause?: unknown }).cause;
  }
  return undefined;
}

function httpMessage(status: number, statusText: string): string {
  const label = `HTTP ${status}${statusText ? ` ${statusText}` : ''}`;
  if (status === 401 || status === 403) {
    return `The forecast service refused the request (${label}). Check the forecast service key in the server configuration.`;
  }
  if (status === 404) {
    return `The forecast service has no forecast at the configured address (${label}). Check the forecast service address in the server configuration.`;
  }
  if (status === 429) return `The forecast service asked us to slow down (${label}). Try again in a few minutes.`;
  if (status >= 500) return `The forecast service had a problem of its own (${label}). Try again later.`;
  return `The forecast service did not accept the request (${label}).`;
}

/**
 * Client of a hosted marine forecast service over HTTP: `GET` with `accept: application/json` at
 * the adapter's address (by default our own exchange, `{baseUrl}/exchange/sea-state?lat=..&lon=..`),
 * answer validated and converted by the adapter.
 * No retries inside: the scheduled fetch job tries again at its next tick, and a coordinator can
 * press the button again.
 */
export class HttpForecastProvider implements ForecastProvider {
  readonly name: string;
  private readonly base: URL;
  private readonly adapter: ForecastAdapter;
  private readonly timeoutMs: number;
  private readonly fetchImpl: typeof fetch;
  private readonly apiKey?: string;
  private readonly maxBytes: number;

  /**
   * @param baseUrl http(s) URL of the service, with or without a trailing slash
   * @throws RangeError for a URL that is not http(s), or a timeout that is not a positive number
   */
  constructor(baseUrl: string, options: HttpForecastProviderOptions = {}) {
    let base: URL;
    try {
      base = new URL(baseUrl);
    } catch {
      throw new RangeError(`forecast service URL is not a valid URL: ${JSON.stringify(baseUrl)}`);
    }
    if (base.protocol !== 'http:' && base.protocol !== 'https:') {
      throw new RangeError(`forecast service URL must use http or https, got ${base.protocol}`);
    }
    const timeoutMs = options.timeoutMs ?? DEFAULT_TIMEOUT_MS;
    if (!(Number.isFinite(timeoutMs) && timeoutMs > 0)) throw new RangeError(`timeoutMs must be a positive number, got ${timeoutMs}`);
    if (!base.pathname.endsWith('/')) base.pathname += '/';
    this.base = base;
    this.adapter = options.adapter ?? seaStateExchangeAdapter;
    this.timeoutMs = timeoutMs;
    this.fetchImpl = options.fetchImpl ?? fetch;
    this.apiKey = options.apiKey;
    this.name = options.name ?? 'marine-forecast-service';
    this.maxBytes = options.maxBytes ?? DEFAULT_MAX_BYTES;
  }

  async fetchLatest(query: ForecastQuery): Promise<ForecastIssue> {
    const { latitude, longitude, signal, members } = query;
    if (!(Number.isFinite(latitude) && latitude >= -90 && latitude <= 90))
      throw new RangeError(`latitude must be within -90..90, got ${latitude}`);
    if (!(Number.isFinite(longitude) && longitude >= -180 && longitude <= 180))
      throw new RangeError(`longitude must be within -180..180, got ${longitude}`);
    signal?.throwIfAborted();

    const url = this.adapter.requestUrl(this.base, { latitude, longitude, ...(members ? { members } : {}) });
    const headers: Record<string, string> = { accept: 'application/json' };
    if (this.apiKey) headers.authorization = `Bearer ${this.apiKey}`;

    // One timer for the whole exchange, and the caller's signal, both abort the same request.
    const controller = new AbortController();
    let timedOut = false;
    const timer = setTimeout(() => {
      timedOut = true;
      controller.abort(new Error('forecast service timeout'));
    }, this.timeoutMs);
    const onCallerAbort = () => controller.abort(signal?.reason);
    signal?.addEventListener('abort', onCallerAbort, { once: true });

    const transportError = (err: unknown): unknown => {
      if (err instanceof ForecastServiceError) return err;
      if (timedOut) {
        return new ForecastServiceError(
          'timeout',
          `The forecast service did not answer within ${formatSeconds(this.timeoutMs)}. Try again later.`,
          { cause: err },
        );
      }
      if (signal?.aborted) return signal.reason;
      const code = networkCode(err);
      const reason = code ? (NETWORK_REASONS[code] ?? code) : err instanceof Error ? err.message : String(err);
      return new ForecastServiceError(
        'network',
        `Could not reach the forecast service (${reason}). Check the forecast service address in the server configuration, or try again later.`,
        { cause: err },
      );
    };

    try {
      let response: Response;
      try {
        response = await this.fetchImpl(url, { method: 'GET', headers, signal: controller.signal, redirect: 'follow' });
      } catch (err) {
        throw transportError(err);
      }
      if (!response.ok) {
        await response.body?.cancel().catch(() => undefined);
        throw new ForecastServiceError('http', httpMessage(response.status, response.statusText), { status: response.status });
      }
      let text: string;
      try {
        text = await this.readText(response);
      } catch (err) {
        throw transportError(err);
      }
      let json: unknown;
      try {
        json = JSON.parse(text);
      } catch (err) {
        throw new ForecastServiceError(
          'malformed',
          'The forecast service sent an answer that is not valid JSON. Nothing was stored; try again later.',
          {
            details: [err instanceof Error ? err.message : String(err)],
            cause: err,
          },
        );
      }
      return this.adapter.toIssue(json);
    } finally {
      clearTimeout(timer);
      signal?.removeEventListener('abort', onCallerAbort);
    }
  }

  /** Reads the body as UTF-8, refusing answers above maxBytes or with invalid UTF-8. */
  private async readText(response: Response): Promise<string> {
    const body = response.body;
    if (!body) return '';
    const reader = body.getReader();
    const chunks: Uint8Array[] = [];
    let total = 0;
    for (;;) {
      const { done, value } = await reader.read();
      if (done) break;
      total += value.byteLength;
      if (total > this.maxBytes) {
        await reader.cancel().catch(() => undefined);
        throw new ForecastServiceError(
          'malformed',
          `The forecast service sent more than ${Math.round(this.maxBytes / 1024)} kB; the answer was refused.`,
        );
      }
      chunks.push(value);
    }
    const bytes = new Uint8Array(total);
    let offset = 0;
    for (const c of chunks) {
      bytes.set(c, offset);
      offset += c.byteLength;
    }
    try {
      return new TextDecoder('utf-8', { fatal: true }).decode(bytes);
    } catch (err) {
      throw new ForecastServiceError(
        'malformed',
        'The forecast service sent an answer that is not valid UTF-8 text. Nothing was stored; try again later.',
        { cause: err },
      );
    }
  }
}
