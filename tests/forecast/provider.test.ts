// HttpForecastProvider: failures of the service, over real loopback HTTP against the fake, and
// edge cases of the client with a stubbed fetch.
import { afterEach, describe, expect, it, vi } from 'vitest';
import {
  ForecastServiceError,
  HttpForecastProvider,
  startFakeForecastService,
  type FakeForecastService,
  type ForecastAdapter,
} from '../../server/forecast';

const POSITION = { latitude: 50.1, longitude: -5.6 };
const CLOCK = () => Date.UTC(2026, 11, 3, 14, 25);

const started: FakeForecastService[] = [];
async function fake(): Promise<FakeForecastService> {
  const f = await startFakeForecastService({ clock: CLOCK });
  started.push(f);
  return f;
}
afterEach(async () => {
  await Promise.all(started.splice(0).map((f) => f.close()));
});

async function failure(promise: Promise<unknown>): Promise<ForecastServiceError> {
  try {
    await promise;
  } catch (err) {
    expect(err).toBeInstanceOf(ForecastServiceError);
    return err as ForecastServiceError;
  }
  throw new Error('expected the fetch to fail');
}

/** The error of a fetch from a fake service that fails with `kind`, and the spy its result would have reached. */
async function failedFetch(kind: Parameters<FakeForecastService['setFailure']>[0]) {
  const f = await fake();
  f.setFailure(kind);
  const store = vi.fn();
  const err = await failure(new HttpForecastProvider(f.url).fetchLatest(POSITION).then(store));
  return { err, store };
}

/** A hand-written valid answer of two hours. */
function answer(overrides: Record<string, unknown> = {}) {
  return {
    position: { lat: 50, lon: -5.5 },
    issuedAt: '2026-12-03T12:00:00Z',
    series: {
      time: ['2026-12-03T12:00:00Z', '2026-12-03T13:00:00Z'],
      hs: [1.2, null],
      tp: [8.5, 8.7],
      dir: [360, 250],
      wind: [6.1, 6.4],
      windDir: [240, 360],
      ...overrides,
    },
  };
}

describe('failures of the fake service through the real client', () => {
  it('http500 gives code "http" with the status and a plain message', async () => {
    const f = await fake();
    f.setFailure('http500');
    const err = await failure(new HttpForecastProvider(f.url).fetchLatest(POSITION));
    expect(err.code).toBe('http');
    expect(err.status).toBe(500);
    expect(err.message).toMatch(/forecast service had a problem.*HTTP 500/);
  });

  it('timeout gives code "timeout" once the time limit has passed, not long after', async () => {
    const f = await fake();
    f.setFailure('timeout');
    const t0 = performance.now();
    const err = await failure(new HttpForecastProvider(f.url, { timeoutMs: 300 }).fetchLatest(POSITION));
    const elapsed = performance.now() - t0;
    expect(err.code).toBe('timeout');
    expect(err.message).toContain('did not answer within 0.3 s');
    expect(elapsed).toBeGreaterThanOrEqual(290);
    expect(elapsed).toBeLessThan(3000);
  });

  it('malformed JSON gives code "malformed" and nothing reaches the caller', async () => {
    const { err, store } = await failedFetch('malformed');
    expect(err.code).toBe('malformed');
    expect(err.message).toMatch(/not valid JSON/);
    expect(store).not.toHaveBeenCalled();
  });

  it('a schema-invalid answer is refused whole, even when only late values are wrong', async () => {
    const { err, store } = await failedFetch('schema');
    expect(err.code).toBe('malformed');
    expect(err.details.join('\n')).toMatch(/series\.hs\.124/);
    expect(err.message).toMatch(/failed validation/);
    expect(store).not.toHaveBeenCalled();
  });

  it('fails only the next N requests when asked, then answers again', async () => {
    const f = await fake();
    const p = new HttpForecastProvider(f.url);
    f.setFailure('http500', 2);
    const before = f.requests;
    expect((await failure(p.fetchLatest(POSITION))).code).toBe('http');
    expect((await failure(p.fetchLatest(POSITION))).code).toBe('http');
    expect((await p.fetchLatest(POSITION)).records.hs.length).toBe(129);
    expect(f.requests - before).toBe(3);
    f.setFailure('malformed');
    expect((await failure(p.fetchLatest(POSITION))).code).toBe('malformed');
    expect((await failure(p.fetchLatest(POSITION))).code).toBe('malformed');
    f.setFailure('none');
    expect((await p.fetchLatest(POSITION)).records.hs.length).toBe(129);
  });

  it('an unreachable service gives code "network"', async () => {
    const f = await fake();
    const url = f.url;
    await f.close();
    const err = await failure(new HttpForecastProvider(url).fetchLatest(POSITION));
    expect(err.code).toBe('network');
    expect(err.message).toContain('connection refused');
  });

  it('close() ends a request the fake is holding, promptly', async () => {
    const f = await fake();
    f.setFailure('timeout');
    const pending = failure(new HttpForecastProvider(f.url, { timeoutMs: 20_000 }).fetchLatest(POSITION));
    while (f.requests === 0) await new Promise((r) => setTimeout(r, 10));
    const t0 = performance.now();
    await f.close();
    const err = await pending;
    expect(performance.now() - t0).toBeLessThan(2000);
    expect(err.code).toBe('network');
  });

  it("the caller's abort rejects with the caller's reason, not a service error", async () => {
    const f = await fake();
    f.setFailure('timeout');
    const controller = new AbortController();
    const pending = new HttpForecastProvider(f.url, { timeoutMs: 20_000 }).fetchLatest({ ...POSITION, signal: controller.signal });
    setTimeout(() => controller.abort(new Error('user left the page')), 50);
    await expect(pending).rejects.toThrow('user left the page');
    await expect(pending).rejects.not.toBeInstanceOf(ForecastServiceError);
  });
});

describe('HttpForecastProvider with a stubbed fetch', () => {
  const stub = (response: Response | (() => Response)) => {
    const fn = vi.fn(async (_url: string | URL | Request, _init?: RequestInit) => (typeof response === 'function' ? response() : response));
    return fn;
  };

  it('sends GET {base}/exchange/sea-state?lat&lon with accept and the key, converts nulls to NaN and 360 to 0', async () => {
    const fetchImpl = stub(new Response(JSON.stringify(answer()), { status: 200 }));
    const p = new HttpForecastProvider('https://forecast.example.test/api', {
      fetchImpl: fetchImpl as unknown as typeof fetch,
      apiKey: 'secret',
    });
    const issue = await p.fetchLatest({ latitude: 50.1, longitude: -5.6 });
    const [url, init] = fetchImpl.mock.calls[0];
    expect(String(url)).toBe('https://forecast.example.test/api/exchange/sea-state?lat=50.1&lon=-5.6');
    const headers = init?.headers as Record<string, string>;
    expect(headers.accept).toBe('application/json');
    expect(headers.authorization).toBe('Bearer secret');
    expect(issue.issuedAtMs).toBe(Date.UTC(2026, 11, 3, 12));
    expect(Array.from(issue.records.timeMs)).toEqual([Date.UTC(2026, 11, 3, 12), Date.UTC(2026, 11, 3, 13)]);
    expect(issue.records.hs[0]).toBe(1.2);
    expect(Number.isNaN(issue.records.hs[1])).toBe(true);
    expect(Array.from(issue.records.dir)).toEqual([0, 250]);
    expect(Array.from(issue.records.windDir)).toEqual([240, 0]);
  });

  it('asks and reads through the adapter it is given (the seam for a provider with another shape)', async () => {
    // A made-up provider shape: rows of [time, hs, tp, dir, wind, windDir] under `data`.
    const other: ForecastAdapter = {
      requestUrl: (base, q) => new URL(`points/${q.latitude},${q.longitude}`, base),
      toIssue: (json) => {
        const rows = (json as { data: number[][]; issued: number }).data;
        const col = (j: number) => Float64Array.from(rows, (r) => r[j]);
        return {
          issuedAtMs: (json as { issued: number }).issued,
          latitude: 50,
          longitude: -5.5,
          // This provider gives no surge: the optional column is all missing.
          records: {
            timeMs: col(0),
            hs: col(1),
            tp: col(2),
            dir: col(3),
            wind: col(4),
            windDir: col(5),
            surge: new Float64Array(rows.length).fill(NaN),
          },
        };
      },
    };
    const body = { issued: Date.UTC(2026, 11, 3, 12), data: [[Date.UTC(2026, 11, 3, 12), 1.5, 9, 250, 7, 240]] };
    const fetchImpl = stub(new Response(JSON.stringify(body)));
    const issue = await new HttpForecastProvider('http://127.0.0.1:9/', {
      fetchImpl: fetchImpl as unknown as typeof fetch,
      adapter: other,
    }).fetchLatest(POSITION);
    expect(String(fetchImpl.mock.calls[0][0])).toBe('http://127.0.0.1:9/points/50.1,-5.6');
    expect(issue.records.hs[0]).toBe(1.5);
    expect(issue.issuedAtMs).toBe(Date.UTC(2026, 11, 3, 12));
  });

  it('joins a base URL with a trailing slash correctly', async () => {
    const fetchImpl = stub(new Response(JSON.stringify(answer())));
    await new HttpForecastProvider('http://127.0.0.1:9/', { fetchImpl: fetchImpl as unknown as typeof fetch }).fetchLatest(POSITION);
    expect(String(fetchImpl.mock.calls[0][0])).toBe('http://127.0.0.1:9/exchange/sea-state?lat=50.1&lon=-5.6');
  });

  it('explains 401, 404 and 429 answers', async () => {
    const cases: [number, RegExp][] = [
      [401, /refused the request \(HTTP 401\).*key/],
      [404, /HTTP 404.*address/],
      [429, /slow down \(HTTP 429\)/],
    ];
    for (const [status, message] of cases) {
      const p = new HttpForecastProvider('http://127.0.0.1:9', {
        fetchImpl: stub(new Response('{}', { status })) as unknown as typeof fetch,
      });
      const err = await failure(p.fetchLatest(POSITION));
      expect(err.code).toBe('http');
      expect(err.status).toBe(status);
      expect(err.message).toMatch(message);
    }
  });

  it('refuses answers that break the schema, with the path of the problem', async () => {
    const bad = [
      answer({ hs: [1.2] }),
      answer({ time: ['2026-12-03T13:00:00Z', '2026-12-03T12:00:00Z'] }),
      answer({ tp: [8.5, 99] }),
      { ...answer(), issuedAt: 'yesterday' },
    ];
    const expected = ['series.hs', 'series.time.1', 'series.tp.1', 'issuedAt'];
    for (let i = 0; i < bad.length; i++) {
      const p = new HttpForecastProvider('http://127.0.0.1:9', {
        fetchImpl: stub(new Response(JSON.stringify(bad[i]))) as unknown as typeof fetch,
      });
      const err = await failure(p.fetchLatest(POSITION));
      expect(err.code).toBe('malformed');
      expect(err.details[0].startsWith(`${expected[i]}:`), err.details[0]).toBe(true);
    }
  });

  it('refuses an answer larger than the limit and one that is not UTF-8', async () => {
    const big = new HttpForecastProvider('http://127.0.0.1:9', {
      maxBytes: 100,
      fetchImpl: stub(new Response(JSON.stringify(answer()))) as unknown as typeof fetch,
    });
    expect((await failure(big.fetchLatest(POSITION))).code).toBe('malformed');
    const latin1 = new HttpForecastProvider('http://127.0.0.1:9', {
      fetchImpl: stub(new Response(new Uint8Array([0x7b, 0xff, 0xfe, 0x7d]))) as unknown as typeof fetch,
    });
    expect((await failure(latin1.fetchLatest(POSITION))).code).toBe('malformed');
  });

  it('refuses invalid positions and configuration before any request', async () => {
    const fetchImpl = stub(new Response('{}'));
    const p = new HttpForecastProvider('http://127.0.0.1:9', { fetchImpl: fetchImpl as unknown as typeof fetch });
    await expect(p.fetchLatest({ latitude: 91, longitude: 0 })).rejects.toThrow(RangeError);
    await expect(p.fetchLatest({ latitude: 0, longitude: NaN })).rejects.toThrow(RangeError);
    expect(fetchImpl).not.toHaveBeenCalled();
    expect(() => new HttpForecastProvider('not a url')).toThrow(RangeError);
    expect(() => new HttpForecastProvider('ftp://host/')).toThrow(RangeError);
    expect(() => new HttpForecastProvider('http://host/', { timeoutMs: 0 })).toThrow(RangeError);
  });
});
