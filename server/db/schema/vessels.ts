import { index, jsonb, pgTable, text } from 'drizzle-orm/pg-core';
import { idColumn, instantColumn, stampColumns } from './columns';
import { projectIdColumn } from './projects';

/** A vessel of a project with its RAO table (docs/domain.md#vessel-response). */
export const vessel = pgTable(
  'vessel',
  {
    id: idColumn(),
    projectId: projectIdColumn(),
    name: text().notNull(),
    /** RAOs by period and relative heading, per response (null until a table is imported). */
    raos: jsonb().$type<{ periodsS: number[]; headingsDeg: number[]; responses: Record<string, number[][]> } | null>(),
    /** The imported file's name and when it came in. */
    raoFileName: text(),
    raoImportedAt: instantColumn(),
    ...stampColumns(),
  },
  (t) => [index().on(t.projectId)],
);
