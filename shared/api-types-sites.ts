// Response shapes of the worksite, operation, alpha-table, setup and audit routes.
import type { AlphaTable, OperationLimits } from './engine/types';
import type { AuditAction, AuditEntity, ImportMode, TransferTableInput, WorksiteTideInput } from './schemas/sites';

/** A worksite. Depth in m, bearings in degrees "coming from", times ISO 8601 UTC. */
export interface SiteResponse {
  id: string;
  name: string;
  /** degrees north, or null */
  latitude: number | null;
  /** degrees east, or null */
  longitude: number | null;
  /** water depth d_site, m */
  depth: number;
  /** shore-normal bearing beta, degrees in [0, 360); null = no refraction */
  shoreNormal: number | null;
  /** breaker index gamma_b (Hs/d) */
  breakerIndex: number;
  /** IANA time zone the worksite's hours are shown in */
  timeZone: string;
  /** hindcast dataset used for statistics; null = the project's newest */
  hindcastDatasetId: string | null;
  transferTable: TransferTableInput | null;
  /** tide at the worksite; null = none (depth stays the chart depth) */
  tide: WorksiteTideInput | null;
  /** current station of the tide database for the predicted tidal current; null = none */
  currentStationId: string | null;
  updatedAt: string;
}

/** A station of the public tide database as the API shows it (docs/domain.md#tide). */
export interface TideStationInfo {
  id: string;
  name: string;
  /** Great-circle distance from the worksite, km (null when the worksite has no position). */
  distanceKm: number | null;
  /** Chart datum the station's levels are referred to (LAT, MLLW, ...). */
  datum: string | null;
  latitude: number;
  longitude: number;
  kind: 'tide' | 'current';
  /** reference (own constants) or subordinate (offsets from a reference station). */
  type: 'reference' | 'subordinate';
  constituents: number;
  source: string;
  /** The notice the database asks to be shown with the station (its NOTICE and attribution). */
  attribution: string;
  warnings: string[];
}

/**
 * A current station of the public tide database (docs/domain.md#tide): its directions of flood and
 * ebb (degrees true, the direction the water flows towards) and its mean flow (m/s along the flood
 * direction, added to the harmonic sum).
 */
export interface CurrentStationInfo extends TideStationInfo {
  kind: 'current';
  floodDir: number | null;
  ebbDir: number | null;
  meanFlowMps: number;
}

/** The predicted tide (GET …/sites/:siteId/tide and POST …/tide-preview): levels on a grid and the extremes. */
export interface TideAnswer {
  times: string[];
  /** m above chart datum */
  waterLevel: number[];
  extremes: { time: string; level: number; kind: 'high' | 'low' }[];
  datum: string;
  station: TideStationInfo | null;
  stepMinutes: number;
  cautions: readonly string[];
}

/** An operation with its limits (OPLIM). */
export interface OperationResponse {
  id: string;
  name: string;
  description: string;
  /** planned duration TPOP, h */
  tpop: number;
  /** contingency TC, h */
  tc: number;
  /** reference period TR = TPOP + TC, h */
  tr: number;
  weatherRestricted: boolean;
  limits: OperationLimits;
  /** the vessel the operation is done from, or null */
  vesselId: string | null;
  /** the vessel's fixed heading, deg true, or null */
  heading: number | null;
  /** worksite ids; empty = every worksite of the project */
  siteIds: string[];
  /** user ids of the assigned skippers */
  skipperIds: string[];
  /** recurrence rule, when set (another route owns it); null otherwise */
  recurrence: Record<string, unknown> | null;
  updatedAt: string;
}

/** The note shown beside the alpha table. */
export const ALPHA_NOTE = 'Defaults from memory of DNV-ST-N001 base case; check against the current standard.';

/** GET/PUT/DELETE /api/projects/:projectId/alpha */
export interface AlphaResponse {
  table: AlphaTable;
  /** true when the project has no table of its own and the default applies */
  isDefault: boolean;
  note: typeof ALPHA_NOTE;
  /** when the project's own table was last saved; null for the default */
  updatedAt: string | null;
}

/** One audit-trail entry: who changed what, when, before and after. */
export interface AuditEntryResponse {
  id: string;
  at: string;
  /** null when the user has since been deleted */
  userId: string | null;
  userName: string;
  /** The user's e-mail address (the name is theirs to choose; the e-mail and id identify them); null once deleted. */
  userEmail: string | null;
  entity: AuditEntity;
  entityId: string | null;
  entityName: string;
  action: AuditAction;
  /** the audited fields before the change; null on create/import */
  before: unknown;
  /** the audited fields after the change; null on delete */
  after: unknown;
}

/** POST /api/projects/:projectId/import */
export interface ImportResultResponse {
  mode: ImportMode;
  worksites: { created: number; deleted: number };
  operations: { created: number; deleted: number };
  /** what happened to the alpha table: set from the document, reset to the default, or kept */
  alphaTable: 'set' | 'default' | 'kept';
  /** what happened to the project's data point: set from the document, or kept (the message says why) */
  dataPoint: 'set' | 'kept';
  /** one sentence per decision the import took (alpha table, data point), for the user */
  messages: string[];
}

/**
 * POST /api/projects/:projectId/import/preview: everything an import with the same query would
 * change, before it runs. `refusal` is set when the import would be refused (and why).
 */
export interface ImportPreviewResponse {
  mode: ImportMode;
  refusal: string | null;
  adds: { worksites: string[]; operations: string[]; campaigns: string[] };
  /** what replace deletes (all empty in merge mode) */
  removes: {
    worksites: string[];
    operations: string[];
    campaigns: string[];
    /** operations whose repeat rule (recurrence) goes with them; the setup file does not carry them */
    recurrences: string[];
    skipperAssignments: number;
    /** worksites that had a hindcast of their own chosen for statistics */
    hindcastChoices: string[];
    /** ledger days still proposed (they can be proposed again from the data) */
    proposedLedgerDays: number;
    /** confirmed ledger days: replace is refused while any exist */
    confirmedLedgerDays: number;
    /** alert subscriptions limited to some operations or worksites: they would hear of none of the new ones */
    narrowedSubscriptions: number;
  };
  alphaTable: { outcome: 'set' | 'default' | 'kept'; message: string };
  dataPoint: { outcome: 'set' | 'kept'; message: string };
}

/** The 409 details of a merge import that clashes with existing names. */
export interface ImportClashDetails {
  worksites: string[];
  operations: string[];
}
