import { sql } from 'drizzle-orm';
import { timestamp, uuid, type AnyPgColumn } from 'drizzle-orm/pg-core';

/** A row's own id: a random UUID the database makes. */
export const idColumn = () =>
  uuid()
    .primaryKey()
    .default(sql`gen_random_uuid()`);

/** An instant (timestamp with time zone); null until set unless the caller says otherwise. */
export const instantColumn = () => timestamp({ withTimezone: true });

/** When the row was written (or last changed): an instant, the database's clock by default. */
export const stampColumn = () => instantColumn().notNull().defaultNow();

/** When the row was made and when it last changed. */
export const stampColumns = () => ({ createdAt: stampColumn(), updatedAt: stampColumn() });

/** The id of the row this one belongs to: required, and the row goes with it (ON DELETE CASCADE). */
export const ownerColumn = (ref: () => AnyPgColumn) => uuid().notNull().references(ref, { onDelete: 'cascade' });

/** The id of a row this one refers to, if any: cleared when that row goes (ON DELETE SET NULL). */
export const optionalRefColumn = (ref: () => AnyPgColumn) => uuid().references(ref, { onDelete: 'set null' });
