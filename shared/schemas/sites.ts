/**
 * Input schemas for worksites, operations, the alpha table and the project setup document.
 * The server parses request bodies with them and the client forms reuse them, so both sides
 * refuse the same values with the same messages (docs/domain.md, "From the data point to the
 * worksite" and "Operations and limits").
 *
 * Units are fixed by the field: depth in m, bearings in degrees "coming from" clockwise from true
 * north, TPOP and TC in h, limits as in `shared/engine/schemas.ts`.
 *
 * One file per entity; this module gathers them, so callers import from one place.
 */
export * from './site-fields';
export * from './transfer-table';
export * from './transfer-table-csv';
export * from './worksite';
export * from './tide';
export * from './operation';
export * from './alpha-table';
export * from './setup-document';
export * from './audit';
export * from './vessel';
