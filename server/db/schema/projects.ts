import { pgTable, text, uuid, unique, index, doublePrecision } from 'drizzle-orm/pg-core';
import { idColumn, ownerColumn, stampColumn, stampColumns } from './columns';
import { PROJECT_ROLES } from '../../../shared/auth/roles';
import { user } from './auth';

export const project = pgTable('project', {
  id: idColumn(),
  name: text().notNull(),
  description: text().notNull().default(''),
  /** The offshore data point whose sea states feed the project's worksites. */
  dataPointName: text().notNull().default(''),
  dataPointLatitude: doublePrecision(),
  dataPointLongitude: doublePrecision(),
  /** Water depth at the data point in metres; null means deep water (docs/domain.md#convention-1). */
  dataPointDepthM: doublePrecision(),
  /** 'service' fetches forecasts from the forecast provider; 'uploads' only takes uploaded files. */
  forecastSource: text({ enum: ['service', 'uploads'] })
    .notNull()
    .default('uploads'),
  /**
   * The hindcast the coordinator chose as the default for statistics; null (or a dataset since
   * deleted) = the newest hindcast. No foreign key: dataset already refers to project.
   */
  defaultHindcastId: uuid(),
  /**
   * p of the calibrated alpha table: the accepted chance that the observed Hs exceeds OPLIM
   * (docs/domain.md#calibrated-alpha); 1e-4 by default.
   */
  alphaCalibrationP: doublePrecision().notNull().default(1e-4),
  ...stampColumns(),
});

/** The project a row belongs to; deleting the project deletes its rows. */
export const projectIdColumn = () => ownerColumn(() => project.id);

/**
 * Per-project roles. A membership table of our own rather than the auth library's organization
 * plugin: a project is not an "active organization" the user switches into, and one user holds
 * different roles in several projects at once.
 */
export const projectMember = pgTable(
  'project_member',
  {
    id: idColumn(),
    projectId: projectIdColumn(),
    userId: text()
      .notNull()
      .references(() => user.id, { onDelete: 'cascade' }),
    role: text({ enum: PROJECT_ROLES }).notNull(),
    createdAt: stampColumn(),
  },
  (t) => [unique().on(t.projectId, t.userId), index().on(t.userId)],
);
