// What `npm run bench:load` and `npm run bench:cluster` share: users created and signed in through
// the API, the requests of the watch board and the downtime page, and autocannon with one
// connection (and session cookie) per user, closed-loop or paced.
import os from 'node:os';
import autocannon from 'autocannon';

// ---------------------------------------------------------------------------------------------
// Options

/**
 * The command-line options both benches take, for parseArgs (each adds its own): --duration with
 * the bench's default (s), --years, --warmup, --connections and --page-every.
 */
export function loadOptions(durationDefault: string, warmupDefault = '5') {
  return {
    years: { type: 'string', default: '20' },
    duration: { type: 'string', default: durationDefault },
    warmup: { type: 'string', default: warmupDefault },
    connections: { type: 'string', default: '50' },
    'page-every': { type: 'string', default: '10' },
  } as const;
}

/** A whole-number option from `min` to `max`; otherwise prints the rule and exits with 1. */
export function intOption(name: string, value: string, min: number, max: number): number {
  const n = Number(value);
  if (!Number.isInteger(n) || n < min || n > max) {
    console.error(`--${name} must be a whole number from ${min} to ${max} (got ${value})`);
    process.exit(1);
  }
  return n;
}

/** The options of loadOptions but --duration as numbers: demo hindcast years, warm-up s, users, the paced run's pace (s). */
export function loadSettings(args: { years: string; warmup: string; connections: string; 'page-every': string }) {
  return {
    years: intOption('years', args.years, 1, 60),
    warmupS: intOption('warmup', args.warmup, 0, 600),
    connections: intOption('connections', args.connections, 1, 500),
    pageEveryS: intOption('page-every', args['page-every'], 1, 3600),
  };
}

// ---------------------------------------------------------------------------------------------
// Users and sessions through the API

export const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

export async function call<T>(
  baseUrl: string,
  method: string,
  url: string,
  opts: { cookie?: string; body?: unknown; headers?: Record<string, string> } = {},
): Promise<{ res: Response; json: T }> {
  const res = await fetch(`${baseUrl}${url}`, {
    method,
    headers: {
      origin: baseUrl,
      ...(opts.body !== undefined ? { 'content-type': 'application/json' } : {}),
      ...(opts.cookie ? { cookie: opts.cookie } : {}),
      ...opts.headers,
    },
    body: opts.body !== undefined ? JSON.stringify(opts.body) : undefined,
  });
  const text = await res.text();
  let json: unknown;
  try {
    json = text ? JSON.parse(text) : null;
  } catch {
    json = text;
  }
  return { res, json: json as T };
}

export async function expectOk<T>(baseUrl: string, method: string, url: string, opts: Parameters<typeof call>[3] = {}): Promise<T> {
  const { res, json } = await call<T>(baseUrl, method, url, opts);
  if (!res.ok) throw new Error(`${method} ${url} answered ${res.status}: ${JSON.stringify(json).slice(0, 300)}`);
  return json;
}

/**
 * Signs in and returns the session cookie. `address` goes into X-Forwarded-For (the server trusts
 * it from loopback only); `origin` is the app's public address (default `baseUrl`). A 429 is waited out (Retry-After) rather than treated as a failure.
 */
export async function signIn(baseUrl: string, email: string, password: string, address: string, origin = baseUrl): Promise<string> {
  for (let attempt = 0; attempt < 20; attempt++) {
    const { res, json } = await call<unknown>(baseUrl, 'POST', '/api/auth/sign-in/email', {
      body: { email, password },
      headers: { 'x-forwarded-for': address, origin },
    });
    if (res.status === 429) {
      const wait = Number(res.headers.get('x-retry-after') ?? res.headers.get('retry-after') ?? 10);
      console.log(`  sign-in of ${email} limited (429): waiting ${wait} s`);
      await sleep((Number.isFinite(wait) ? wait : 10) * 1000 + 250);
      continue;
    }
    if (!res.ok) throw new Error(`sign-in of ${email} answered ${res.status}: ${JSON.stringify(json).slice(0, 300)}`);
    const cookies = res.headers.getSetCookie().map((c) => c.split(';')[0]);
    if (cookies.length === 0) throw new Error(`sign-in of ${email} set no cookie`);
    return cookies.join('; ');
  }
  throw new Error(`sign-in of ${email} still limited after 20 attempts`);
}

export const ROLES = ['coordinator', 'skipper', 'skipper', 'client', 'client'] as const;

export interface LoadUser {
  email: string;
  role: (typeof ROLES)[number];
  cookie: string;
}

export async function createUsers(baseUrl: string, projectId: string, adminCookie: string, n: number): Promise<LoadUser[]> {
  const users: LoadUser[] = [];
  const stamp = Date.now().toString(36);
  for (let i = 0; i < n; i++) {
    const email = `load-${stamp}-${String(i + 1).padStart(3, '0')}@example.com`;
    const role = ROLES[i % ROLES.length];
    const created = await expectOk<{ user: { id: string }; temporaryPassword: string }>(baseUrl, 'POST', '/api/admin/users', {
      cookie: adminCookie,
      body: { name: `Load user ${i + 1}`, email },
    });
    await expectOk(baseUrl, 'PUT', `/api/admin/users/${created.user.id}/projects/${projectId}`, { cookie: adminCookie, body: { role } });
    // Users sign in with the temporary password, then change it as the product asks before
    // anything else (the session stays). Addresses from 198.51.100.0/24, reserved for documentation.
    const address = `198.51.100.${(i % 250) + 1}`;
    const cookie = await signIn(baseUrl, email, created.temporaryPassword, address);
    const { res } = await call(baseUrl, 'POST', '/api/auth/change-password', {
      cookie,
      body: { currentPassword: created.temporaryPassword, newPassword: `Kelp-tide-${stamp}-${i + 1}`, revokeOtherSessions: false },
      headers: { 'x-forwarded-for': address, origin: baseUrl },
    });
    if (!res.ok) throw new Error(`password change of ${email} answered ${res.status}`);
    // Any cookie the change sets replaces the one of that name.
    const jar = new Map(cookie.split('; ').map((c) => [c.split('=')[0], c] as const));
    for (const c of res.headers.getSetCookie()) jar.set(c.split('=')[0], c.split(';')[0]);
    users.push({ email, role, cookie: [...jar.values()].join('; ') });
  }
  return users;
}

// ---------------------------------------------------------------------------------------------
// The page loads

export interface PageRequest {
  name: string;
  method: 'GET' | 'POST';
  path: string;
  /** The page that asks for it (a paced visit opens one page at a time). */
  page?: 'board' | 'downtime';
}

/**
 * What the client asks for when a user opens the watch board and then the downtime page (one
 * query cache, so /api/me and the project are fetched once; the client's staleTime is 30 s):
 * board: GET /api/me, GET /api/projects/:id, GET .../plan?alpha=true (usePlan, useViewer);
 * downtime: GET .../datasets, .../operations, .../sites, .../workability?dataset=&alpha=true,
 * .../ledger?from=&to=, .../ledger/monthly?from=&to=&dataset=, .../campaigns and, for the first
 * campaign, POST .../campaigns/:id/simulate?dataset=&alpha=true (a read sent as POST).
 */
export async function pageRequests(baseUrl: string, projectId: string, cookie: string): Promise<PageRequest[]> {
  const p = `/api/projects/${projectId}`;
  const datasets = await expectOk<{ id: string; kind: string }[]>(baseUrl, 'GET', `${p}/datasets`, { cookie });
  const hindcast = datasets.find((d) => d.kind === 'hindcast');
  if (!hindcast) throw new Error('the demo project has no hindcast');
  const campaigns = await expectOk<{ id: string }[]>(baseUrl, 'GET', `${p}/campaigns`, { cookie });
  const now = new Date();
  const month = `${now.getFullYear()}-${String(now.getMonth() + 1).padStart(2, '0')}`;
  const lastDay = new Date(Date.UTC(now.getFullYear(), now.getMonth() + 1, 0)).getUTCDate();
  const range = new URLSearchParams({ from: `${month}-01`, to: `${month}-${String(lastDay).padStart(2, '0')}` });
  const withDataset = new URLSearchParams({ dataset: hindcast.id, alpha: 'true' });
  const list: PageRequest[] = [
    { name: 'me', method: 'GET', path: '/api/me', page: 'board' },
    { name: 'project', method: 'GET', path: p, page: 'board' },
    { name: 'plan', method: 'GET', path: `${p}/plan?alpha=true`, page: 'board' },
    { name: 'datasets', method: 'GET', path: `${p}/datasets`, page: 'downtime' },
    { name: 'operations', method: 'GET', path: `${p}/operations`, page: 'downtime' },
    { name: 'sites', method: 'GET', path: `${p}/sites`, page: 'downtime' },
    { name: 'workability', method: 'GET', path: `${p}/workability?${withDataset}`, page: 'downtime' },
    { name: 'ledger', method: 'GET', path: `${p}/ledger?${range}`, page: 'downtime' },
    { name: 'ledger monthly', method: 'GET', path: `${p}/ledger/monthly?${range}&dataset=${hindcast.id}`, page: 'downtime' },
    { name: 'campaigns', method: 'GET', path: `${p}/campaigns`, page: 'downtime' },
  ];
  if (campaigns[0])
    list.push({ name: 'simulate', method: 'POST', path: `${p}/campaigns/${campaigns[0].id}/simulate?${withDataset}`, page: 'downtime' });
  return list;
}

// ---------------------------------------------------------------------------------------------
// Load

export interface EndpointStats {
  latencies: number[];
  non2xx: number;
}

export function runCannon(
  baseUrl: string,
  users: LoadUser[],
  requests: PageRequest[],
  seconds: number,
  stats: Map<string, EndpointStats> | null,
  overallRate?: number,
  hooks: {
    /** The running instance (to stop it early). */
    onStart?: (instance: autocannon.Instance) => void;
    /** Every answer: the request's name, status and latency. */
    onResponse?: (name: string, status: number, ms: number) => void;
    /** The Origin header (default the URL loaded). */
    origin?: string;
  } = {},
): Promise<autocannon.Result> {
  let next = 0;
  const nameOf = new WeakMap<object, string>();
  return new Promise((resolve, reject) => {
    const instance = autocannon(
      {
        url: baseUrl,
        connections: users.length,
        duration: seconds,
        timeout: 10,
        // autocannon's per-connection rate is a whole number; the overall rate spreads a fractional one.
        ...(overallRate ? { overallRate } : {}),
        // Each connection is one user: its own copy of the requests with its own cookie.
        setupClient: (client) => {
          const user = users[next++ % users.length];
          const own = requests.map((r) => {
            const req: autocannon.Request = {
              method: r.method,
              path: r.path,
              headers: { cookie: user.cookie, origin: hooks.origin ?? baseUrl, accept: 'application/json' },
            };
            nameOf.set(req, r.name);
            return req;
          });
          client.setRequests(own);
          if (!stats && !hooks.onResponse) return;
          // With pipelining 1, the iterator's current request is the one just answered.
          const iterator = (client as unknown as { requestIterator: { currentRequest: object } }).requestIterator;
          client.on('response', (status: number, _bytes: number, ms: number) => {
            const name = nameOf.get(iterator.currentRequest) ?? '?';
            hooks.onResponse?.(name, status, ms);
            if (!stats) return;
            let s = stats.get(name);
            if (!s) stats.set(name, (s = { latencies: [], non2xx: 0 }));
            s.latencies.push(ms);
            if (status < 200 || status > 299) s.non2xx++;
          });
        },
      },
      (err, result) => (err ? reject(err) : resolve(result)),
    );
    hooks.onStart?.(instance);
  });
}

/** What a paced run measured: every answer's latency (sorted, ms), failures, wall time. */
export interface PacedResult {
  /** Every answer's latency in ms, sorted. */
  latencies: number[];
  /** The same by request name, sorted. */
  byName: Map<string, number[]>;
  errors: number;
  non2xx: number;
  seconds: number;
}

/**
 * Paced load as people make it: each user opens every page once every `everyS` seconds, the
 * users' first visits spread evenly over the first period (user i at i/n of it: people do not open
 * a page in step), the pages following each other evenly within the period. A visit sends all of
 * its page's requests at once, as a page asks for its data when it opens; a slow answer does not
 * hold the user's next visit back. Latency runs from sending a request to the end of its answer's
 * body. (autocannon's `overallRate` releases every connection's request at the same instant each
 * second: bursts of one request per user, not a pace.)
 */
export async function runPaced(
  baseUrl: string,
  users: LoadUser[],
  requests: PageRequest[],
  seconds: number,
  everyS: number,
  origin = baseUrl,
): Promise<PacedResult> {
  const latencies: number[] = [];
  const byName = new Map<string, number[]>();
  let errors = 0;
  let non2xx = 0;
  const t0 = performance.now();
  const end = t0 + seconds * 1000;
  // One visit per page, the pages spread over the period (the board, then the downtime page half a period later).
  const pages = [...new Set(requests.map((r) => r.page ?? ''))].map((page) => requests.filter((r) => (r.page ?? '') === page));
  const visit = (user: LoadUser, pageRequests: PageRequest[]) =>
    Promise.all(
      pageRequests.map(async (r) => {
        const start = performance.now();
        try {
          const res = await fetch(`${baseUrl}${r.path}`, {
            method: r.method,
            headers: { cookie: user.cookie, origin, accept: 'application/json' },
            signal: AbortSignal.timeout(10_000),
          });
          await res.arrayBuffer();
          const took = performance.now() - start;
          latencies.push(took);
          let list = byName.get(r.name);
          if (!list) byName.set(r.name, (list = []));
          list.push(took);
          if (res.status < 200 || res.status > 299) non2xx++;
        } catch {
          errors++;
        }
      }),
    );
  await Promise.all(
    users.map(async (user, i) => {
      const visits: Promise<unknown>[] = [];
      const first = t0 + (i / users.length) * everyS * 1000;
      const step = (everyS * 1000) / pages.length;
      for (let k = 0, next = first; next < end; k++, next = first + k * step) {
        await sleep(Math.max(0, next - performance.now()));
        visits.push(visit(user, pages[k % pages.length]));
      }
      await Promise.all(visits);
    }),
  );
  latencies.sort((a, b) => a - b);
  for (const list of byName.values()) list.sort((a, b) => a - b);
  return { latencies, byName, errors, non2xx, seconds: (performance.now() - t0) / 1000 };
}

export function percentile(sorted: number[], p: number): number {
  if (sorted.length === 0) return NaN;
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];
}

export const ms = (x: number) => (Number.isFinite(x) ? `${x.toFixed(0)} ms` : 'n/a');

/** The 1-, 5- and 15-minute load averages, e.g. "1.2 0.8 0.5". */
export const loadAverages = () =>
  os
    .loadavg()
    .map((x) => x.toFixed(1))
    .join(' ');

/** A bench's first line: the machine's cores and CPU, Node's version and the load averages. */
export function machineLine(bench: string): string {
  const cpus = os.cpus();
  return `Lullwatch ${bench} bench on ${cpus.length} cores (${cpus[0]?.model ?? 'unknown CPU'}), Node ${process.version}, load average ${loadAverages()}`;
}
