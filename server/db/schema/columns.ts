import { sql } from 'drizzle-orm';
import { timestamp, uuid } from 'drizzle-orm/pg-core';

/** A row's own id: a random UUID the database makes. */
export const idColumn = () =>
  uuid()
    .primaryKey()
    .default(sql`gen_random_uuid()`);

/** When the row was written (or last changed): an instant, the database's clock by default. */
export const stampColumn = () => timestamp({ withTimezone: true }).notNull().defaultNow();
