import { lazy, Suspense, useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import { PageHeader, Spinner } from '../../../components/ui';
import { ModeTabs, type ModeOption } from './mode-tabs';
import { RegularWavePanel, DEFAULT_REGULAR_FIELDS, type RegularFields } from './regular-wave-panel';
import { SeaStatePanel, DEFAULT_SEA_STATE_FIELDS, type SeaStateFields } from './sea-state-panel';
import { DEFAULT_TABLE_FIELDS, type TableFields } from './wave-table-fields';
import { DEFAULT_RESPONSE_FIELDS, ResponsePanel, type ResponseFields } from './response-panel';

// The table view brings the table library with it: load it only when it is opened.
const WaveTablePanel = lazy(() => import('./wave-table-panel'));

type Mode = 'regular' | 'sea-state' | 'table' | 'response';

const MODES: readonly ModeOption<Mode>[] = [
  { id: 'regular', label: 'Regular wave' },
  { id: 'sea-state', label: 'Sea state' },
  { id: 'table', label: 'Wave table' },
  { id: 'response', label: 'Vessel response' },
];

const isMode = (value: string | null): value is Mode => MODES.some((m) => m.id === value);

/**
 * The wave calculator: linear wave theory for one regular wave, one sea state, the classic wave
 * table, or a vessel's response to one sea state (docs/domain.md#vessel-response). The mode is in the address (?mode=sea-state) so a view can be bookmarked or shared;
 * the inputs of each mode are kept while switching between them.
 */
export function WaveCalculatorPage() {
  const [params, setParams] = useSearchParams();
  const requested = params.get('mode');
  const mode: Mode = isMode(requested) ? requested : 'regular';
  const [regular, setRegular] = useState<RegularFields>(DEFAULT_REGULAR_FIELDS);
  const [seaState, setSeaState] = useState<SeaStateFields>(DEFAULT_SEA_STATE_FIELDS);
  const [table, setTable] = useState<TableFields>(DEFAULT_TABLE_FIELDS);
  const [response, setResponse] = useState<ResponseFields>(DEFAULT_RESPONSE_FIELDS);

  const setMode = (next: Mode) =>
    setParams(
      (prev) => {
        const p = new URLSearchParams(prev);
        if (next === 'regular') p.delete('mode');
        else p.set('mode', next);
        return p;
      },
      { replace: true },
    );

  return (
    <div>
      <PageHeader
        title="Wave calculator"
        subtitle="Linear wave theory on demand: one regular wave, a sea state, the wave table by relative depth, or a vessel’s response to a sea state."
      />
      <ModeTabs modes={MODES} value={mode} onChange={setMode} label="Calculator" idPrefix="wave-calculator" />
      <div role="tabpanel" id={`wave-calculator-panel-${mode}`} aria-labelledby={`wave-calculator-tab-${mode}`} className="mt-4">
        {mode === 'regular' ? <RegularWavePanel fields={regular} onChange={setRegular} /> : null}
        {mode === 'sea-state' ? <SeaStatePanel fields={seaState} onChange={setSeaState} /> : null}
        {mode === 'table' ? (
          <Suspense fallback={<Spinner label="Loading the wave table" />}>
            <WaveTablePanel fields={table} onChange={setTable} />
          </Suspense>
        ) : null}
        {mode === 'response' ? <ResponsePanel fields={response} onChange={setResponse} /> : null}
      </div>
    </div>
  );
}
