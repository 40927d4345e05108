import { useId, useState } from 'react';
import type { FieldErrors } from 'react-hook-form';
import {
  parseTransferTableCsv,
  TRANSFER_FACTOR_MAX,
  TRANSFER_MAX_BANDS,
  TRANSFER_MAX_SECTORS,
  type TransferTableCsvIssue,
  type TransferTableInput,
} from '../../../../shared/schemas/sites';
import { Button } from '../../../components/ui';
import { errorAt, FilePicker, GridErrors, PairCells, setPairAt, withoutAt } from './form-bits';
import { FactorGridEditor, FactorGridView } from './factor-grid-view';
import { fmt } from './format';
import { numberFromText, textFromNumber } from './number-text';
import { HeadingRow } from '../../../components/ui/table';

/** A transfer table as typed: the same shape as {@link TransferTableInput}, every number as text. */
export interface TransferTableText {
  directionSectorsDeg: [string, string][];
  tpBandsS: [string, string][];
  factors: string[][];
}

/** A transfer table with every number (or text) converted by `f`. */
function mapTransferTable<A, B>(
  t: { directionSectorsDeg: [A, A][]; tpBandsS: [A, A][]; factors: A[][] },
  f: (x: A) => B,
): { directionSectorsDeg: [B, B][]; tpBandsS: [B, B][]; factors: B[][] } {
  const pair = ([a, b]: [A, A]): [B, B] => [f(a), f(b)];
  return {
    directionSectorsDeg: t.directionSectorsDeg.map(pair),
    tpBandsS: t.tpBandsS.map(pair),
    factors: t.factors.map((row) => row.map(f)),
  };
}

export const transferTableToText = (t: TransferTableInput): TransferTableText => mapTransferTable(t, textFromNumber);

/** Text to numbers (NaN where malformed; the schema then names the cell). */
export const transferTableFromText = (t: TransferTableText): TransferTableInput => mapTransferTable(t, numberFromText);

/**
 * A starting table: one sector for every direction and three Tp bands, factor 1 (no change), to
 * be overwritten with the study's figures.
 */
export function starterTransferTable(): TransferTableText {
  return {
    directionSectorsDeg: [['0', '360']],
    tpBandsS: [
      ['0', '8'],
      ['8', '12'],
      ['12', '30'],
    ],
    factors: [['1', '1', '1']],
  };
}

const sectorLabel = (s: [string, string]) => `${s[0] || '?'}–${s[1] || '?'}°`;
const bandLabel = (b: [string, string]) => `${b[0] || '?'}–${b[1] || '?'} s`;

/**
 * The transfer table as an editable grid: direction sectors down, Tp bands across, the factor
 * Hs_site/Hs_src in each cell; or read from a CSV file (checked here with the shared reader, so
 * problems come back with their line and column before anything is sent).
 */
export function TransferTableEditor({
  value,
  onChange,
  errors,
  path = 'transferTable',
}: {
  value: TransferTableText;
  onChange: (next: TransferTableText) => void;
  errors: FieldErrors;
  path?: string;
}) {
  const id = useId();
  const [csv, setCsv] = useState<{ fileName: string; issues: TransferTableCsvIssue[]; read?: string } | null>(null);
  const { directionSectorsDeg: sectors, tpBandsS: bands, factors } = value;

  const setSector = (i: number, k: 0 | 1, text: string) => onChange({ ...value, directionSectorsDeg: setPairAt(sectors, i, k, text) });
  const setBand = (j: number, k: 0 | 1, text: string) => onChange({ ...value, tpBandsS: setPairAt(bands, j, k, text) });
  const setFactor = (i: number, j: number, text: string) =>
    onChange({ ...value, factors: factors.map((row, r) => (r === i ? row.map((f, c) => (c === j ? text : f)) : row)) });
  const addSector = () => {
    const last = sectors[sectors.length - 1];
    onChange({
      ...value,
      directionSectorsDeg: [...sectors, [last?.[1] ?? '0', '']],
      factors: [...factors, bands.map(() => '1')],
    });
  };
  const removeSector = (i: number) => onChange({ ...value, directionSectorsDeg: withoutAt(sectors, i), factors: withoutAt(factors, i) });
  const addBand = () => {
    const last = bands[bands.length - 1];
    onChange({ ...value, tpBandsS: [...bands, [last?.[1] ?? '0', '']], factors: factors.map((row) => [...row, '1']) });
  };
  const removeBand = (j: number) => onChange({ ...value, tpBandsS: withoutAt(bands, j), factors: factors.map((row) => withoutAt(row, j)) });

  const onFile = async (file: File | undefined) => {
    if (!file) return;
    const result = parseTransferTableCsv(await file.text());
    if (result.table) {
      onChange(transferTableToText(result.table));
      setCsv({
        fileName: file.name,
        issues: [],
        read: `${result.table.directionSectorsDeg.length} sectors × ${result.table.tpBandsS.length} Tp bands`,
      });
    } else {
      setCsv({ fileName: file.name, issues: result.issues });
    }
  };

  const err = (p: string) => errorAt(errors, `${path}.${p}`);
  const messages: { where: string; message: string }[] = [];
  const push = (where: string, message: string | undefined) => message && messages.push({ where, message });
  push('Table', err('directionSectorsDeg') ?? err('tpBandsS'));
  push('Factors', err('factors'));
  sectors.forEach((s, i) => {
    push(`Sector ${i + 1} from`, err(`directionSectorsDeg.${i}.0`));
    push(`Sector ${i + 1} to`, err(`directionSectorsDeg.${i}.1`));
    push(`Sector ${sectorLabel(s)}`, err(`factors.${i}`));
  });
  bands.forEach((_, j) => {
    push(`Tp band ${j + 1} from`, err(`tpBandsS.${j}.0`));
    push(`Tp band ${j + 1} to`, err(`tpBandsS.${j}.1`));
  });
  factors.forEach((row, i) =>
    row.forEach((_, j) =>
      push(`Factor at ${sectorLabel(sectors[i] ?? ['', ''])}, ${bandLabel(bands[j] ?? ['', ''])}`, err(`factors.${i}.${j}`)),
    ),
  );

  return (
    <div className="flex min-w-0 flex-col gap-3">
      <div className="flex flex-wrap items-center gap-3">
        <FilePicker id={`${id}-csv`} accept=".csv,.txt,text/csv,text/plain" onFile={(f) => void onFile(f)}>
          Read from a CSV file…
        </FilePicker>
        <details className="text-sm text-ink-soft">
          <summary className="inline-flex min-h-11 cursor-pointer items-center">CSV layout</summary>
          <p className="mt-1">
            Header <code>sector_from,sector_to</code> then one column per Tp band written from-to in seconds; one row per direction sector
            (degrees, coming from), the factor for each band. Comma, semicolon or tab; with semicolon or tab a decimal comma is fine.
          </p>
          <pre className="mt-2 overflow-x-auto rounded-md bg-surface-2 p-2 text-xs text-ink">
            {'sector_from,sector_to,0-6,6-10,10-30\n345,15,0.55,0.62,0.70\n15,45,0.50,0.58,0.66'}
          </pre>
        </details>
      </div>
      {csv && csv.read ? (
        <p role="status" className="text-sm text-ink">
          Read {csv.read} from {csv.fileName}. Check the grid, then save the worksite.
        </p>
      ) : null}
      {csv && csv.issues.length > 0 ? <CsvIssues fileName={csv.fileName} issues={csv.issues} /> : null}

      <div className="overflow-x-auto rounded-lg border border-line">
        <FactorGridEditor
          caption="Transfer table: Hs at the worksite divided by Hs at the data point, by direction sector and Tp band"
          corner={
            <>
              Sector from–to (°)
              <span className="block font-normal">↓ coming from · Tp band (s) →</span>
            </>
          }
          columns={{
            count: bands.length,
            head: (j) => (
              <div className="flex items-center gap-1">
                <PairCells
                  pair={bands[j]}
                  labels={[`Tp band ${j + 1} from, s`, `Tp band ${j + 1} to, s`]}
                  errors={[err(`tpBandsS.${j}.0`), err(`tpBandsS.${j}.1`)]}
                  onValue={(k, t) => setBand(j, k, t)}
                  className="w-16"
                />
              </div>
            ),
            removeLabel: (j) => `Remove Tp band ${j + 1}`,
            onRemove: removeBand,
          }}
          removeColumnText="Remove band"
          addColumn={
            <Button variant="secondary" onClick={addBand} disabled={bands.length >= TRANSFER_MAX_BANDS} className="whitespace-nowrap">
              + Tp band
            </Button>
          }
          rows={{
            count: sectors.length,
            head: (i) => (
              <PairCells
                pair={sectors[i]}
                labels={[`Sector ${i + 1} from, degrees`, `Sector ${i + 1} to, degrees`]}
                errors={[err(`directionSectorsDeg.${i}.0`), err(`directionSectorsDeg.${i}.1`)]}
                onValue={(k, t) => setSector(i, k, t)}
                className="w-16"
              />
            ),
            removeLabel: (i) => `Remove sector ${i + 1}`,
            onRemove: removeSector,
          }}
          removeRowWhat="sector"
          cell={(i, j) => ({
            label: `Factor for sector ${sectorLabel(sectors[i])}, Tp band ${bandLabel(bands[j])}`,
            value: factors[i]?.[j] ?? '',
            onValue: (t) => setFactor(i, j, t),
            error: err(`factors.${i}.${j}`),
          })}
        />
      </div>
      <div className="flex flex-wrap items-center gap-3">
        <Button variant="secondary" onClick={addSector} disabled={sectors.length >= TRANSFER_MAX_SECTORS}>
          + Direction sector
        </Button>
        <p className="text-xs text-ink-soft">
          Factor = Hs at the worksite ÷ Hs at the data point, 0 to {TRANSFER_FACTOR_MAX}. Sectors and bands include their start and exclude
          their end; outside the table the nearest one is used. Only the first sector may wrap through north (e.g. 345–15°).
        </p>
      </div>
      <GridErrors messages={messages} />
    </div>
  );
}

function CsvIssues({ fileName, issues }: { fileName: string; issues: TransferTableCsvIssue[] }) {
  return (
    <div role="alert" className="rounded-lg border border-danger bg-danger-soft p-3 text-sm">
      <p className="font-semibold">
        {fileName} was not read: {issues.length} {issues.length === 1 ? 'problem' : 'problems'}. The grid is unchanged.
      </p>
      <div className="mt-2 max-h-64 overflow-auto">
        <table className="w-full text-left">
          <thead>
            <HeadingRow
              className="text-xs text-ink-soft"
              cellClassName="pr-3"
              headings={['Line', 'Column', 'Cell', { label: 'Problem', className: '' }]}
            />
          </thead>
          <tbody>
            {issues.slice(0, 100).map((i, k) => (
              <tr key={k} className="align-top">
                <td className="pr-3 tabular-nums">{i.line || 'file'}</td>
                <td className="pr-3 tabular-nums">{i.column || '–'}</td>
                <td className="pr-3 font-mono">{i.value}</td>
                <td>{i.reason}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}

/** The table read-only, for the worksite list. */
export function TransferTableView({ table }: { table: TransferTableInput }) {
  return (
    <div className="overflow-x-auto">
      <FactorGridView
        compact
        caption="Transfer table factors Hs site / Hs data point"
        corner="Sector \ Tp"
        columns={table.tpBandsS.map(([a, b]) => `${fmt(a)}–${fmt(b)} s`)}
        rows={table.directionSectorsDeg.map(([a, b], i) => ({ heading: `${fmt(a)}–${fmt(b)}°`, factors: table.factors[i] ?? [] }))}
      />
    </div>
  );
}
