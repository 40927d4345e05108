// Filters and display choices of the board. They live in the address (?site=&op=&mine=&alpha=
// &days=&width=) so a board can be bookmarked or sent to the crew as it is.
import { useState } from 'react';
import { FieldShell, NamedOptions, Select } from '../../../components/ui';
import { Switch } from '../../../components/ui/switch';

export type HourWidth = 'narrow' | 'wide';

export const HOUR_WIDTH_PX: Record<HourWidth, number> = { narrow: 13, wide: 24 };

export interface BoardFilters {
  siteId: string;
  operationId: string;
  mine: boolean;
  alpha: boolean;
  /** Days shown from now; null = the whole forecast. */
  days: number | null;
  width: HourWidth;
}

interface BoardControlsProps {
  filters: BoardFilters;
  onChange: (patch: Partial<BoardFilters>) => void;
  sites: { id: string; name: string }[];
  operations: { id: string; name: string }[];
  /** Whether the user has operations assigned (the "my operations" filter makes sense). */
  hasOwnOperations: boolean;
}

/** Wide screens open the filters and the key at first; a phone keeps them folded under the board's summary. */
export const isWideScreen = () => typeof window !== 'undefined' && !!window.matchMedia && window.matchMedia('(min-width: 1024px)').matches;

export function BoardControls({ filters, onChange, sites, operations, hasOwnOperations }: BoardControlsProps) {
  const [openAtFirst] = useState(isWideScreen);
  const summary = [
    sites.find((s) => s.id === filters.siteId)?.name ?? 'All worksites',
    operations.find((o) => o.id === filters.operationId)?.name ?? 'All operations',
    filters.days === null ? 'whole forecast' : `${filters.days} days`,
    `${filters.width} hours`,
  ].join(' · ');
  /** The worksite and operation filters: one of the project's named things, or all of them. */
  const namedFilters = [
    { key: 'siteId', id: 'board-site', label: 'Worksite', all: 'All worksites', items: sites },
    { key: 'operationId', id: 'board-operation', label: 'Operation', all: 'All operations', items: operations },
  ] as const;
  return (
    <div className="flex flex-col gap-3">
      <details className="group" open={openAtFirst}>
        <summary className="flex min-h-11 cursor-pointer list-none items-center gap-2 text-sm select-none lg:hidden">
          <span aria-hidden className="transition group-open:rotate-90">
            ›
          </span>
          <span className="font-semibold">Filters</span>
          <span className="truncate text-ink-soft">{summary}</span>
        </summary>
        <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
          {namedFilters.map((f) => (
            <FieldShell key={f.id} label={f.label} htmlFor={f.id}>
              <Select id={f.id} value={filters[f.key]} onChange={(e) => onChange({ [f.key]: e.target.value })}>
                <option value="">{f.all}</option>
                <NamedOptions items={f.items} />
              </Select>
            </FieldShell>
          ))}
          <FieldShell label="Hours shown" htmlFor="board-days">
            <Select
              id="board-days"
              value={filters.days === null ? 'all' : String(filters.days)}
              onChange={(e) => onChange({ days: e.target.value === 'all' ? null : Number(e.target.value) })}
            >
              <option value="2">Next 2 days</option>
              <option value="5">Next 5 days</option>
              <option value="7">Next 7 days</option>
              <option value="all">Whole forecast, past hours too</option>
            </Select>
          </FieldShell>
          <FieldShell label="Hour width" htmlFor="board-width">
            <Select id="board-width" value={filters.width} onChange={(e) => onChange({ width: e.target.value as HourWidth })}>
              <option value="narrow">Narrow: more days at a glance</option>
              <option value="wide">Wide: letters in every hour</option>
            </Select>
          </FieldShell>
        </div>
      </details>
      <div className="flex flex-wrap gap-2">
        <Switch on={filters.alpha} onChange={(alpha) => onChange({ alpha })} testId="alpha-switch">
          Forecast limits (alpha)
        </Switch>
        <Switch on={filters.mine} onChange={(mine) => onChange({ mine })} testId="mine-switch">
          My operations
        </Switch>
        {filters.mine && !hasOwnOperations ? (
          <p className="self-center text-sm text-ink-soft">No operation names you as its skipper.</p>
        ) : null}
      </div>
    </div>
  );
}
