import type { AlphaTable } from './types';

/**
 * Default alpha-factor table for weather-restricted operations planned on a forecast:
 * OPWF = alpha * OPLIM on the Hs limits.
 *
 * Rows: TPOP up to 12, 24, 36, 48, 72 h; columns: Hs limit 1, 2, 4, 6 m.
 * Source: docs/domain.md#weather-restricted, from memory of DNV-ST-N001's base case for waves;
 * check against the current standard before relying on it. Each project can edit its own copy.
 *
 * Frozen: take a copy with {@link defaultAlphaTable} to edit.
 */
export const DEFAULT_ALPHA_TABLE: AlphaTable = deepFreeze({
  tpopBoundsH: [12, 24, 36, 48, 72],
  hsColumnsM: [1, 2, 4, 6],
  values: [
    [0.65, 0.76, 0.79, 0.8],
    [0.63, 0.73, 0.76, 0.78],
    [0.62, 0.71, 0.73, 0.76],
    [0.6, 0.68, 0.71, 0.74],
    [0.55, 0.63, 0.68, 0.72],
  ],
});

/** A fresh, editable copy of {@link DEFAULT_ALPHA_TABLE} (for "reset to default"). */
export function defaultAlphaTable(): AlphaTable {
  return {
    tpopBoundsH: [...DEFAULT_ALPHA_TABLE.tpopBoundsH],
    hsColumnsM: [...DEFAULT_ALPHA_TABLE.hsColumnsM],
    values: DEFAULT_ALPHA_TABLE.values.map((row) => [...row]),
  };
}

function deepFreeze(table: AlphaTable): AlphaTable {
  Object.freeze(table.tpopBoundsH);
  Object.freeze(table.hsColumnsM);
  for (const row of table.values) Object.freeze(row);
  Object.freeze(table.values);
  return Object.freeze(table);
}
