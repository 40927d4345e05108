import { afterEach, describe, expect, it } from 'vitest';
import { createForecastProvider, ForecastServiceError, type ForecastSetup } from '../../server/forecast';

const setups: ForecastSetup[] = [];
afterEach(async () => {
  await Promise.all(setups.splice(0).map((s) => s.close()));
});

describe('createForecastProvider', () => {
  it('starts the local fake on loopback when no URL is configured, and stops it on close', async () => {
    const setup = await createForecastProvider({ fake: { clock: () => Date.UTC(2026, 11, 3, 14, 25) } });
    setups.push(setup);
    expect(setup.fake).toBeDefined();
    expect(setup.fake!.url).toMatch(/^http:\/\/127\.0\.0\.1:\d+$/);
    expect(setup.provider.name).toBe('local-fake-forecast-service');
    const issue = await setup.provider.fetchLatest({ latitude: 50.1, longitude: -5.6 });
    expect(issue.records.timeMs.length).toBe(129);
    expect(setup.fake!.requests).toBe(1);
    await setup.close();
    await setup.close(); // twice is fine
    const err = await setup.provider.fetchLatest({ latitude: 50.1, longitude: -5.6 }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ForecastServiceError);
    expect((err as ForecastServiceError).code).toBe('network');
  });

  it('treats a blank URL as none', async () => {
    const setup = await createForecastProvider({ forecastUrl: '  ' });
    setups.push(setup);
    expect(setup.fake).toBeDefined();
  });

  it('uses the configured service and starts no fake when a URL is given', async () => {
    const setup = await createForecastProvider({ forecastUrl: 'https://forecast.example.test/' });
    setups.push(setup);
    expect(setup.fake).toBeUndefined();
    expect(setup.provider.name).toBe('marine-forecast-service');
  });
});
