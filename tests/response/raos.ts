/** RAO tables invented for the response tests (no outside source: shapes chosen so the expected values follow by hand). */
import type { RaoTable } from '../../shared/response';

/** Periods 1-40 s every 0.05 s. */
export const DENSE_PERIODS = Array.from({ length: 781 }, (_, i) => Math.round((1 + i * 0.05) * 100) / 100);

/** A table with the same amplitude function of the period at every heading given. */
export function tableOf(
  name: string,
  headings: number[],
  periods: number[],
  amp: (periodS: number, headingDeg: number) => number,
): RaoTable {
  return { periodsS: periods, headingsDeg: headings, responses: { [name]: headings.map((h) => periods.map((t) => amp(t, h))) } };
}
