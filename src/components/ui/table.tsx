import type { ReactNode } from 'react';

/** A column heading whose classes are its own, in place of the row's `cellClassName`. */
export interface ColumnHeading {
  label: ReactNode;
  className: string;
}

/**
 * A table's row of column headings, one `<th scope="col">` each, in order. Every heading takes
 * `cellClassName`, and with `right` (the places, from 0, of the columns aligned right) `text-right`
 * or else `text-left`; a `ColumnHeading` takes only its own classes. `null` or `false` leaves a
 * column out (one that only some roles see) and keeps the places of the others.
 */
export function HeadingRow({
  headings,
  className,
  cellClassName,
  right,
}: {
  headings: readonly (ColumnHeading | ReactNode)[];
  className?: string;
  cellClassName?: string;
  right?: readonly number[];
}) {
  return (
    <tr className={className}>
      {headings.map((h, i) => {
        if (h === null || h === false) return null;
        const own = typeof h === 'object' && 'className' in h && 'label' in h ? (h as ColumnHeading) : null;
        const align = right ? (right.includes(i) ? 'text-right' : 'text-left') : undefined;
        const classes = own ? own.className : [cellClassName, align].filter(Boolean).join(' ');
        return (
          <th key={i} scope="col" className={classes || undefined}>
            {own ? own.label : (h as ReactNode)}
          </th>
        );
      })}
    </tr>
  );
}
