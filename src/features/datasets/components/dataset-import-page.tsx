import { useMemo, useRef, useState, type FormEvent } from 'react';
import { usePageZone } from '../../../components/page-zone';
import { DATA_ZONE_STATEMENT } from './data-zone';
import { Link, useNavigate, useParams } from 'react-router-dom';
import {
  DATASET_KINDS,
  DEFAULT_MISSING_CODES,
  ImportFormSchema,
  MAX_DEPTH_M,
  binaryMark,
  detectFormat,
  isValidTimeZone,
  parseDecimal,
  previewCsv,
  type BadRowMode,
  type ColumnMapping,
  type CsvDelimiter,
  type DatasetKind,
  type DateOrder,
  type DetectedColumns,
  type ImportFormat,
  type SeaUnits,
  DEFAULT_WIND_EXPONENT,
  OVER_LAND_WIND_EXPONENT,
  type DirectionConvention,
} from '../../../../shared/seadata';
import type { ProjectDetail } from '../../../../shared/api-types';
import { ApiError } from '../../../lib/api';
import { Button, Card, ErrorNotice, FieldShell, Input, Notice, PageHeader, Select, Spinner } from '../../../components/ui';
import { useProjectAccess } from '../../../api/projects';
import { MAX_UPLOAD_BYTES, useImportDataset, type ImportFields, type UploadProgress } from '../api/import-dataset';
import { CsvOptions, CsvPreviewTable, type CsvOptionsValues } from './csv-options';
import { formatBytes, formatDepth, KIND_LABELS } from './format';
import { IssuesTable } from './issues-table';
import { NdbcPreviewTable, previewNdbc } from './ndbc-preview';
import { UploadProgressView } from './upload-progress';

/** Bytes read in the browser for format detection and the preview. */
const HEAD_BYTES = 64 * 1024;
const LIMIT_MB = MAX_UPLOAD_BYTES / 1024 / 1024;

const KIND_HINTS: Record<DatasetKind, string> = {
  hindcast: 'A modelled multi-year series, for statistics and downtime schedules.',
  forecast: 'A forecast issue brought as a file; its first time is taken as the issue time.',
  observation: 'Measured data, e.g. a wave buoy.',
};

const DEFAULT_MISSING_TEXT = DEFAULT_MISSING_CODES.filter((c) => c !== '').join(', ');

/** `/projects/:projectId/sea-data/import`: coordinators and admins bring a CSV or NDBC file. */
/** Why an NDBC file with wind cannot be imported yet. */
const NEED_HEIGHT = 'This buoy file has wind: enter the anemometer height (10 if the wind is already at 10 m) so it can be brought to 10 m, where limits are stated.';

export function DatasetImportPage() {
  const { projectId = '' } = useParams();
  // The page's one zone statement: sea data are stored and shown in UTC.
  usePageZone(DATA_ZONE_STATEMENT);
  const project = useProjectAccess(projectId);
  if (project.isPending) return <Spinner />;
  if (project.error || !project.data) return <ErrorNotice error={project.error} />;
  if (!project.canEdit) {
    return (
      <Card>
        <h2 className="text-lg font-bold">Importing sea data is for marine coordinators and administrators</h2>
        <p className="mt-1 text-sm text-ink-soft">
          Your role in this project can read the datasets but not add to them. Ask a coordinator to import the file.
        </p>
        <Link to={`/projects/${projectId}/sea-data`} className="mt-3 inline-flex min-h-11 items-center font-semibold text-accent underline">
          Back to the sea data
        </Link>
      </Card>
    );
  }
  return <ImportForm project={project.data} />;
}

function stripExtension(name: string): string {
  const i = name.lastIndexOf('.');
  return (i > 0 ? name.slice(0, i) : name).slice(0, 120);
}

type Errors = Partial<Record<string, string>>;

function ImportForm({ project }: { project: ProjectDetail }) {
  const navigate = useNavigate();
  const importMutation = useImportDataset(project.id);
  const readToken = useRef(0);
  const abort = useRef<AbortController | null>(null);

  const [file, setFile] = useState<File | null>(null);
  const [head, setHead] = useState<string | null>(null);
  const [readError, setReadError] = useState<string | null>(null);
  const [name, setName] = useState('');
  const [nameTouched, setNameTouched] = useState(false);
  const [kind, setKind] = useState<DatasetKind>('hindcast');
  const [kindTouched, setKindTouched] = useState(false);
  const [deep, setDeep] = useState(project.dataPointDepthM === null);
  const [depthText, setDepthText] = useState(project.dataPointDepthM?.toString() ?? '');
  const [format, setFormat] = useState<ImportFormat>('auto');
  const [anemometerText, setAnemometerText] = useState('');
  const [exponentChoice, setExponentChoice] = useState<'open-sea' | 'over-land'>('open-sea');
  const [directionConvention, setDirectionConvention] = useState<DirectionConvention>('coming-from');
  const windExponent = exponentChoice === 'over-land' ? OVER_LAND_WIND_EXPONENT : DEFAULT_WIND_EXPONENT;
  const [onBadRows, setOnBadRows] = useState<BadRowMode>('refuse');
  // CSV choices; null means "as detected from the file".
  const [delimiter, setDelimiter] = useState<CsvDelimiter | null>(null);
  const [decimalComma, setDecimalComma] = useState<boolean | null>(null);
  const [mapping, setMapping] = useState<DetectedColumns | null>(null);
  const [units, setUnits] = useState<SeaUnits | null>(null);
  const [dateOrder, setDateOrder] = useState<DateOrder | undefined>(undefined);
  const [timeZone, setTimeZone] = useState('UTC');
  const [missingText, setMissingText] = useState(DEFAULT_MISSING_TEXT);
  const [emptyIsMissing, setEmptyIsMissing] = useState(true);
  const [errors, setErrors] = useState<Errors>({});
  const [progress, setProgress] = useState<UploadProgress | null>(null);
  const [cancelled, setCancelled] = useState(false);

  const tooLarge = file !== null && file.size > MAX_UPLOAD_BYTES;
  const detected = head === null ? null : detectFormat(head);
  const effectiveFormat = format === 'auto' ? detected : format;

  const missingCodes = useMemo(() => {
    const codes = missingText
      .split(',')
      .map((c) => c.trim())
      .filter((c) => c !== '');
    return emptyIsMissing ? ['', ...codes] : codes;
  }, [missingText, emptyIsMissing]);

  const anemometer = useMemo(() => {
    const t = anemometerText.trim();
    if (t === '') return { value: undefined, error: undefined };
    const x = parseDecimal(t);
    return x > 0 && x <= 1000 ? { value: x, error: undefined } : { value: undefined, error: 'Enter a height above 0 and at most 1000 m (10 when the wind is already at 10 m).' };
  }, [anemometerText]);

  const zoneOk = isValidTimeZone(timeZone.trim());
  const needTime = mapping !== null && !mapping.time;

  const csv = useMemo(() => {
    if (head === null || effectiveFormat !== 'csv') return null;
    try {
      const preview = previewCsv(head, {
        delimiter: delimiter ?? undefined,
        decimalComma: decimalComma ?? undefined,
        mapping: mapping && mapping.time ? (mapping as ColumnMapping) : undefined,
        units: units ?? undefined,
        timeZone: zoneOk ? timeZone.trim() : undefined,
        dateOrder,
        missingCodes,
        anemometerHeightM: anemometer.value,
        windExponent,
        directionConvention,
        rows: 12,
      });
      return { preview, error: null };
    } catch (e) {
      return { preview: null, error: e instanceof Error ? e.message : String(e) };
    }
  }, [head, effectiveFormat, delimiter, decimalComma, mapping, units, zoneOk, timeZone, dateOrder, missingCodes, anemometer.value, windExponent, directionConvention]);

  const ndbc = useMemo(
    () => (head !== null && effectiveFormat === 'ndbc' ? previewNdbc(head, anemometer.value, windExponent) : null),
    [head, effectiveFormat, anemometer.value, windExponent],
  );
  // NDBC buoys measure wind at about 4-5 m: the height must be stated when the file has wind.
  const ndbcHasWind = ndbc?.records ? ndbc.records.wind.some((w) => w === w) : false;
  const needHeight = effectiveFormat === 'ndbc' && ndbcHasWind && anemometer.value === undefined;

  const preview = csv?.preview ?? null;
  const csvValues: CsvOptionsValues | null = preview
    ? {
        mapping: mapping ?? preview.mapping,
        units: preview.units,
        timeZone,
        missingText,
        emptyIsMissing,
        dateOrder,
        decimalComma: preview.decimalComma,
      }
    : null;
  const showDateOrder =
    preview !== null && (preview.dateOrder !== undefined || preview.rows.some((r) => r.issues.some((i) => i.reason.startsWith('ambiguous date'))));

  const clearError = (key: string) => setErrors((e) => (e[key] ? { ...e, [key]: undefined } : e));

  async function chooseFile(f: File | null) {
    const token = ++readToken.current;
    setFile(f);
    setHead(null);
    setReadError(null);
    setDelimiter(null);
    setDecimalComma(null);
    setMapping(null);
    setUnits(null);
    setDateOrder(undefined);
    setProgress(null);
    setCancelled(false);
    importMutation.reset();
    clearError('file');
    if (!f) return;
    if (!nameTouched) setName(stripExtension(f.name));
    if (f.size > MAX_UPLOAD_BYTES) return;
    try {
      let text = await f.slice(0, HEAD_BYTES).text();
      if (token !== readToken.current) return;
      if (f.size > HEAD_BYTES) {
        // Keep whole lines only: the last one may be cut (even inside a character).
        const nl = text.lastIndexOf('\n');
        if (nl > 0) text = text.slice(0, nl + 1);
      }
      if (binaryMark(text) !== null) {
        setReadError('This is not a text file: it holds binary data. Choose a CSV or NDBC text file.');
        return;
      }
      setHead(text);
      if (!kindTouched) setKind(detectFormat(text) === 'ndbc' ? 'observation' : 'hindcast');
    } catch {
      if (token === readToken.current) setReadError('The browser could not read this file.');
    }
  }

  function onCsvChange(patch: Partial<CsvOptionsValues>) {
    if (!preview) return;
    if (patch.mapping !== undefined) {
      setMapping(patch.mapping);
      clearError('columns');
    }
    if (patch.units !== undefined) setUnits(patch.units);
    if (patch.timeZone !== undefined) {
      setTimeZone(patch.timeZone);
      clearError('timeZone');
    }
    if (patch.missingText !== undefined) {
      setMissingText(patch.missingText);
      clearError('missingCodes');
    }
    if (patch.emptyIsMissing !== undefined) setEmptyIsMissing(patch.emptyIsMissing);
    if ('dateOrder' in patch) setDateOrder(patch.dateOrder);
    if (patch.decimalComma !== undefined) setDecimalComma(patch.decimalComma);
  }

  function onSubmit(e: FormEvent) {
    e.preventDefault();
    if (importMutation.isPending) return;
    if (!file) {
      setErrors({ file: 'Choose a file to import.' });
      return;
    }
    if (tooLarge) return;
    const isCsv = effectiveFormat === 'csv';
    const input: Record<string, unknown> = {
      name,
      kind,
      format,
      dataPointDepth: deep ? 'deep' : depthText,
      onBadRows,
      anemometerHeight: anemometerText.trim() || undefined,
      windExponent,
    };
    if (isCsv && preview && csvValues) {
      Object.assign(input, {
        timeZone: timeZone.trim() || undefined,
        columns: csvValues.mapping,
        units: preview.units,
        missingCodes,
        dateOrder: preview.dateOrder,
        delimiter: preview.delimiter,
        decimalComma: preview.decimalComma,
        directionConvention,
      });
    }
    const parsed = ImportFormSchema.safeParse(input);
    const next: Errors = {};
    if (!parsed.success) {
      for (const issue of parsed.error.issues) {
        const key = String(issue.path[0] ?? 'form');
        if (next[key]) continue;
        next[key] =
          key === 'columns'
            ? 'Choose the column that holds the time.'
            : key === 'dataPointDepth'
              ? `Enter the depth in metres (above 0, at most ${MAX_DEPTH_M.toLocaleString('en-GB')} m), or tick deep water.`
              : key === 'missingCodes'
                ? 'At most 64 codes, each at most 32 characters long.'
                : issue.message;
      }
    }
    if (anemometer.error) next.anemometerHeight = anemometer.error;
    if (needHeight) next.anemometerHeight = NEED_HEIGHT;
    if (Object.keys(next).length > 0 || !parsed.success) {
      setErrors(next);
      return;
    }
    setErrors({});
    const form = parsed.data;
    const fields: ImportFields = {
      name: form.name,
      kind: form.kind,
      format: form.format,
      dataPointDepth: form.dataPointDepth === 'deep' ? 'deep' : String(form.dataPointDepth),
      onBadRows: form.onBadRows,
    };
    if (form.anemometerHeight !== undefined) fields.anemometerHeight = String(form.anemometerHeight);
    fields.windExponent = exponentChoice === 'over-land' ? '1/7' : String(DEFAULT_WIND_EXPONENT);
    if (isCsv) {
      if (form.timeZone) fields.timeZone = form.timeZone;
      if (form.columns) fields.columns = JSON.stringify(form.columns);
      if (form.units) fields.units = JSON.stringify(form.units);
      if (form.missingCodes) fields.missingCodes = JSON.stringify(form.missingCodes);
      if (form.dateOrder) fields.dateOrder = form.dateOrder;
      if (form.delimiter) fields.delimiter = form.delimiter;
      if (form.decimalComma !== undefined) fields.decimalComma = String(form.decimalComma);
      fields.directionConvention = form.directionConvention;
    }
    const controller = new AbortController();
    abort.current = controller;
    setCancelled(false);
    setProgress({ phase: 'sending', sentBytes: 0, totalBytes: file.size });
    importMutation.mutate(
      { file, fields, onProgress: setProgress, signal: controller.signal },
      {
        onSuccess: (answer) =>
          void navigate(`/projects/${project.id}/sea-data/${answer.id}`, { state: { imported: { records: answer.records, skipped: answer.skipped, warning: answer.warning } } }),
        onError: (err) => {
          if (err instanceof DOMException && err.name === 'AbortError') setCancelled(true);
        },
        onSettled: () => {
          abort.current = null;
        },
      },
    );
  }

  const error = importMutation.error;
  const badFile = error instanceof ApiError && error.code === 'bad_file' ? error : null;
  const busy = importMutation.isPending;
  const blocked = !file || tooLarge || readError !== null || (effectiveFormat === 'csv' && (needTime || !zoneOk)) || !!anemometer.error || needHeight;

  return (
    <div>
      <PageHeader
        title="Import sea data"
        subtitle={`CSV or NDBC standard meteorological text, up to ${LIMIT_MB} MB. Nothing is stored until the whole file has been read and checked.`}
        actions={
          <Link to={`/projects/${project.id}/sea-data`} className="inline-flex min-h-11 items-center rounded-lg px-3 text-sm font-semibold text-ink hover:bg-surface-2">
            Back to the list
          </Link>
        }
      />
      <form className="flex flex-col gap-5" onSubmit={onSubmit} noValidate>
        <Card>
          <h2 className="mb-3 text-lg font-bold">1. The file</h2>
          <div className="grid gap-4 md:grid-cols-[2fr_1fr]">
            <FieldShell label="File" htmlFor="file" hint={`Up to ${LIMIT_MB} MB; UTF-8 text.`} error={errors.file}>
              <input
                id="file"
                type="file"
                accept=".csv,.txt,.tsv,.dat,text/csv,text/plain"
                disabled={busy}
                onChange={(e) => void chooseFile(e.target.files?.[0] ?? null)}
                className="min-h-11 w-full rounded-lg border border-line bg-surface text-sm text-ink file:mr-3 file:min-h-11 file:cursor-pointer file:border-0 file:border-r file:border-line file:bg-surface-2 file:px-4 file:font-semibold file:text-ink"
              />
            </FieldShell>
            <FieldShell label="Format" htmlFor="format" hint="Automatic looks at the first lines.">
              <Select id="format" value={format} disabled={busy} onChange={(e) => setFormat(e.target.value as ImportFormat)}>
                <option value="auto">Automatic{detected ? ` (${detected === 'ndbc' ? 'NDBC text found' : 'CSV found'})` : ''}</option>
                <option value="csv">CSV</option>
                <option value="ndbc">NDBC standard meteorological</option>
              </Select>
            </FieldShell>
          </div>
          {file ? (
            <p className="mt-3 text-sm" data-testid="chosen-file">
              <strong className="break-all">{file.name}</strong> <span className="text-ink-soft">({formatBytes(file.size)})</span>
            </p>
          ) : null}
          {tooLarge ? (
            <div className="mt-3">
              <Notice tone="error">
                This file is {formatBytes(file.size)}: the upload limit is {LIMIT_MB} MB. Split it into parts (for example by decade) and import each part.
              </Notice>
            </div>
          ) : null}
          {readError ? (
            <div className="mt-3">
              <Notice tone="error">{readError}</Notice>
            </div>
          ) : null}
        </Card>

        <Card>
          <h2 className="mb-3 text-lg font-bold">2. About the data</h2>
          <div className="grid gap-4 md:grid-cols-2">
            <FieldShell label="Name" htmlFor="name" error={errors.name} hint="Shown in lists and plans.">
              <Input
                id="name"
                value={name}
                maxLength={120}
                invalid={!!errors.name}
                onChange={(e) => {
                  setName(e.target.value);
                  setNameTouched(true);
                  clearError('name');
                }}
              />
            </FieldShell>
            <FieldShell label="Kind" htmlFor="kind" hint={KIND_HINTS[kind]}>
              <Select
                id="kind"
                value={kind}
                onChange={(e) => {
                  setKind(e.target.value as DatasetKind);
                  setKindTouched(true);
                }}
              >
                {DATASET_KINDS.map((k) => (
                  <option key={k} value={k}>
                    {KIND_LABELS[k]}
                  </option>
                ))}
              </Select>
            </FieldShell>
            <div className="flex flex-col gap-1">
              <FieldShell
                label="Water depth at the data point"
                unit="m"
                htmlFor="depth"
                error={errors.dataPointDepth}
                hint={`Project setting: ${formatDepth(project.dataPointDepthM)}.`}
              >
                <Input
                  id="depth"
                  inputMode="decimal"
                  value={deep ? '' : depthText}
                  placeholder={deep ? 'deep water' : ''}
                  disabled={deep}
                  invalid={!!errors.dataPointDepth}
                  onChange={(e) => {
                    setDepthText(e.target.value);
                    clearError('dataPointDepth');
                  }}
                />
              </FieldShell>
              <label className="flex min-h-11 items-center gap-3 text-sm font-semibold">
                <input
                  type="checkbox"
                  className="size-5 accent-[var(--color-accent)]"
                  checked={deep}
                  onChange={(e) => {
                    setDeep(e.target.checked);
                    clearError('dataPointDepth');
                  }}
                />
                Deep water (depth unknown or no effect on the waves)
              </label>
            </div>
            <FieldShell
              label={effectiveFormat === 'ndbc' ? 'Anemometer height above the sea (required for buoy wind)' : 'Anemometer height above the sea'}
              unit="m"
              htmlFor="anemometer"
              error={errors.anemometerHeight ?? anemometer.error}
              hint={
                effectiveFormat === 'ndbc'
                  ? 'Limits are for wind at 10 m; NDBC buoys measure it at about 4-5 m (see the station page). Enter the height, or 10 when the wind is already at 10 m. Wind becomes U10 = Uz·(10/z)^a.'
                  : 'Empty: the wind in the file is already at 10 m (no correction). Enter the height when it is not; wind becomes U10 = Uz·(10/z)^a.'
              }
            >
              <Input
                id="anemometer"
                inputMode="decimal"
                value={anemometerText}
                placeholder={effectiveFormat === 'ndbc' ? 'e.g. 4.1' : 'already at 10 m'}
                invalid={!!anemometer.error || !!errors.anemometerHeight}
                onChange={(e) => {
                  setAnemometerText(e.target.value);
                  clearError('anemometerHeight');
                }}
              />
            </FieldShell>
            <FieldShell
              label="Wind profile exponent a"
              htmlFor="wind-exponent"
              hint="0.11 over the open sea (Hsu, Meindl & Gilhousen 1994); 1/7 is an over-land value. Used only when the height is not 10 m."
            >
              <Select id="wind-exponent" value={exponentChoice} onChange={(e) => setExponentChoice(e.target.value as 'open-sea' | 'over-land')}>
                <option value="open-sea">0.11 (open sea)</option>
                <option value="over-land">1/7 (over land)</option>
              </Select>
            </FieldShell>
            {effectiveFormat === 'csv' ? (
              <FieldShell label="Directions in the file" htmlFor="direction-convention" hint="Lullwatch stores where waves and wind come from. Going-to directions get 180° added.">
                <Select id="direction-convention" value={directionConvention} onChange={(e) => setDirectionConvention(e.target.value as DirectionConvention)}>
                  <option value="coming-from">Coming from (nautical, usual)</option>
                  <option value="going-to">Going to (oceanographic)</option>
                </Select>
              </FieldShell>
            ) : null}
            {needHeight ? <Notice tone="error">{NEED_HEIGHT}</Notice> : null}
          </div>
        </Card>

        {head !== null && effectiveFormat === 'csv' ? (
          <Card>
            <h2 className="mb-3 text-lg font-bold">3. Columns and preview</h2>
            {csv?.error ? <Notice tone="error">{csv.error}</Notice> : null}
            {preview && csvValues ? (
              <div className="flex flex-col gap-5">
                <CsvOptions
                  preview={preview}
                  values={csvValues}
                  showDateOrder={showDateOrder}
                  errors={{ ...errors, timeZone: errors.timeZone ?? (zoneOk ? undefined : 'Unknown time zone: use an IANA name such as Europe/Oslo.') }}
                  onDelimiter={(d) => {
                    setDelimiter(d);
                    setDecimalComma(null);
                    setMapping(null);
                    setUnits(null);
                  }}
                  onChange={onCsvChange}
                />
                {needTime ? (
                  <Notice tone="error">Choose the column that holds the time to see the preview.</Notice>
                ) : (
                  <>
                    {preview.fileIssues.length > 0 ? (
                      <Notice tone="error">
                        <ul className="list-disc pl-5">
                          {preview.fileIssues.map((i, k) => (
                            <li key={k}>
                              {i.column ? `${i.column}: ` : ''}
                              {i.reason}
                            </li>
                          ))}
                        </ul>
                      </Notice>
                    ) : null}
                    {preview.rows.length > 0 ? <CsvPreviewTable preview={preview} /> : null}
                  </>
                )}
              </div>
            ) : null}
          </Card>
        ) : null}

        {head !== null && effectiveFormat === 'ndbc' && ndbc ? (
          <Card>
            <h2 className="mb-3 text-lg font-bold">3. Preview</h2>
            <p className="mb-3 text-sm text-ink-soft">
              NDBC standard meteorological text: times are UTC; WVHT is read as Hs, DPD as Tp, APD as Tz, MWD as wave direction, WSPD and WDIR as wind;
              NDBC’s missing codes (99.00, 999, 9999.0, MM) become missing values.
            </p>
            {ndbc.error ? <Notice tone="error">{ndbc.error}</Notice> : null}
            {ndbc.issues.length > 0 ? (
              <div className="mb-3">
                <IssuesTable issues={ndbc.issues} limit={10} caption="Problems in the first lines" />
              </div>
            ) : null}
            <NdbcPreviewTable preview={ndbc} />
          </Card>
        ) : null}

        <Card>
          <h2 className="mb-3 text-lg font-bold">{head !== null ? '4' : '3'}. Import</h2>
          <fieldset className="mb-4">
            <legend className="mb-1 text-sm font-semibold">When a row is bad</legend>
            <div className="flex flex-col gap-1 sm:flex-row sm:gap-6">
              {(
                [
                  ['refuse', 'Refuse the file (nothing saved)'],
                  ['skip', 'Skip bad rows and list them'],
                ] as const
              ).map(([value, label]) => (
                <label key={value} className="flex min-h-11 items-center gap-3 text-sm">
                  <input
                    type="radio"
                    name="onBadRows"
                    value={value}
                    className="size-5 accent-[var(--color-accent)]"
                    checked={onBadRows === value}
                    onChange={() => setOnBadRows(value)}
                  />
                  {label}
                </label>
              ))}
            </div>
          </fieldset>
          {busy ? (
            <div className="mb-4">
              <UploadProgressView progress={progress} fileSize={file?.size ?? 0} />
            </div>
          ) : null}
          <div className="flex flex-wrap gap-2">
            <Button type="submit" disabled={busy || blocked}>
              {busy ? 'Importing…' : 'Import the file'}
            </Button>
            {busy ? (
              <Button variant="secondary" onClick={() => abort.current?.abort()}>
                Cancel
              </Button>
            ) : null}
          </div>
          <div className="mt-4 flex flex-col gap-3 empty:hidden">
            {cancelled ? <Notice tone="info">The upload was cancelled. Nothing was saved.</Notice> : null}
            {badFile ? (
              <>
                <Notice tone="error">
                  <p className="font-semibold">{badFile.message}</p>
                  <p className="mt-1">Nothing was saved.</p>
                  {onBadRows === 'refuse' && (badFile.details?.some((d) => (d.line ?? 0) > 0) ?? false) ? (
                    <p className="mt-1">To keep the good rows and list the bad ones, choose “Skip bad rows and list them” and import again.</p>
                  ) : null}
                </Notice>
                {badFile.details && badFile.details.length > 0 ? <IssuesTable issues={badFile.details} limit={20} caption="Problems found" /> : null}
              </>
            ) : error && !cancelled ? (
              <>
                <ErrorNotice error={error} />
                <p className="text-sm text-ink-soft">Nothing was saved.</p>
              </>
            ) : null}
          </div>
        </Card>
      </form>
    </div>
  );
}
