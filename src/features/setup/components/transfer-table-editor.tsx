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
import { CellInput, errorAt, GridErrors, PairCells, RemoveButton, setPairAt } from './form-bits';
import { fmt } from './format';
import { numberFromText, textFromNumber } from './number-text';
import { HeadingRow } from '../../../components/ui/table';

/** A transfer table as typed: the same shape as {@link TransferTableInput}, every number as text. */
export interface TransferTableText {
  directionSectorsDeg: [string, string][];
  tpBandsS: [string, string][];
  factors: string[][];
}

export function transferTableToText(t: TransferTableInput): TransferTableText {
  const pair = ([a, b]: [number, number]): [string, string] => [textFromNumber(a), textFromNumber(b)];
  return {
    directionSectorsDeg: t.directionSectorsDeg.map(pair),
    tpBandsS: t.tpBandsS.map(pair),
    factors: t.factors.map((row) => row.map(textFromNumber)),
  };
}

/** Text to numbers (NaN where malformed; the schema then names the cell). */
export function transferTableFromText(t: TransferTableText): TransferTableInput {
  const pair = ([a, b]: [string, string]): [number, number] => [numberFromText(a), numberFromText(b)];
  return {
    directionSectorsDeg: t.directionSectorsDeg.map(pair),
    tpBandsS: t.tpBandsS.map(pair),
    factors: t.factors.map((row) => row.map(numberFromText)),
  };
}

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
  const removeSector = (i: number) =>
    onChange({ ...value, directionSectorsDeg: sectors.filter((_, r) => r !== i), factors: factors.filter((_, r) => r !== i) });
  const addBand = () => {
    const last = bands[bands.length - 1];
    onChange({ ...value, tpBandsS: [...bands, [last?.[1] ?? '0', '']], factors: factors.map((row) => [...row, '1']) });
  };
  const removeBand = (j: number) =>
    onChange({ ...value, tpBandsS: bands.filter((_, c) => c !== j), factors: factors.map((row) => row.filter((_, c) => c !== j)) });

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
        <label
          htmlFor={`${id}-csv`}
          className="inline-flex min-h-11 cursor-pointer items-center rounded-lg border border-line bg-surface-2 px-4 text-sm font-semibold hover:border-accent"
        >
          Read from a CSV file…
        </label>
        <input
          id={`${id}-csv`}
          type="file"
          accept=".csv,.txt,text/csv,text/plain"
          className="sr-only"
          onChange={(e) => {
            void onFile(e.target.files?.[0]);
            e.target.value = '';
          }}
        />
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
        <table className="text-sm">
          <caption className="sr-only">
            Transfer table: Hs at the worksite divided by Hs at the data point, by direction sector and Tp band
          </caption>
          <thead className="bg-surface-2">
            <tr>
              <th scope="col" className="px-2 py-2 text-left align-bottom text-xs font-semibold text-ink-soft">
                Sector from–to (°)
                <span className="block font-normal">↓ coming from · Tp band (s) →</span>
              </th>
              {bands.map((b, j) => (
                <th key={j} scope="col" className="px-1 py-2 align-bottom">
                  <div className="flex items-center gap-1">
                    <PairCells
                      pair={b}
                      labels={[`Tp band ${j + 1} from, s`, `Tp band ${j + 1} to, s`]}
                      errors={[err(`tpBandsS.${j}.0`), err(`tpBandsS.${j}.1`)]}
                      onValue={(k, t) => setBand(j, k, t)}
                      className="w-16"
                    />
                  </div>
                  <RemoveButton
                    label={`Remove Tp band ${j + 1}`}
                    onClick={() => removeBand(j)}
                    disabled={bands.length <= 1}
                    className="mt-1 w-full"
                  >
                    Remove band
                  </RemoveButton>
                </th>
              ))}
              <th scope="col" className="px-1 py-2 align-bottom">
                <Button variant="secondary" onClick={addBand} disabled={bands.length >= TRANSFER_MAX_BANDS} className="whitespace-nowrap">
                  + Tp band
                </Button>
              </th>
            </tr>
          </thead>
          <tbody>
            {sectors.map((s, i) => (
              <tr key={i} className="border-t border-line">
                <th scope="row" className="px-2 py-1">
                  <div className="flex items-center gap-1">
                    <PairCells
                      pair={s}
                      labels={[`Sector ${i + 1} from, degrees`, `Sector ${i + 1} to, degrees`]}
                      errors={[err(`directionSectorsDeg.${i}.0`), err(`directionSectorsDeg.${i}.1`)]}
                      onValue={(k, t) => setSector(i, k, t)}
                      className="w-16"
                    />
                    <RemoveButton
                      label={`Remove sector ${i + 1}`}
                      title="Remove this sector"
                      onClick={() => removeSector(i)}
                      disabled={sectors.length <= 1}
                    />
                  </div>
                </th>
                {bands.map((b, j) => (
                  <td key={j} className="px-1 py-1">
                    <CellInput
                      label={`Factor for sector ${sectorLabel(s)}, Tp band ${bandLabel(b)}`}
                      value={factors[i]?.[j] ?? ''}
                      onValue={(t) => setFactor(i, j, t)}
                      error={err(`factors.${i}.${j}`)}
                      className="w-20"
                    />
                  </td>
                ))}
                <td />
              </tr>
            ))}
          </tbody>
        </table>
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
      <table className="text-xs tabular-nums">
        <caption className="sr-only">Transfer table factors Hs site / Hs data point</caption>
        <thead>
          <tr className="text-ink-soft">
            <th className="px-2 py-1 text-left font-semibold">Sector \ Tp</th>
            {table.tpBandsS.map(([a, b], j) => (
              <th key={j} className="px-2 py-1 text-right font-semibold whitespace-nowrap">
                {fmt(a)}–{fmt(b)} s
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {table.directionSectorsDeg.map(([a, b], i) => (
            <tr key={i} className="border-t border-line">
              <th scope="row" className="px-2 py-1 text-left font-semibold whitespace-nowrap">
                {fmt(a)}–{fmt(b)}°
              </th>
              {table.factors[i]?.map((f, j) => (
                <td key={j} className="px-2 py-1 text-right">
                  {fmt(f, 3)}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
