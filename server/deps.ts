import type { Db } from './db/client';
import type { Auth } from './auth';

/** What the app is built from; tests build one on an in-memory database. */
export interface AppDeps {
  db: Db;
  auth: Auth;
  /** The current time; tests pin it. */
  clock: () => Date;
  log: Logger;
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
