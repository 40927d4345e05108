/**
 * Forecast service module: the provider interface and its HTTP client with one adapter per
 * provider shape (adapters/), the local fake service, our own exchange shape, and the invented sea states behind the demo hindcast and the fake.
 */
import { startFakeForecastService, type FakeForecastService, type FakeForecastServiceOptions } from './fake-service';
import { HttpForecastProvider, type ForecastProvider } from './provider';

// Each module's whole public surface:
// the provider interface and its HTTP client, with the adapter of our own exchange shape;
export * from './provider';
export * from './adapters/sea-state-exchange';
export * from './forecast-service-error';
// the wire format: our own sea-state exchange;
export * from './forecast-schema';
// the local fake service and its forecasts;
export * from './fake-service';
export * from './fake-forecast';
// the invented sea states.
export * from './synthetic-sea';

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
