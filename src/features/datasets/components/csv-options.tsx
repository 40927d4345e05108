import type { ColumnMapping, CsvDelimiter, CsvPreview, DateOrder, DetectedColumns, SeaUnits } from '../../../../shared/seadata';
import { Checkbox, FieldShell, Input, PlainOptions, Select } from '../../../components/ui';
import { formatUtc, formatValue, previewColumns } from './format';

const DELIMITER_NAMES: Record<CsvDelimiter, string> = { ',': 'comma ( , )', ';': 'semicolon ( ; )', '\t': 'tab' };

type MappingKey = keyof ColumnMapping;

/** The mapping step's variables, in the order a coordinator reads a file. */
const MAPPING_FIELDS: { key: MappingKey; label: string; hint?: string }[] = [
  { key: 'time', label: 'Time', hint: 'Date and time in one column, or the time of day when a separate date column is chosen.' },
  { key: 'date', label: 'Separate date column', hint: 'Only for files that keep the date and the time of day apart.' },
  { key: 'hs', label: 'Hs, significant wave height' },
  { key: 'tp', label: 'Tp, peak period (s)' },
  { key: 'tz', label: 'Tz, zero-crossing period (s)' },
  { key: 'te', label: 'Te, energy period (s)' },
  { key: 'dir', label: 'Wave direction (° coming from)' },
  { key: 'wind', label: 'Wind speed' },
  { key: 'windDir', label: 'Wind direction (° coming from)' },
];

/** Common zones first; the full list of the browser's zone database follows in the datalist. */
const COMMON_ZONES = [
  'UTC',
  'Europe/London',
  'Europe/Oslo',
  'Europe/Amsterdam',
  'Europe/Copenhagen',
  'Europe/Berlin',
  'Europe/Paris',
  'Europe/Lisbon',
  'America/New_York',
  'America/Halifax',
  'America/Chicago',
  'America/Los_Angeles',
  'America/Sao_Paulo',
  'Africa/Lagos',
  'Asia/Dubai',
  'Asia/Singapore',
  'Asia/Shanghai',
  'Asia/Tokyo',
  'Australia/Perth',
  'Australia/Sydney',
  'Pacific/Auckland',
];

function allZones(): string[] {
  try {
    const rest = Intl.supportedValuesOf('timeZone').filter((z) => !COMMON_ZONES.includes(z));
    return [...COMMON_ZONES, ...rest];
  } catch {
    return COMMON_ZONES;
  }
}
const ZONES = allZones();

export interface CsvOptionsValues {
  mapping: DetectedColumns;
  units: SeaUnits;
  timeZone: string;
  missingText: string;
  emptyIsMissing: boolean;
  dateOrder: DateOrder | undefined;
  decimalComma: boolean;
}

export interface CsvOptionsProps {
  preview: CsvPreview;
  values: CsvOptionsValues;
  showDateOrder: boolean;
  errors: Partial<Record<string, string>>;
  onDelimiter: (d: CsvDelimiter) => void;
  onChange: (patch: Partial<CsvOptionsValues>) => void;
}

/** The CSV mapping step: delimiter, columns, units, time zone, missing codes and day order. */
export function CsvOptions({ preview, values, showDateOrder, errors, onDelimiter, onChange }: CsvOptionsProps) {
  const { mapping, units } = values;
  const used = new Map<string, number>();
  for (const f of MAPPING_FIELDS) {
    const h = mapping[f.key];
    if (h) used.set(h, (used.get(h) ?? 0) + 1);
  }
  const twice = [...used].filter(([, n]) => n > 1).map(([h]) => h);

  return (
    <div className="flex flex-col gap-5">
      <div className="grid gap-4 sm:grid-cols-2">
        <FieldShell label="Delimiter" htmlFor="csv-delimiter" hint={`Detected from the header row: ${DELIMITER_NAMES[preview.delimiter]}.`}>
          <Select id="csv-delimiter" value={preview.delimiter} onChange={(e) => onDelimiter(e.target.value as CsvDelimiter)}>
            <PlainOptions values={Object.keys(DELIMITER_NAMES) as CsvDelimiter[]} labels={DELIMITER_NAMES} />
          </Select>
        </FieldShell>
        <div className="flex flex-col justify-end gap-1">
          <Checkbox checked={values.decimalComma} onChange={(e) => onChange({ decimalComma: e.target.checked })}>
            Decimal comma (1,5 means 1.5)
          </Checkbox>
          <p className="text-xs text-ink-soft">On by default for semicolon files.</p>
        </div>
      </div>

      <fieldset>
        <legend className="mb-1 text-base font-bold">Columns</legend>
        <p className="mb-3 text-sm text-ink-soft">
          Filled in from the header names; correct any that are wrong. Periods that are not in the file are derived from the ones that are.
        </p>
        <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
          {MAPPING_FIELDS.map((f) => {
            const id = `map-${f.key}`;
            const error = f.key === 'time' ? errors.columns : undefined;
            return (
              <FieldShell key={f.key} label={f.label} htmlFor={id} hint={f.hint} error={error}>
                <Select
                  id={id}
                  value={mapping[f.key] ?? ''}
                  invalid={!!error}
                  onChange={(e) => {
                    const next: DetectedColumns = { ...mapping };
                    if (e.target.value === '') delete next[f.key];
                    else next[f.key] = e.target.value;
                    onChange({ mapping: next });
                  }}
                >
                  <option value="">{f.key === 'time' ? 'Choose the time column' : 'Not in the file'}</option>
                  {preview.headers.map((h, i) => (
                    <option key={`${i}-${h}`} value={h}>
                      {h || `(column ${i + 1}, no name)`}
                    </option>
                  ))}
                </Select>
              </FieldShell>
            );
          })}
        </div>
        {twice.length > 0 ? (
          <p className="mt-2 text-sm text-danger" role="alert">
            Used for more than one variable: {twice.join(', ')}. Check the mapping.
          </p>
        ) : null}
      </fieldset>

      <fieldset className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
        <legend className="mb-1 text-base font-bold">Units, time and missing values</legend>
        <FieldShell label="Wave height unit" htmlFor="unit-height" hint="Stored in metres (1 ft = 0.3048 m).">
          <Select
            id="unit-height"
            value={units.height}
            onChange={(e) => onChange({ units: { ...units, height: e.target.value as SeaUnits['height'] } })}
          >
            <option value="m">metres (m)</option>
            <option value="ft">feet (ft)</option>
          </Select>
        </FieldShell>
        <FieldShell label="Wind speed unit" htmlFor="unit-speed" hint="Stored in m/s (1 kn = 1852/3600 m/s).">
          <Select
            id="unit-speed"
            value={units.speed}
            onChange={(e) => onChange({ units: { ...units, speed: e.target.value as SeaUnits['speed'] } })}
          >
            <option value="m/s">metres per second (m/s)</option>
            <option value="kn">knots (kn)</option>
            <option value="km/h">kilometres per hour (km/h)</option>
          </Select>
        </FieldShell>
        <FieldShell
          label="Time zone of times without an offset"
          htmlFor="time-zone"
          hint="An IANA name such as Europe/Oslo. Times written with Z or an offset keep it. Daylight-saving changes are applied."
          error={errors.timeZone}
        >
          <Input
            id="time-zone"
            list="time-zone-list"
            value={values.timeZone}
            autoComplete="off"
            spellCheck={false}
            invalid={!!errors.timeZone}
            onChange={(e) => onChange({ timeZone: e.target.value })}
          />
          <datalist id="time-zone-list">
            {ZONES.map((z) => (
              <option key={z} value={z} />
            ))}
          </datalist>
        </FieldShell>
        <div className="sm:col-span-2">
          <FieldShell
            label="Missing-value codes"
            htmlFor="missing-codes"
            hint="Separated by commas. Numbers match numerically (-999 also matches -999.0). Replaces the defaults."
            error={errors.missingCodes}
          >
            <Input
              id="missing-codes"
              value={values.missingText}
              spellCheck={false}
              invalid={!!errors.missingCodes}
              onChange={(e) => onChange({ missingText: e.target.value })}
            />
          </FieldShell>
        </div>
        <div className="flex flex-col justify-end">
          <Checkbox checked={values.emptyIsMissing} onChange={(e) => onChange({ emptyIsMissing: e.target.checked })}>
            Empty cells are missing values
          </Checkbox>
        </div>
        {showDateOrder ? (
          <FieldShell
            label="Day order of dates like 01/02/2020"
            htmlFor="date-order"
            hint={
              values.dateOrder !== undefined
                ? 'As chosen.'
                : preview.dateOrder !== undefined
                  ? 'Suggested by the first rows: check it.'
                  : 'Rows are refused as ambiguous until the order is chosen.'
            }
            error={errors.dateOrder}
          >
            <Select
              id="date-order"
              value={preview.dateOrder ?? ''}
              onChange={(e) => onChange({ dateOrder: e.target.value === '' ? undefined : (e.target.value as DateOrder) })}
            >
              <option value="">Choose the order</option>
              <option value="dmy">Day first: DD/MM/YYYY (1 February)</option>
              <option value="mdy">Month first: MM/DD/YYYY (January 2)</option>
            </Select>
          </FieldShell>
        ) : null}
      </fieldset>
    </div>
  );
}

const PREVIEW_COLUMNS = previewColumns<keyof ColumnMapping & keyof CsvPreview['rows'][number]['values']>([
  ['hs', 2],
  ['tp', 1],
  ['tz', 1],
  ['te', 1],
  ['dir', 0],
  ['wind', 1],
  ['windDir', 0],
]);

/**
 * The first rows as the import will read them: UTC time and SI values, with the text as written
 * beneath when it differs; rows with an issue are highlighted and say why.
 */
export function CsvPreviewTable({ preview }: { preview: CsvPreview }) {
  const mapping = preview.mapping;
  const columns = PREVIEW_COLUMNS.filter((c) => mapping[c.key] !== undefined);
  const fieldOf = (name: string | undefined) => (name === undefined ? -1 : preview.headers.indexOf(name));
  const timeField = fieldOf(mapping.time);
  const dateField = fieldOf(mapping.date);
  const badRows = preview.rows.filter((r) => r.issues.length > 0);
  const bad = badRows.length;
  return (
    <div className="flex flex-col gap-2">
      <div className="overflow-x-auto rounded-lg border border-line bg-surface">
        <table className="w-full text-sm" data-testid="csv-preview">
          <caption className="px-3 py-2 text-left text-sm text-ink-soft">
            The first {preview.rows.length} rows as they will be read{bad > 0 ? `: ${bad} with a problem, highlighted` : ''}.
          </caption>
          <thead className="border-y border-line bg-surface-2">
            <tr>
              <th className="px-3 py-2 text-right text-xs font-semibold text-ink-soft">Line</th>
              <th className="px-3 py-2 text-left text-xs font-semibold text-ink-soft">Time</th>
              {columns.map((c) => (
                <th key={c.key} className="px-3 py-2 text-right text-xs font-semibold whitespace-nowrap text-ink-soft">
                  {c.label}
                </th>
              ))}
              <th className="px-3 py-2 text-left text-xs font-semibold text-ink-soft">Problems</th>
            </tr>
          </thead>
          <tbody>
            {preview.rows.map((r) => {
              const rawTime =
                timeField === -1
                  ? ''
                  : dateField === -1
                    ? (r.fields[timeField] ?? '')
                    : `${r.fields[dateField] ?? ''} ${r.fields[timeField] ?? ''}`;
              const hasIssue = r.issues.length > 0;
              return (
                <tr
                  key={r.line}
                  className={`border-b border-line last:border-0 ${hasIssue ? 'bg-danger-soft' : ''}`}
                  data-issue={hasIssue || undefined}
                >
                  <td className="px-3 py-1.5 text-right align-top whitespace-nowrap tabular-nums">
                    {hasIssue ? <span aria-label="has a problem">⚠ </span> : null}
                    {r.line}
                  </td>
                  <td className="px-3 py-1.5 align-top whitespace-nowrap">
                    {Number.isNaN(r.timeMs) ? <span className="text-danger">not read</span> : formatUtc(r.timeMs)}
                    {rawTime.trim() !== '' ? <span className="block text-xs text-ink-soft">{rawTime.trim()}</span> : null}
                  </td>
                  {columns.map((c) => {
                    const raw = (r.fields[fieldOf(mapping[c.key])] ?? '').trim();
                    const shown = formatValue(r.values[c.key], c.decimals);
                    return (
                      <td key={c.key} className="px-3 py-1.5 text-right align-top tabular-nums">
                        {shown}
                        {raw !== '' && raw !== shown ? <span className="block text-xs text-ink-soft">{raw}</span> : null}
                      </td>
                    );
                  })}
                  <td className="px-3 py-1.5 align-top">
                    {hasIssue ? (
                      <ul className="text-xs">
                        {r.issues.map((i, k) => (
                          <li key={k}>
                            {i.column ? <strong>{i.column}: </strong> : null}
                            {i.reason}
                          </li>
                        ))}
                      </ul>
                    ) : (
                      <span className="text-xs text-ink-soft">none</span>
                    )}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      {bad > 0 ? (
        // On a phone the problems column is off to the side: list the problems under the table too.
        <ul className="flex flex-col gap-1 text-sm text-danger sm:hidden">
          {badRows.map((r) =>
            r.issues.map((i, k) => (
              <li key={`${r.line}-${k}`}>
                ⚠ Line {r.line}
                {i.column ? `, ${i.column}` : ''}: {i.reason}
              </li>
            )),
          )}
        </ul>
      ) : null}
    </div>
  );
}
