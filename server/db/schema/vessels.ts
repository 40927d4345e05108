import { sql } from 'drizzle-orm';
import { index, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { project } from './projects';

/** A vessel of a project with its RAO table (docs/domain.md#vessel-response). */
export const vessel = pgTable(
  'vessel',
  {
    id: uuid()
      .primaryKey()
      .default(sql`gen_random_uuid()`),
    projectId: uuid()
      .notNull()
      .references(() => project.id, { onDelete: 'cascade' }),
    name: text().notNull(),
    /** RAOs by period and relative heading, per response (null until a table is imported). */
    raos: jsonb().$type<{ periodsS: number[]; headingsDeg: number[]; responses: Record<string, number[][]> } | null>(),
    /** The imported file's name and when it came in. */
    raoFileName: text(),
    raoImportedAt: timestamp({ withTimezone: true }),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index().on(t.projectId)],
);
