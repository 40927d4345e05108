import type { ReactNode } from 'react';
import { createColumnHelper, createSortedRowModel, rowSortingFeature, tableFeatures, useTable } from '@tanstack/react-table';
import { WaveTableForm } from '../../../../shared/schemas/wave';
import { Button, Card } from '../../../components/ui';
import { useWaveTable, type WaveTableRow } from '../api/get-wave-table';
import { formatSig } from '../utils/format-number';
import { useCalculator } from '../utils/use-calculator';
import { waveTableCsv } from '../utils/wave-table-csv';
import { downloadCsv } from '../../../lib/csv';
import { CalculatorPanel, type NumberFieldSpec } from './number-field';
import { withSub } from './symbol';
import { ResultStatus } from './result-status';
import type { TableFields } from './wave-table-fields';

const features = tableFeatures({ rowSortingFeature, sortedRowModel: createSortedRowModel() });
const helper = createColumnHelper<typeof features, WaveTableRow>();

/** Header, and the line of the key below the table, of every column in handbook order. */
const COLUMN_TEXT: { key: keyof WaveTableRow; header: ReactNode; meaning: ReactNode }[] = [
  { key: 'dOverL0', header: withSub('d/L', '0'), meaning: withSub('depth over the deep-water wavelength L', '0', ' = gT²/2π') },
  { key: 'dOverL', header: 'd/L', meaning: 'depth over the local wavelength' },
  { key: 'lOverL0', header: withSub('L/L', '0'), meaning: withSub('local over deep-water wavelength, = C/C', '0', ' = tanh kd') },
  { key: 'kd', header: 'kd', meaning: 'relative depth 2πd/L' },
  { key: 'tanhKd', header: 'tanh kd', meaning: null },
  { key: 'sinhKd', header: 'sinh kd', meaning: null },
  { key: 'coshKd', header: 'cosh kd', meaning: null },
  { key: 'n', header: 'n', meaning: withSub('group over phase speed C', 'g', '/C = ½(1 + 2kd/sinh 2kd)') },
  {
    key: 'cgOverC0',
    header: (
      <>
        C<sub>g</sub>/C<sub>0</sub>
      </>
    ),
    meaning: <>group celerity over deep-water celerity, = n tanh kd</>,
  },
  {
    key: 'shoalingCoefficient',
    header: withSub('K', 's'),
    meaning: (
      <>
        shoaling coefficient H/H<sub>0</sub>′ = √(C<sub>g0</sub>/C<sub>g</sub>)
      </>
    ),
  },
  { key: 'bedPressureFactor', header: withSub('K', 'p', ' bed'), meaning: <>pressure response factor at the bed, 1/cosh kd</> },
];

const columns = helper.columns(
  COLUMN_TEXT.map((c) =>
    helper.accessor(c.key, {
      id: c.key,
      header: () => c.header,
      // d/L0 is the chosen grid: show it as typed; the rest to 5 significant figures, zeros kept.
      cell: (info) => formatSig(info.getValue(), 5, c.key !== 'dOverL0'),
    }),
  ),
);

/** The inputs' card: its heading (for screen readers), its grid and its fields. */
const TABLE_INPUTS = {
  titleId: 'table-inputs-title',
  title: 'Wave table range',
  className: 'grid gap-3 sm:grid-cols-3',
  fields: [
    { name: 'from', id: 'wt-from', label: 'From d/L0', hint: '0.0001 to 100' },
    { name: 'to', id: 'wt-to', label: 'To d/L0', hint: 'Included when on the step grid' },
    { name: 'step', id: 'wt-step', label: 'Step of d/L0', hint: 'At most 2,000 rows' },
  ] satisfies NumberFieldSpec<keyof TableFields>[],
};

/** Wave-table mode: d/L0 range and step, a sortable table of the handbook columns, CSV download. Lazy-loaded. */
export default function WaveTablePanel({ fields, onChange }: { fields: TableFields; onChange: (fields: TableFields) => void }) {
  const calculation = useCalculator(WaveTableForm, fields, onChange, useWaveTable);
  const { check, answer: query } = calculation;

  return (
    <CalculatorPanel
      inputs={TABLE_INPUTS}
      calculation={calculation}
      computingLabel="Computing the table"
      results={(rows) => <WaveTable rows={rows} typing={check.typing} fetching={query.isFetching} lastValid={!check.data} />}
    />
  );
}

function WaveTable({
  rows,
  typing,
  fetching,
  lastValid,
}: {
  rows: WaveTableRow[];
  typing: boolean;
  fetching: boolean;
  lastValid: boolean;
}) {
  const table = useTable({
    features,
    columns,
    data: rows,
    sortDescFirst: false,
    enableSortingRemoval: false,
    initialState: { sorting: [{ id: 'dOverL0', desc: false }] },
  });
  const shown = table.getRowModel().rows;
  const first = rows[0]?.dOverL0;
  const last = rows[rows.length - 1]?.dOverL0;
  const download = () => {
    const step = rows.length > 1 ? rows[1].dOverL0 - rows[0].dOverL0 : 0;
    const name = `wave-table_dL0_${first}-${last}${rows.length > 1 ? `_step-${Number(step.toPrecision(6))}` : ''}.csv`;
    downloadCsv(name, waveTableCsv(shown.map((r) => r.original)));
  };

  return (
    <Card aria-labelledby="wave-table-title" className={lastValid && !typing ? 'opacity-80' : ''}>
      <div className="mb-3 flex flex-wrap items-center justify-between gap-3">
        <div>
          <h2 id="wave-table-title" className="text-lg font-bold">
            Wave table
          </h2>
          <ResultStatus
            updating={typing || fetching}
            lastValid={lastValid}
            caption={`${rows.length} ${rows.length === 1 ? 'row' : 'rows'}, d/L0 from ${formatSig(first, 5)} to ${formatSig(last, 5)}`}
          />
        </div>
        <Button variant="secondary" onClick={download} title="The rows in the order shown, full precision">
          Download CSV
        </Button>
      </div>
      <div className="max-h-[70vh] overflow-auto rounded-lg border border-line" tabIndex={0} aria-label="Wave table, scrolls both ways">
        <table className="min-w-full border-separate border-spacing-0 text-sm tabular-nums" data-testid="wave-table">
          <thead>
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header, i) => {
                  const sorted = header.column.getIsSorted();
                  return (
                    <th
                      key={header.id}
                      scope="col"
                      aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : 'none'}
                      className={`sticky top-0 border-b border-line bg-surface-2 p-0 text-right font-semibold whitespace-nowrap ${i === 0 ? 'left-0 z-20' : 'z-10'}`}
                    >
                      <button
                        type="button"
                        onClick={header.column.getToggleSortingHandler()}
                        className={`inline-flex min-h-11 w-full items-center justify-end gap-1 px-3 font-serif italic hover:text-accent ${sorted ? 'text-accent' : ''}`}
                        title="Sort by this column"
                      >
                        <span>
                          <table.FlexRender header={header} />
                        </span>
                        <span aria-hidden className="w-3 font-sans text-xs not-italic text-ink-soft">
                          {sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : ''}
                        </span>
                      </button>
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {shown.map((row) => (
              <tr key={row.id} className="group">
                {row.getAllCells().map((cell, i) => (
                  <td
                    key={cell.id}
                    className={`border-b border-line/60 px-3 py-1.5 text-right whitespace-nowrap group-odd:bg-surface group-even:bg-canvas group-hover:bg-ok-soft ${
                      i === 0 ? 'sticky left-0 font-semibold' : ''
                    }`}
                  >
                    <table.FlexRender cell={cell} />
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <div className="mt-3 grid gap-2 text-xs text-ink-soft">
        <p>
          Columns as in the classic handbook tables (Shore Protection Manual 1984, Appendix C; Coastal Engineering Manual EM 1110-2-1100,
          Part II-1), by linear theory. Every column is dimensionless. Click a heading to sort.
        </p>
        <dl className="grid gap-x-4 gap-y-0.5 sm:grid-cols-2">
          {COLUMN_TEXT.filter((c) => Boolean(c.meaning)).map((c) => (
            <div key={c.key}>
              <dt className="inline font-serif font-semibold text-ink italic">{c.header}</dt>
              <dd className="inline">: {c.meaning}</dd>
            </div>
          ))}
        </dl>
      </div>
    </Card>
  );
}
