/**
 * Forecast service module: the provider interface and its HTTP client with one adapter per
 * provider shape (adapters/), the local fake service, our own exchange shape, and the invented sea states behind the demo hindcast and the fake.
 */
import { startFakeForecastService, type FakeForecastService, type FakeForecastServiceOptions } from './fake-service';
import { HttpForecastProvider, type ForecastProvider } from './provider';

// Provider interface and HTTP client
export { HttpForecastProvider } from './provider';
export type {
  ForecastAdapter,
  ForecastIssue,
  ForecastProvider,
  ForecastQuery,
  ForecastRecords,
  HttpForecastProviderOptions,
} from './provider';
export { seaStateExchangeAdapter, exchangeToRecords } from './adapters/sea-state-exchange';
export { ForecastServiceError } from './forecast-service-error';
export type { ForecastServiceErrorCode } from './forecast-service-error';
// Wire format: our own sea-state exchange
export { seaStateExchangeSchema, EXCHANGE_PATH, EXCHANGE_SERIES, EXCHANGE_SERIES_KEYS, MAX_FORECAST_STEPS } from './forecast-schema';
export type { ExchangeSeriesKey, ExchangeSeriesSpec, SeaStateExchange } from './forecast-schema';
// Local fake service
export { startFakeForecastService } from './fake-service';
export type { FakeFailureMode, FakeForecastRequestLog, FakeForecastService, FakeForecastServiceOptions } from './fake-service';
export {
  buildFakeForecast,
  latestIssueTimeMs,
  snapToGrid,
  truthSeedForPosition,
  climateForPosition,
  ISSUE_CYCLE_HOURS,
  FAKE_GRID_DEG,
} from './fake-forecast';
export type { FakeForecastRequest } from './fake-forecast';
// Invented sea states
export { generateSyntheticSea, DEFAULT_SEA_CLIMATE } from './synthetic-sea';
export type { SeaClimate, SyntheticSeaRequest, SyntheticSeaSeries } from './synthetic-sea';

export interface ForecastConfig {
  /** Base URL of the hosted forecast service; when absent the local fake is started. */
  forecastUrl?: string;
  /** Key for the hosted service, sent as a bearer token. */
  forecastApiKey?: string;
  /** Time limit per fetch, ms (default 15,000). */
  timeoutMs?: number;
  /** Options of the fake, used only when no URL is configured (default: free loopback port). */
  fake?: FakeForecastServiceOptions;
}

export interface ForecastSetup {
  provider: ForecastProvider;
  /** The local fake, when one was started (no URL configured). */
  fake?: FakeForecastService;
  /** Stops the fake if one was started; safe to call more than once. */
  close(): Promise<void>;
}

/**
 * Wires the forecast provider from configuration: the hosted service when `forecastUrl` is set,
 * otherwise a local fake on a free loopback port, reached through the same HTTP client (so
 * development and tests exercise the real client code).
 * @throws RangeError for an invalid URL; rejects when the fake cannot listen
 */
export async function createForecastProvider(config: ForecastConfig = {}): Promise<ForecastSetup> {
  const url = config.forecastUrl?.trim();
  if (url) {
    const provider = new HttpForecastProvider(url, { apiKey: config.forecastApiKey, timeoutMs: config.timeoutMs });
    return { provider, close: async () => undefined };
  }
  const fake = await startFakeForecastService({ port: 0, host: '127.0.0.1', ...config.fake });
  const provider = new HttpForecastProvider(fake.url, {
    apiKey: config.fake?.apiKey,
    timeoutMs: config.timeoutMs,
    name: 'local-fake-forecast-service',
  });
  return { provider, fake, close: () => fake.close() };
}
