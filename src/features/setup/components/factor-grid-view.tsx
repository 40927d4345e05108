import type { ReactNode } from 'react';
import { CellInput, RemoveButton } from './form-bits';
import { fmt } from './format';

/**
 * A read-only grid of factors (alpha by TPOP bound and Hs limit, transfer factors by direction
 * sector and Tp band): a corner heading and the columns' headings, then each row's heading and its
 * factors to 3 decimals. `compact` for a grid inside a list row, else one that fills its card.
 */
export function FactorGridView({
  caption,
  corner,
  columns,
  rows,
  compact = false,
}: {
  caption: string;
  corner: string;
  columns: string[];
  rows: { heading: string; factors: number[] }[];
  compact?: boolean;
}) {
  const pad = compact ? 'px-2 py-1' : 'px-3 py-2';
  return (
    <table className={`${compact ? 'text-xs' : 'w-full text-sm'} tabular-nums`}>
      <caption className="sr-only">{caption}</caption>
      <thead className={compact ? undefined : 'bg-surface-2'}>
        <tr className="text-xs text-ink-soft">
          <th className={`${pad} text-left font-semibold`}>{corner}</th>
          {columns.map((heading, j) => (
            <th key={j} className={`${pad} text-right font-semibold whitespace-nowrap`}>
              {heading}
            </th>
          ))}
        </tr>
      </thead>
      <tbody>
        {rows.map((row, i) => (
          <tr key={i} className="border-t border-line">
            <th scope="row" className={`${pad} text-left font-semibold whitespace-nowrap`}>
              {row.heading}
            </th>
            {row.factors.map((f, j) => (
              <td key={j} className={`${pad} text-right`}>
                {fmt(f, 3)}
              </td>
            ))}
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/** One axis of an editable factor grid (its columns or its rows), each with its own inputs and a remove button. */
export interface GridAxis {
  count: number;
  /** The inputs of column (row) `k`: its Hs limit, its Tp band... */
  head: (k: number) => ReactNode;
  removeLabel: (k: number) => string;
  onRemove: (k: number) => void;
}

/**
 * An editable factor grid: the columns' inputs across the top (each with a remove button, the add
 * button last), each row's inputs down the sticky first column, a factor cell at every crossing.
 * An axis keeps at least one entry. The add-a-row button is the caller's, below the grid.
 */
export function FactorGridEditor({
  caption,
  corner,
  columns,
  rows,
  addColumn,
  removeColumnText,
  removeRowWhat,
  cell,
}: {
  caption: string;
  corner: ReactNode;
  columns: GridAxis;
  rows: GridAxis;
  addColumn: ReactNode;
  /** The words of a column's remove button ("Remove band"). */
  removeColumnText?: string;
  /** What a row is, for its remove button's tooltip ("Remove this sector"). */
  removeRowWhat: string;
  cell: (i: number, j: number) => { label: string; value: string; onValue: (text: string) => void; error?: string };
}) {
  const columnKeys = Array.from({ length: columns.count }, (_, j) => j);
  return (
    <table className="text-sm">
      <caption className="sr-only">{caption}</caption>
      <thead className="bg-surface-2">
        <tr>
          <th scope="col" className="sticky left-0 z-10 bg-surface-2 px-2 py-2 text-left align-bottom text-xs font-semibold text-ink-soft">
            {corner}
          </th>
          {columnKeys.map((j) => (
            <th key={j} scope="col" className="px-1 py-2 align-bottom">
              {columns.head(j)}
              <RemoveButton
                label={columns.removeLabel(j)}
                onClick={() => columns.onRemove(j)}
                disabled={columns.count <= 1}
                className="mt-1 w-full"
              >
                {removeColumnText}
              </RemoveButton>
            </th>
          ))}
          <th scope="col" className="px-2 py-2 align-bottom">
            {addColumn}
          </th>
        </tr>
      </thead>
      <tbody>
        {Array.from({ length: rows.count }, (_, i) => (
          <tr key={i} className="border-t border-line">
            <th scope="row" className="sticky left-0 z-10 bg-surface px-2 py-1">
              <div className="flex items-center gap-1">
                {rows.head(i)}
                <RemoveButton
                  label={rows.removeLabel(i)}
                  what={removeRowWhat}
                  onClick={() => rows.onRemove(i)}
                  disabled={rows.count <= 1}
                />
              </div>
            </th>
            {columnKeys.map((j) => (
              <td key={j} className="px-1 py-1">
                <CellInput {...cell(i, j)} className="w-20" />
              </td>
            ))}
            <td />
          </tr>
        ))}
      </tbody>
    </table>
  );
}
