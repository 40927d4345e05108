/** The project setup document (export and import) and the query of an import. */
import { z } from 'zod';
import { alphaTableSchema } from '../engine/schemas';
import { storableText } from './common';
import { checkOperation, operationFields } from './operation';
import { finite, itemDescription, itemName, nameKey } from './site-fields';
import { timeZoneField, WorksiteInput } from './worksite';

export const SETUP_FORMAT = 'lullwatch-setup';
export const SETUP_VERSION = 1;
export const IMPORT_MODES = ['merge', 'replace'] as const;
export type ImportMode = (typeof IMPORT_MODES)[number];

export const IMPORT_CHOICES = ['keep', 'take'] as const;
export type ImportChoice = (typeof IMPORT_CHOICES)[number];

/**
 * `?mode=` of the import: merge (default) or replace; `alphaTable=keep|take`: keep this project's
 * alpha table or take the file's (default: keep in merge mode, take in replace mode);
 * `dataPoint=keep|take`: keep this project's data point or take the file's (default keep).
 */
export const ImportQuery = z
  .object({
    mode: z.enum(IMPORT_MODES, { error: 'mode must be merge or replace' }).default('merge'),
    alphaTable: z.enum(IMPORT_CHOICES, { error: 'alphaTable must be keep or take' }).optional(),
    dataPoint: z.enum(IMPORT_CHOICES, { error: 'dataPoint must be keep or take' }).default('keep'),
  })
  .transform((q) => ({ ...q, alphaTable: q.alphaTable ?? (q.mode === 'merge' ? 'keep' : 'take') }));
export type ImportQuery = z.output<typeof ImportQuery>;

/**
 * A worksite in the setup document: the worksite's fields without `hindcastDatasetId` (datasets
 * belong to one project and are not carried over).
 */
export const SetupWorksite = WorksiteInput.omit({ hindcastDatasetId: true });
export type SetupWorksite = z.infer<typeof SetupWorksite>;

/**
 * An operation in the setup document: worksites by name (`siteNames`, matched with
 * {@link nameKey} against the document's worksites) instead of ids; skippers are not carried
 * over (they are people of one project). Vessels are not carried either: response limits come
 * over, and find no data until the operation names a vessel of the target project.
 */
export const SetupOperation = z
  .object({
    name: operationFields.name,
    description: operationFields.description.default(''),
    tpop: operationFields.tpop,
    tc: operationFields.tc,
    weatherRestricted: operationFields.weatherRestricted,
    limits: operationFields.limits,
    siteNames: z.array(itemName()).max(500).default([]),
  })
  // The vessel rule of checkOperation does not apply here (no vessels in the document).
  .superRefine((v, ctx) => checkOperation({ ...v, limits: undefined }, ctx));
export type SetupOperation = z.infer<typeof SetupOperation>;

/** The exported project block: for the reader; an import does not change the target project. */
export const SetupProject = z.object({
  name: itemName(),
  description: itemDescription().default(''),
  dataPointName: storableText(z.string().trim().max(120)).default(''),
  dataPointLatitude: finite('Latitude').min(-90).max(90).nullish(),
  dataPointLongitude: finite('Longitude').min(-180).max(180).nullish(),
  dataPointDepthM: finite('Data point depth').min(0.5).max(11000).nullish(),
});

/**
 * A whole project setup as one JSON document: worksites, operations with their limits and the
 * alpha table, so a coordinator can start a new contract from an old one.
 *
 * - `alphaTable`: the project's table, or null for the default table; when the key is absent an
 *   import leaves the target's table as it is.
 * - `campaigns`: ordered steps by operation and worksite name; every step must name an operation
 *   and a worksite of the document.
 * - Names of worksites and of operations must be unique (by {@link nameKey}); every `siteNames`
 *   entry must name a worksite of the document.
 */
/** A campaign in a setup document: its steps by operation and worksite name. */
export const SetupCampaign = z.object({
  name: storableText(z.string().trim().min(1, 'A campaign needs a name').max(120)),
  steps: z
    .array(z.object({ operationName: z.string().trim().min(1), siteName: z.string().trim().min(1) }))
    .min(1)
    .max(50),
  plannedStart: z.iso.datetime({ offset: true }).nullish(),
  // Checked like a worksite's zone: the import stores it, and a campaign simulates in it.
  timeZone: timeZoneField.default('UTC'),
});
export type SetupCampaign = z.infer<typeof SetupCampaign>;

/**
 * The name keys (nameKey) of a document's worksites or operations, with an issue on each name
 * used twice; `then` checks each item further, right after its name.
 */
function namesUsedOnce<T extends { name: string }>(
  items: readonly T[],
  field: 'worksites' | 'operations',
  what: string,
  ctx: z.RefinementCtx,
  then?: (item: T, i: number) => void,
): Set<string> {
  const keys = new Set<string>();
  items.forEach((item, i) => {
    const key = nameKey(item.name);
    if (keys.has(key)) ctx.addIssue({ code: 'custom', path: [field, i, 'name'], message: `${what} name "${item.name}" is used twice` });
    keys.add(key);
    then?.(item, i);
  });
  return keys;
}

export const ProjectSetupDocument = z
  .object({
    format: z.literal(SETUP_FORMAT, { error: `format must be "${SETUP_FORMAT}"` }),
    version: z.literal(SETUP_VERSION, { error: `version must be ${SETUP_VERSION}` }),
    exportedAt: z.iso.datetime({ offset: true, error: 'exportedAt must be an ISO 8601 date-time' }),
    project: SetupProject,
    alphaTable: alphaTableSchema.nullish(),
    worksites: z.array(SetupWorksite).max(500, 'At most 500 worksites'),
    operations: z.array(SetupOperation).max(1000, 'At most 1000 operations'),
    campaigns: z.array(SetupCampaign).max(200, 'At most 200 campaigns').optional(),
  })
  .superRefine((doc, ctx) => {
    const sites = namesUsedOnce(doc.worksites, 'worksites', 'Worksite', ctx);
    const ops = namesUsedOnce(doc.operations, 'operations', 'Operation', ctx, (o, i) =>
      o.siteNames.forEach((s, j) => {
        if (!sites.has(nameKey(s))) {
          ctx.addIssue({ code: 'custom', path: ['operations', i, 'siteNames', j], message: `No worksite named "${s}" in the document` });
        }
      }),
    );
    (doc.campaigns ?? []).forEach((c, i) =>
      c.steps.forEach((step, j) => {
        if (!ops.has(nameKey(step.operationName))) {
          ctx.addIssue({
            code: 'custom',
            path: ['campaigns', i, 'steps', j, 'operationName'],
            message: `No operation named "${step.operationName}" in the document`,
          });
        }
        if (!sites.has(nameKey(step.siteName))) {
          ctx.addIssue({
            code: 'custom',
            path: ['campaigns', i, 'steps', j, 'siteName'],
            message: `No worksite named "${step.siteName}" in the document`,
          });
        }
      }),
    );
  });
export type ProjectSetupDocument = z.infer<typeof ProjectSetupDocument>;
