import type { ReactNode } from 'react';

/** A handbook symbol with a subscript, e.g. `withSub('C', 'g')` for C<sub>g</sub>, `withSub('K', 'p', '(z)')` for K<sub>p</sub>(z). */
export function withSub(base: ReactNode, index: ReactNode, after?: ReactNode): ReactNode {
  return (
    <>
      {base}
      <sub>{index}</sub>
      {after}
    </>
  );
}
