/** Answers of the vessel routes (docs/domain.md#vessel-response), shared by the server and the client. */

export interface VesselResponse {
  id: string;
  name: string;
  /** Response columns of its RAO table (empty until one is imported). */
  responses: string[];
  raoFileName: string | null;
  raoImportedAt: string | null;
}

/** A vessel's RAO table as answered: periods, headings and per response its amplitudes [heading][period]. */
export interface VesselRaosResponse {
  vesselId: string;
  fileName: string | null;
  importedAt: string | null;
  /** Periods, s, ascending. */
  periods: number[];
  /** Relative headings, deg, ascending (0 = head seas). */
  headings: number[];
  responses: { response: string; label: string; unit: string; values: number[][] }[];
}
