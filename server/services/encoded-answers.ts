// Large JSON answers that many members read (the workability table is about 440 kB, the forecast
// plan about a hundred) kept already encoded, per database handle, under a key that names everything
// they depend on. Under load, encoding them again for every request (JSON text, then bytes, then the
// ETag hash) was the largest cost after the session lookup. Bounded by bytes, not entries.
import type { Db } from '../db/client';
import { ByteBoundedMemo } from './byte-cache';

/** Bytes of encoded answers kept per database handle. */
export const ENCODED_ANSWER_BYTES = 32 * 1024 * 1024;
const memos = new WeakMap<Db, ByteBoundedMemo<Buffer>>();

function memoOf(db: Db): ByteBoundedMemo<Buffer> {
  let memo = memos.get(db);
  if (!memo) memos.set(db, (memo = new ByteBoundedMemo<Buffer>(ENCODED_ANSWER_BYTES, (b) => b.byteLength)));
  return memo;
}

/** The answer of `produce` as JSON bytes, produced once per key while it stays among the recent ones. */
export function encodedAnswer(db: Db, key: string, produce: () => Promise<unknown>): Promise<Buffer> {
  return memoOf(db).get(key, async () => Buffer.from(JSON.stringify(await produce())));
}

/** Bytes held for a database handle (tests). */
export function encodedAnswerBytes(db: Db): number {
  return memos.get(db)?.bytes ?? 0;
}

/** Forgets a database's encoded answers (with the statistics memos; tests). */
export function forgetEncodedAnswers(db: Db): void {
  memos.delete(db);
}
