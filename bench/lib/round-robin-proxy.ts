// A small round-robin HTTP proxy on loopback for `npm run bench:cluster`: it stands in for the
// load balancer of a real deployment (any that health-checks its instances will do; this one is
// not meant for production). What it does:
// - sends each request to the next instance that is up (round robin);
// - checks GET /api/health on every instance every `healthEveryMs` (up on 200; down after three
//   checks in a row without a 200 within 3 s, so a busy instance is not dropped for one slow
//   answer), and takes an instance out at once when a connection to it is refused or reset; when
//   none is up it fails open (sends to any instance) rather than answering 502 to everyone;
// - sends GET and HEAD on kept-alive connections and other methods on a fresh connection each: a
//   kept-alive connection to an instance that just died may take a request before the proxy sees
//   it closed, and only a fresh connection's refusal proves that nothing reached the instance;
// - retries once, on another instance that is up: a GET or HEAD that failed before its answer began
//   (idempotent, so sending it twice is harmless), and a request of any method whose connection was
//   refused (nothing reached the instance). Any other failure is answered 502;
// - keeps what the bench checks: every request in flight on each instance, the ones in flight on an
//   instance when the bench marks it killed, the retries and every failure.
import http from 'node:http';
import type { AddressInfo } from 'node:net';

export interface ProxyBackend {
  name: string;
  host: string;
  port: number;
}

interface Flight {
  id: number;
  method: string;
  path: string;
  backend: string;
}

export interface ProxyFailure {
  method: string;
  path: string;
  backend: string;
  /** What went wrong (an error code, or 'no instance up'). */
  reason: string;
  /** The request was in flight on an instance when the bench marked that instance killed. */
  inFlightAtKill: boolean;
  at: number;
}

export interface ProxyStats {
  /** Requests answered, per instance that answered them. */
  answeredBy: Record<string, number>;
  retried: number;
  retriedOk: number;
  /** Requests sent while no instance passed its health checks (fail open). */
  failOpen: number;
  failures: ProxyFailure[];
  /** Per mark of a kill: the instance and how many requests were in flight on it. */
  kills: { backend: string; at: number; inFlight: number; sentWhileDying: number }[];
  /** Up and down changes as the health checks (or a refused connection) saw them. */
  changes: { backend: string; up: boolean; at: number }[];
}

const IDEMPOTENT = new Set(['GET', 'HEAD']);

export class RoundRobinProxy {
  readonly stats: ProxyStats = { answeredBy: {}, retried: 0, retriedOk: 0, failOpen: 0, failures: [], kills: [], changes: [] };
  private readonly up = new Map<string, boolean>();
  /** Health checks in a row without a 200, per instance. */
  private readonly misses = new Map<string, number>();
  private readonly inFlight = new Map<string, Set<Flight>>();
  /** Ids of the requests in flight on an instance when it was marked killed. */
  private readonly atKill = new Set<number>();
  /** Instances marked killed whose process has not exited yet. */
  private readonly dying = new Set<string>();
  private next = 0;
  private nextId = 1;
  private server: http.Server | null = null;
  private timer: NodeJS.Timeout | null = null;
  private readonly agent = new http.Agent({ keepAlive: true, maxSockets: Infinity });

  constructor(
    private readonly backends: ProxyBackend[],
    private readonly options: { healthEveryMs?: number; timeoutMs?: number } = {},
  ) {
    for (const b of backends) {
      this.up.set(b.name, false);
      this.inFlight.set(b.name, new Set());
      this.stats.answeredBy[b.name] = 0;
    }
  }

  /** Listens on 127.0.0.1 (the port given, or a free one) and starts the health checks; answers the port. */
  async listen(port = 0): Promise<number> {
    await this.checkAll();
    this.timer = setInterval(() => void this.checkAll(), this.options.healthEveryMs ?? 500);
    this.server = http.createServer((req, res) => void this.handle(req, res));
    this.server.keepAliveTimeout = 65_000;
    await new Promise<void>((resolve, reject) => {
      this.server!.once('error', reject);
      this.server!.listen(port, '127.0.0.1', () => resolve());
    });
    return (this.server.address() as AddressInfo).port;
  }

  isUp(name: string): boolean {
    return this.up.get(name) ?? false;
  }

  /**
   * Call just before killing an instance: remembers which requests were in flight on it, and
   * counts as in flight at the kill every request sent to it until `markDead` (the process may take
   * a moment to die, and its kernel still accepts connections meanwhile).
   */
  markKilled(name: string): void {
    const flights = this.inFlight.get(name) ?? new Set();
    for (const f of flights) this.atKill.add(f.id);
    this.dying.add(name);
    this.stats.kills.push({ backend: name, at: Date.now(), inFlight: flights.size, sentWhileDying: 0 });
  }

  /** Call when the killed process has exited (was reaped). */
  markDead(name: string): void {
    this.dying.delete(name);
  }

  async close(): Promise<void> {
    if (this.timer) clearInterval(this.timer);
    this.server?.closeAllConnections();
    await new Promise<void>((resolve) => (this.server ? this.server.close(() => resolve()) : resolve()));
    this.agent.destroy();
  }

  private setUp(name: string, up: boolean): void {
    if (this.up.get(name) === up) return;
    this.up.set(name, up);
    this.stats.changes.push({ backend: name, up, at: Date.now() });
  }

  private async checkAll(): Promise<void> {
    await Promise.all(
      this.backends.map(async (b) => {
        const ok = await new Promise<boolean>((resolve) => {
          const req = http.get({ host: b.host, port: b.port, path: '/api/health', timeout: 3000, agent: false }, (res) => {
            res.resume();
            resolve(res.statusCode === 200);
          });
          req.on('timeout', () => req.destroy(new Error('timeout')));
          req.on('error', () => resolve(false));
        });
        const misses = ok ? 0 : (this.misses.get(b.name) ?? 0) + 1;
        this.misses.set(b.name, misses);
        if (ok) this.setUp(b.name, true);
        else if (misses >= 3) this.setUp(b.name, false);
      }),
    );
  }

  private pick(except?: string): ProxyBackend | null {
    for (let i = 0; i < this.backends.length; i++) {
      const b = this.backends[this.next++ % this.backends.length];
      if (b.name !== except && this.up.get(b.name)) return b;
    }
    // None up by the health checks (an overloaded instance answers them late): fail open, as many
    // load balancers do, and try any other instance; a refused connection is retried.
    for (let i = 0; i < this.backends.length; i++) {
      const b = this.backends[this.next++ % this.backends.length];
      if (b.name !== except) {
        this.stats.failOpen++;
        return b;
      }
    }
    return null;
  }

  private async handle(req: http.IncomingMessage, res: http.ServerResponse): Promise<void> {
    // The body is read whole (the bench sends small ones) so that a request can be sent again.
    const chunks: Buffer[] = [];
    for await (const c of req) chunks.push(c as Buffer);
    const body = Buffer.concat(chunks);
    const method = req.method ?? 'GET';
    const path = req.url ?? '/';
    const headers = { ...req.headers };
    // Append this hop, as reverse proxies do: the instances trust loopback (TRUST_PROXY=loopback).
    const client = req.socket.remoteAddress ?? '127.0.0.1';
    headers['x-forwarded-for'] = headers['x-forwarded-for'] ? `${String(headers['x-forwarded-for'])}, ${client}` : client;
    delete headers.connection;
    delete headers['transfer-encoding'];

    let tried: string | undefined;
    for (let attempt = 0; attempt < 2; attempt++) {
      const backend = this.pick(tried);
      if (!backend) {
        this.fail(res, { method, path, backend: tried ?? '-', reason: 'no instance up', inFlightAtKill: false, at: Date.now() });
        return;
      }
      const outcome = await this.forward(backend, method, path, headers, body, res);
      if (outcome.ok) {
        if (attempt > 0) this.stats.retriedOk++;
        return;
      }
      const refused = outcome.code === 'ECONNREFUSED';
      if (refused || outcome.code === 'ECONNRESET') this.setUp(backend.name, false);
      const retry = attempt === 0 && !outcome.headersSent && (IDEMPOTENT.has(method) || refused);
      if (!retry) {
        const failure = {
          method,
          path,
          backend: backend.name,
          reason: outcome.code,
          inFlightAtKill: outcome.inFlightAtKill,
          at: Date.now(),
        };
        if (outcome.headersSent) {
          this.stats.failures.push(failure);
          res.destroy();
        } else this.fail(res, failure);
        return;
      }
      this.stats.retried++;
      tried = backend.name;
    }
  }

  private fail(res: http.ServerResponse, failure: ProxyFailure): void {
    this.stats.failures.push(failure);
    if (res.headersSent) {
      res.destroy();
      return;
    }
    res.writeHead(502, { 'content-type': 'application/json' });
    res.end(JSON.stringify({ error: { code: 'bad_gateway', message: `proxy: ${failure.reason}`, details: null } }));
  }

  /** One attempt on one instance; pipes the answer to the client when it comes. */
  private forward(
    backend: ProxyBackend,
    method: string,
    path: string,
    headers: http.IncomingHttpHeaders,
    body: Buffer,
    res: http.ServerResponse,
  ): Promise<{ ok: true } | { ok: false; code: string; headersSent: boolean; inFlightAtKill: boolean }> {
    const flight: Flight = { id: this.nextId++, method, path, backend: backend.name };
    const flights = this.inFlight.get(backend.name)!;
    flights.add(flight);
    if (this.dying.has(backend.name)) {
      this.atKill.add(flight.id);
      this.stats.kills.at(-1)!.sentWhileDying++;
    }
    return new Promise((resolve) => {
      let settled = false;
      const done = (v: { ok: true } | { ok: false; code: string; headersSent: boolean; inFlightAtKill: boolean }) => {
        if (settled) return;
        settled = true;
        flights.delete(flight);
        if (v.ok) this.stats.answeredBy[backend.name]++;
        resolve(v);
      };
      const failed = (err: Error & { code?: string }) =>
        done({ ok: false, code: err.code ?? err.message, headersSent: res.headersSent, inFlightAtKill: this.atKill.has(flight.id) });
      const out = http.request(
        {
          host: backend.host,
          port: backend.port,
          method,
          path,
          headers: { ...headers, 'content-length': String(body.length) },
          agent: IDEMPOTENT.has(method) ? this.agent : false,
          timeout: this.options.timeoutMs ?? 30_000,
        },
        (upstream) => {
          res.writeHead(upstream.statusCode ?? 502, upstream.headers);
          upstream.on('error', failed);
          upstream.on('aborted', () => failed(Object.assign(new Error('answer cut short'), { code: 'ECONNRESET' })));
          upstream.pipe(res);
          upstream.on('end', () => done({ ok: true }));
        },
      );
      out.on('timeout', () => out.destroy(Object.assign(new Error('timeout'), { code: 'ETIMEDOUT' })));
      out.on('error', failed);
      out.end(body);
    });
  }
}
