// Large JSON answers that many members read (the workability table is about 440 kB, the forecast
// plan about a hundred) kept already encoded, per database handle, under a key that names everything
// they depend on. Under load, encoding them again for every request (JSON text, then bytes, then the
// ETag hash) was the largest cost after the session lookup.
import type { Db } from '../db/client';
import { Lru } from './lru';

/** Entries kept per database handle (a few projects' views at a few hundred kB each). */
const ENTRIES = 32;
const memos = new WeakMap<Db, Lru<Promise<Buffer>>>();

/** The answer of `produce` as JSON bytes, produced once per key while it stays among the recent ones. */
export function encodedAnswer(db: Db, key: string, produce: () => Promise<unknown>): Promise<Buffer> {
  let memo = memos.get(db);
  if (!memo) memos.set(db, (memo = new Lru(ENTRIES)));
  let body = memo.get(key);
  if (!body) {
    body = produce().then((value) => Buffer.from(JSON.stringify(value)));
    memo.set(key, body);
    const m = memo;
    body.catch(() => m.delete(key));
  }
  return body;
}

/** Forgets a database's encoded answers (with the statistics memos; tests). */
export function forgetEncodedAnswers(db: Db): void {
  memos.delete(db);
}
