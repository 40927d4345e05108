/**
 * A local fake of the hosted marine forecast service (node:http, no framework). It starts by
 * itself in development and tests when no service URL is configured, answers our own sea-state
 * exchange (forecast-schema.ts, docs/domain.md#forecast-service) with invented, deterministic
 * forecasts for any position (see fake-forecast.ts), and can fail on request for the reliability
 * tests.
 *
 * Endpoint: `GET /exchange/sea-state?lat=<deg>&lon=<deg>[&members=N]` -> 200 with a forecast (with
 * N ensemble members beside the control when asked, N within 0-50); 400 for a missing or
 * invalid position or member count; 401 when an apiKey is set and the `authorization: Bearer <key>` header does not
 * match; 404 for other paths; 405 for other methods. `GET /health` -> 200 `{"ok":true}`.
 */
import { createServer, type IncomingMessage, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import { buildFakeForecast, latestIssueTimeMs, MAX_FAKE_MEMBERS } from './fake-forecast';
import { EXCHANGE_PATH } from './forecast-schema';

/**
 * - `none`: answer normally;
 * - `timeout`: accept the request and never answer (the socket stays open until `close()`);
 * - `http500`: answer 500 with a JSON error body;
 * - `malformed`: answer 200 with a body cut short, so it is not valid JSON;
 * - `schema`: answer 200 with valid JSON that breaks the schema (a column one value short and a
 *   negative wave height late in the series, after many good values).
 */
export type FakeFailureMode = 'none' | 'timeout' | 'http500' | 'malformed' | 'schema';

export interface FakeForecastServiceOptions {
  /** TCP port, 0 for any free one (default). */
  port?: number;
  /** Interface to listen on, default 127.0.0.1 (loopback only). */
  host?: string;
  /** Seed of the invented weather, default 20261201. */
  seed?: number;
  /** Forecast length in days, integer 1-16 (the real service answers 7-16), default 10. */
  horizonDays?: number;
  /** Hours between an issue's nominal time and its availability, default 0. */
  publishDelayHours?: number;
  /** Current time, ms UTC (tests pass a fixed clock), default Date.now. */
  clock?: () => number;
  /** When set, requests must carry `authorization: Bearer <apiKey>`. */
  apiKey?: string;
}

/** What the fake received, for tests to read (the last 1,000 forecast requests). */
export interface FakeForecastRequestLog {
  latitude: number;
  longitude: number;
  authorization?: string;
  accept?: string;
  atMs: number;
}

export interface FakeForecastService {
  /** Base URL, e.g. `http://127.0.0.1:41234` (no trailing slash). */
  readonly url: string;
  /** Number of forecast requests received (including failed and refused ones). */
  readonly requests: number;
  readonly received: readonly FakeForecastRequestLog[];
  /**
   * Makes the next `times` forecast requests fail in the given way (all following ones when
   * `times` is omitted); `setFailure('none')` restores normal answers.
   */
  setFailure(mode: FakeFailureMode, times?: number): void;
  /** Stops listening and ends every open connection, including held `timeout` requests. */
  close(): Promise<void>;
}

function sendJson(res: ServerResponse, status: number, body: unknown): void {
  const text = JSON.stringify(body);
  res.writeHead(status, {
    'content-type': 'application/json; charset=utf-8',
    'content-length': Buffer.byteLength(text),
    'cache-control': 'no-store',
  });
  res.end(text);
}

function sendError(res: ServerResponse, status: number, code: string, message: string): void {
  sendJson(res, status, { error: { code, message } });
}

function parseCoordinate(raw: string | null, min: number, max: number): number | undefined {
  if (raw === null || raw.trim() === '') return undefined;
  const v = Number(raw);
  return Number.isFinite(v) && v >= min && v <= max ? v : undefined;
}

/**
 * Starts the fake on loopback.
 * @returns once listening; `url` holds the chosen port
 * @throws RangeError for a horizon outside 1-16 days; rejects when the port cannot be bound
 */
export async function startFakeForecastService(options: FakeForecastServiceOptions = {}): Promise<FakeForecastService> {
  const {
    port = 0,
    host = '127.0.0.1',
    seed = 20261201,
    horizonDays = 10,
    publishDelayHours = 0,
    clock = () => Date.now(),
    apiKey,
  } = options;
  if (!(Number.isInteger(horizonDays) && horizonDays >= 1 && horizonDays <= 16)) {
    throw new RangeError(`horizonDays must be an integer within 1-16, got ${horizonDays}`);
  }
  let failure: FakeFailureMode = 'none';
  let failuresLeft = Infinity;
  let requests = 0;
  const received: FakeForecastRequestLog[] = [];

  const takeFailure = (): FakeFailureMode => {
    if (failure === 'none') return 'none';
    const mode = failure;
    failuresLeft -= 1;
    if (failuresLeft <= 0) {
      failure = 'none';
      failuresLeft = Infinity;
    }
    return mode;
  };

  const handle = (req: IncomingMessage, res: ServerResponse): void => {
    const url = new URL(req.url ?? '/', 'http://fake.invalid');
    if (url.pathname === '/health') {
      sendJson(res, 200, { ok: true });
      return;
    }
    if (url.pathname !== `/${EXCHANGE_PATH}`) {
      sendError(res, 404, 'not_found', `No such endpoint: ${url.pathname}`);
      return;
    }
    if (req.method !== 'GET') {
      res.setHeader('allow', 'GET');
      sendError(res, 405, 'method_not_allowed', 'Use GET.');
      return;
    }
    requests += 1;
    const latitude = parseCoordinate(url.searchParams.get('lat'), -90, 90);
    const longitude = parseCoordinate(url.searchParams.get('lon'), -180, 180);
    const authorization = req.headers.authorization;
    received.push({ latitude: latitude ?? NaN, longitude: longitude ?? NaN, authorization, accept: req.headers.accept, atMs: clock() });
    if (received.length > 1000) received.shift();

    const mode = takeFailure();
    if (mode === 'timeout') return; // hold the request; close() ends the socket
    if (mode === 'http500') {
      sendError(res, 500, 'internal', 'The forecast model run failed (fake failure).');
      return;
    }
    if (apiKey !== undefined && authorization !== `Bearer ${apiKey}`) {
      sendError(res, 401, 'unauthorized', 'Missing or wrong API key.');
      return;
    }
    if (latitude === undefined || longitude === undefined) {
      sendError(res, 400, 'bad_position', 'lat must be a number within -90..90 and lon within -180..180.');
      return;
    }
    const membersRaw = url.searchParams.get('members');
    const members = membersRaw === null ? 0 : Number(membersRaw);
    if (!(Number.isInteger(members) && members >= 0 && members <= MAX_FAKE_MEMBERS)) {
      sendError(res, 400, 'bad_members', `members must be a whole number within 0..${MAX_FAKE_MEMBERS}.`);
      return;
    }
    const forecast = buildFakeForecast({
      seed,
      latitude,
      longitude,
      issuedAtMs: latestIssueTimeMs(clock(), publishDelayHours),
      horizonDays,
      members,
    });
    if (mode === 'malformed') {
      const text = JSON.stringify(forecast);
      res.writeHead(200, { 'content-type': 'application/json; charset=utf-8', 'cache-control': 'no-store' });
      res.end(text.slice(0, Math.floor(text.length / 2)));
      return;
    }
    if (mode === 'schema') {
      const n = forecast.series.time.length;
      forecast.series.hs[n - 5] = -1.5;
      forecast.series.wind.pop();
    }
    sendJson(res, 200, forecast);
  };

  const server = createServer((req, res) => {
    try {
      handle(req, res);
    } catch (err) {
      if (!res.headersSent) sendError(res, 500, 'internal', err instanceof Error ? err.message : String(err));
      else res.destroy();
    }
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => {
      server.off('error', reject);
      resolve();
    });
  });
  const address = server.address() as AddressInfo;
  const hostPart = address.family === 'IPv6' ? `[${address.address}]` : address.address;
  let closing: Promise<void> | undefined;

  return {
    url: `http://${hostPart}:${address.port}`,
    get requests() {
      return requests;
    },
    get received() {
      return received;
    },
    setFailure(mode: FakeFailureMode, times?: number) {
      if (times !== undefined && !(Number.isInteger(times) && times >= 1))
        throw new RangeError(`times must be a positive integer, got ${times}`);
      failure = mode;
      failuresLeft = mode === 'none' || times === undefined ? Infinity : times;
    },
    close() {
      closing ??= new Promise<void>((resolve, reject) => {
        server.close((err) => (err ? reject(err) : resolve()));
        server.closeAllConnections();
      });
      return closing;
    },
  };
}
