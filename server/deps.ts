import type { Db } from './db/client';
import type { Auth } from './auth';
import type { ForecastProvider } from './forecast';
import type { Mailer } from './mail/mailer';
import type { Database } from './db/client';

/** What the app is built from; tests build one on an in-memory database. */
export interface AppDeps {
  db: Db;
  auth: Auth;
  /** The current time; tests pin it. */
  clock: () => Date;
  log: Logger;
  /** The marine forecast service (or its local fake). */
  forecast: ForecastProvider;
  /** E-mail (SMTP, or the local mailbox). */
  mailer: Mailer;
  /** The database handle (driver kind, advisory locks). */
  database: Database;
  config: AppConfig;
  /** Set by the server's start: true while the demo's sea data load after listening (GET /api/health tells). */
  startup?: { demoLoading: boolean };
}

export interface AppConfig {
  /** Public address of the app, for links in e-mails and calendar feeds. */
  baseUrl: string;
  /**
   * Origins (scheme://host:port) the app's own pages are served from. State-changing API requests
   * that carry an Origin header outside this list are refused (server/http/same-origin.ts).
   */
  trustedOrigins: string[];
  /** Secret that signs unsubscribe links. */
  linkSecret: string;
  /** An earliest start that moves by more than this many hours is an alert. */
  earliestMoveAlertHours: number;
  /** Delivery attempts before an e-mail is marked failed. */
  mailMaxAttempts: number;
  /** Tile style of the map for production (MAP_STYLE_URL); unset = the coastline built into the client. */
  mapStyleUrl?: string;
  /** The attribution the tile server requires (MAP_ATTRIBUTION), shown on the map. */
  mapAttribution?: string;
  /** Secret that `npm run plan:once` presents to ask this running server to plan (embedded database). */
  jobToken?: string;
}

export interface Logger {
  info(msg: string, extra?: Record<string, unknown>): void;
  warn(msg: string, extra?: Record<string, unknown>): void;
  error(msg: string, extra?: Record<string, unknown>): void;
}

export const consoleLogger: Logger = {
  info: (msg, extra) => console.log(`[lullwatch] ${msg}`, extra ?? ''),
  warn: (msg, extra) => console.warn(`[lullwatch] ${msg}`, extra ?? ''),
  error: (msg, extra) => console.error(`[lullwatch] ${msg}`, extra ?? ''),
};

export const silentLogger: Logger = { info: () => {}, warn: () => {}, error: () => {} };
