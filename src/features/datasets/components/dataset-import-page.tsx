import { CURRENT_DIR_CONVENTIONS, WATER_LEVEL_REFERENCE_WORDS, WATER_LEVEL_REFERENCES } from '../../../../shared/seadata/water-level';
import { useEffect, useMemo, useRef, useState, type FormEvent } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { usePageZone } from '../../../components/page-zone';
import { DATA_ZONE_STATEMENT } from './data-zone';
import { Link, useNavigate, useParams } from 'react-router-dom';
import {
  BAD_ROW_MODES,
  CSV_DELIMITERS,
  DATASET_KINDS,
  DATE_ORDERS,
  DEFAULT_MISSING_CODES,
  DIRECTION_CONVENTIONS,
  IMPORT_FORMATS,
  ImportFormSchema,
  MAX_DEPTH_M,
  detectFormat,
  isValidTimeZone,
  parseDecimal,
  previewCsv,
  type ColumnMapping,
  type CsvPreview,
  type DatasetKind,
  type DetectedColumns,
  type ImportForm as ImportRequestForm,
  type SeaUnits,
  DEFAULT_WIND_EXPONENT,
  OVER_LAND_WIND_EXPONENT,
} from '../../../../shared/seadata';
import type { ProjectDetail } from '../../../../shared/api-types';
import { ApiError } from '../../../lib/api';
import {
  Button,
  Card,
  Checkbox,
  ErrorNotice,
  FieldShell,
  Notice,
  PageHeader,
  PlainOptions,
  Select,
  Spinner,
  TextField,
} from '../../../components/ui';
import { useProjectAccess } from '../../../api/projects';
import { MAX_NETCDF_UPLOAD_BYTES, MAX_UPLOAD_BYTES, useImportDataset, type ImportFields, type UploadProgress } from '../api/import-dataset';
import { useNetcdfPoints } from '../api/list-netcdf-points';
import { NetcdfPointsTable } from './netcdf-points';
import { useFileHead } from './use-file-head';
import { CsvOptions, CsvPreviewTable, type CsvOptionsValues } from './csv-options';
import { formatBytes, formatDepth, KIND_LABELS } from './format';
import { IssuesTable } from './issues-table';
import { NdbcPreviewTable, previewNdbc } from './ndbc-preview';
import { UploadProgressView } from './upload-progress';

const LIMIT_MB = MAX_UPLOAD_BYTES / 1024 / 1024;
const NETCDF_LIMIT_GB = MAX_NETCDF_UPLOAD_BYTES / 1024 ** 3;
const FOUND = { csv: 'CSV found', ndbc: 'NDBC text found', netcdf: 'NetCDF found' } as const;

const KIND_HINTS: Record<DatasetKind, string> = {
  hindcast: 'A modelled multi-year series, for statistics and downtime schedules.',
  forecast: 'A forecast issue brought as a file; its issue time is the NetCDF forecast_reference_time, else its first time.',
  observation: 'Measured data, e.g. a wave buoy.',
};

const DEFAULT_MISSING_TEXT = DEFAULT_MISSING_CODES.filter((c) => c !== '').join(', ');

/** The import's multiple-choice settings, as [value, text] options; the last three only a CSV file needs. */
const CHOICE_FIELDS = [
  {
    name: 'exponent',
    id: 'wind-exponent',
    label: 'Wind profile exponent a',
    hint: '0.11 over the open sea (Hsu, Meindl & Gilhousen 1994); 1/7 is an over-land value. Used only when the height is not 10 m.',
    options: [
      ['open-sea', '0.11 (open sea)'],
      ['over-land', '1/7 (over land)'],
    ],
    csvOnly: false,
  },
  {
    name: 'directionConvention',
    id: 'direction-convention',
    label: 'Directions in the file',
    hint: 'Lullwatch stores where waves and wind come from. Going-to directions get 180° added.',
    options: [
      ['coming-from', 'Coming from (nautical, usual)'],
      ['going-to', 'Going to (oceanographic)'],
    ],
    csvOnly: true,
  },
  {
    name: 'waterLevelReference',
    id: 'water-level-reference',
    label: 'Water level column holds',
    hint: 'Only for a file with a water level (water_level, wl, tide_m, sea_level…): say what it is; it is never guessed.',
    options: [
      ['', 'Not said (a file with a water level is refused)'],
      ['chart-datum', WATER_LEVEL_REFERENCE_WORDS['chart-datum']],
      ['residual', WATER_LEVEL_REFERENCE_WORDS.residual],
    ],
    csvOnly: true,
  },
  {
    name: 'currentDirConvention',
    id: 'current-dir-convention',
    label: 'Current directions in the file',
    hint: 'Lullwatch stores where the water flows towards (oceanographic). Coming-from directions get 180° added.',
    options: [
      ['going-to', 'Flowing towards (oceanographic, usual)'],
      ['coming-from', 'Coming from'],
    ],
    csvOnly: true,
  },
] as const;

/** `/projects/:projectId/sea-data/import`: coordinators and admins bring a CSV, NDBC or NetCDF file. */
/** Why an NDBC file with wind cannot be imported yet. */
const NEED_HEIGHT =
  'This buoy file has wind: enter the anemometer height (10 if the wind is already at 10 m) so it can be brought to 10 m, where limits are stated.';

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

/** The import form as typed: multipart field values as text, plus the CSV choices made so far. */
const ImportPageValues = z.object({
  name: z.string(),
  kind: z.enum(DATASET_KINDS),
  format: z.enum(IMPORT_FORMATS),
  deep: z.boolean(),
  depth: z.string(),
  anemometer: z.string(),
  exponent: z.enum(['open-sea', 'over-land']),
  directionConvention: z.enum(DIRECTION_CONVENTIONS),
  /** What a water-level column holds ('' = not said; refused when the file has one). */
  waterLevelReference: z.enum(['', ...WATER_LEVEL_REFERENCES]),
  currentDirConvention: z.enum(CURRENT_DIR_CONVENTIONS),
  onBadRows: z.enum(BAD_ROW_MODES),
  timeZone: z.string(),
  missingText: z.string(),
  emptyIsMissing: z.boolean(),
  dateOrder: z.enum(DATE_ORDERS).optional(),
  // CSV choices; null means "as detected from the file".
  delimiter: z.enum(CSV_DELIMITERS).nullable(),
  decimalComma: z.boolean().nullable(),
  mapping: z.custom<DetectedColumns>().nullable(),
  units: z.custom<SeaUnits>().nullable(),
  /** NetCDF grid point "j,i"; '' = the sea point nearest the data point. */
  gridPoint: z.string(),
  /** NetCDF water level: height of the file's datum above chart datum, m ('' = not stated). */
  waterLevelOffset: z.string(),
});
type ImportPageValues = z.infer<typeof ImportPageValues>;

/** What the form's check needs besides its values (the file as read). */
interface ImportContext {
  format: 'csv' | 'ndbc' | 'netcdf' | null;
  preview: CsvPreview | null;
  needHeight: boolean;
}

/** Form keys of the shared schema's fields, where their messages are shown. */
const FIELD_OF: Record<string, keyof ImportPageValues> = {
  name: 'name',
  kind: 'kind',
  dataPointDepth: 'depth',
  anemometerHeight: 'anemometer',
  columns: 'mapping',
  timeZone: 'timeZone',
  missingCodes: 'missingText',
  waterLevelOffset: 'waterLevelOffset',
  gridPoint: 'gridPoint',
};

function missingCodesOf(v: Pick<ImportPageValues, 'missingText' | 'emptyIsMissing'>): string[] {
  const codes = v.missingText
    .split(',')
    .map((c) => c.trim())
    .filter((c) => c !== '');
  return v.emptyIsMissing ? ['', ...codes] : codes;
}

/** The upload's fields before the shared ImportFormSchema (as the server receives them). */
function requestInput(v: ImportPageValues, ctx: ImportContext): Record<string, unknown> {
  const input: Record<string, unknown> = {
    name: v.name,
    kind: v.kind,
    format: v.format,
    dataPointDepth: v.deep ? 'deep' : v.depth,
    onBadRows: v.onBadRows,
    anemometerHeight: v.anemometer.trim() || undefined,
    windExponent: v.exponent === 'over-land' ? OVER_LAND_WIND_EXPONENT : DEFAULT_WIND_EXPONENT,
  };
  if (ctx.format === 'csv' && ctx.preview) {
    Object.assign(input, {
      timeZone: v.timeZone.trim() || undefined,
      columns: v.mapping ?? ctx.preview.mapping,
      units: ctx.preview.units,
      missingCodes: missingCodesOf(v),
      dateOrder: ctx.preview.dateOrder,
      delimiter: ctx.preview.delimiter,
      decimalComma: ctx.preview.decimalComma,
      directionConvention: v.directionConvention,
      waterLevelReference: v.waterLevelReference || undefined,
      currentDirConvention: v.currentDirConvention,
    });
  }
  if (ctx.format === 'netcdf') {
    Object.assign(input, { gridPoint: v.gridPoint || undefined, waterLevelOffset: v.waterLevelOffset.trim() || undefined });
  }
  return input;
}

/**
 * The form's check: the shared {@link ImportFormSchema} on the request's fields (the server's
 * checks and messages), as errors on the form's own fields, plus what only the browser knows.
 * @returns the parsed request form, or the errors by form field.
 */
function checkImport(
  values: ImportPageValues,
  ctx: ImportContext,
): { form: ImportRequestForm } | { errors: Partial<Record<keyof ImportPageValues, string>> } {
  const parsed = ImportFormSchema.safeParse(requestInput(values, ctx));
  const errors: Partial<Record<keyof ImportPageValues, string>> = {};
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      const key = String(issue.path[0] ?? 'form');
      const field = FIELD_OF[key] ?? 'name';
      if (errors[field]) continue;
      errors[field] =
        key === 'columns'
          ? 'Choose the column that holds the time.'
          : key === 'dataPointDepth'
            ? `Enter the depth in metres (above 0, at most ${MAX_DEPTH_M.toLocaleString('en-GB')} m), or tick deep water.`
            : key === 'anemometerHeight'
              ? ANEMOMETER_RANGE
              : key === 'missingCodes'
                ? 'At most 64 codes, each at most 32 characters long.'
                : issue.message;
    }
  }
  if (ctx.needHeight && !errors.anemometer) errors.anemometer = NEED_HEIGHT;
  return Object.keys(errors).length > 0 || !parsed.success ? { errors } : { form: parsed.data };
}

const ANEMOMETER_RANGE = 'Enter a height above 0 and at most 1000 m (10 when the wind is already at 10 m).';

function ImportForm({ project }: { project: ProjectDetail }) {
  const navigate = useNavigate();
  const importMutation = useImportDataset(project.id);
  const pointsQuery = useNetcdfPoints(project.id);
  const abort = useRef<AbortController | null>(null);
  // Set once the user picks a name or kind: the file's name and format no longer fill them in.
  const [chosenByUser, setChosenByUser] = useState({ name: false, kind: false });
  const { head: read, choose } = useFileHead(MAX_UPLOAD_BYTES);
  const file = read.file;
  const head = read.text;
  const [fileError, setFileError] = useState<string | null>(null);
  const [progress, setProgress] = useState<UploadProgress | null>(null);
  const [cancelled, setCancelled] = useState(false);

  const form = useForm<ImportPageValues>({
    resolver: zodResolver(ImportPageValues),
    defaultValues: {
      name: '',
      kind: 'hindcast',
      format: 'auto',
      deep: project.dataPointDepthM === null,
      depth: project.dataPointDepthM?.toString() ?? '',
      anemometer: '',
      exponent: 'open-sea',
      directionConvention: 'coming-from',
      waterLevelReference: '',
      currentDirConvention: 'going-to',
      onBadRows: 'refuse',
      timeZone: 'UTC',
      missingText: DEFAULT_MISSING_TEXT,
      emptyIsMissing: true,
      dateOrder: undefined,
      delimiter: null,
      decimalComma: null,
      mapping: null,
      units: null,
      gridPoint: '',
      waterLevelOffset: '',
    },
  });
  const { register, setValue, clearErrors, formState, control } = form;
  const errors = formState.errors;
  type HeightName = 'depth' | 'anemometer' | 'waterLevelOffset';
  /** A height field's props: metres, its error, the decimal keyboard. */
  const metres = (name: HeightName) => ({ unit: 'm', error: errors[name]?.message, inputMode: 'decimal' as const });
  /** The same, registered, its error cleared as it is typed in. */
  const metresInput = (name: HeightName) => ({ ...metres(name), ...register(name, { onChange: () => clearErrors(name) }) });
  const v = useWatch({ control }) as ImportPageValues;
  const windExponent = v.exponent === 'over-land' ? OVER_LAND_WIND_EXPONENT : DEFAULT_WIND_EXPONENT;

  const detected = read.netcdf ? 'netcdf' : head === null ? null : detectFormat(head);
  const effectiveFormat = v.format === 'auto' ? detected : v.format;
  const isNetcdf = effectiveFormat === 'netcdf';
  const limit = read.netcdf ? MAX_NETCDF_UPLOAD_BYTES : MAX_UPLOAD_BYTES;
  const tooLarge = file !== null && file.size > limit;
  const missingCodes = useMemo(() => missingCodesOf(v), [v.missingText, v.emptyIsMissing]); // eslint-disable-line react-hooks/exhaustive-deps

  const anemometerText = v.anemometer.trim();
  const anemometerValue = useMemo(() => {
    if (anemometerText === '') return undefined;
    const x = parseDecimal(anemometerText);
    return x > 0 && x <= 1000 ? x : undefined;
  }, [anemometerText]);
  const anemometerError = anemometerText !== '' && anemometerValue === undefined ? ANEMOMETER_RANGE : undefined;

  const zoneOk = isValidTimeZone(v.timeZone.trim());
  const needTime = v.mapping !== null && !v.mapping.time;

  const csv = useMemo(() => {
    if (head === null || effectiveFormat !== 'csv') return null;
    try {
      const preview = previewCsv(head, {
        delimiter: v.delimiter ?? undefined,
        decimalComma: v.decimalComma ?? undefined,
        mapping: v.mapping && v.mapping.time ? (v.mapping as ColumnMapping) : undefined,
        units: v.units ?? undefined,
        timeZone: zoneOk ? v.timeZone.trim() : undefined,
        dateOrder: v.dateOrder,
        missingCodes,
        anemometerHeightM: anemometerValue,
        windExponent,
        directionConvention: v.directionConvention,
        waterLevelReference: v.waterLevelReference || undefined,
        currentDirConvention: v.currentDirConvention,
        rows: 12,
      });
      return { preview, error: null };
    } catch (e) {
      return { preview: null, error: e instanceof Error ? e.message : String(e) };
    }
  }, [
    head,
    effectiveFormat,
    v.delimiter,
    v.decimalComma,
    v.mapping,
    v.units,
    zoneOk,
    v.timeZone,
    v.dateOrder,
    missingCodes,
    anemometerValue,
    windExponent,
    v.directionConvention,
    v.waterLevelReference,
    v.currentDirConvention,
  ]);

  const ndbc = useMemo(
    () => (head !== null && effectiveFormat === 'ndbc' ? previewNdbc(head, anemometerValue, windExponent) : null),
    [head, effectiveFormat, anemometerValue, windExponent],
  );
  // NDBC buoys measure wind at about 4-5 m: the height must be stated when the file has wind.
  const ndbcHasWind = ndbc?.records ? ndbc.records.wind.some((w) => w === w) : false;
  const needHeight = effectiveFormat === 'ndbc' && ndbcHasWind && anemometerValue === undefined;

  const preview = csv?.preview ?? null;
  const context: ImportContext = { format: effectiveFormat, preview, needHeight };
  const csvValues: CsvOptionsValues | null = preview
    ? {
        mapping: v.mapping ?? preview.mapping,
        units: preview.units,
        timeZone: v.timeZone,
        missingText: v.missingText,
        emptyIsMissing: v.emptyIsMissing,
        dateOrder: v.dateOrder,
        decimalComma: preview.decimalComma,
      }
    : null;
  const showDateOrder =
    preview !== null &&
    (preview.dateOrder !== undefined || preview.rows.some((r) => r.issues.some((i) => i.reason.startsWith('ambiguous date'))));

  async function chooseFile(f: File | null) {
    setValue('delimiter', null);
    setValue('decimalComma', null);
    setValue('mapping', null);
    setValue('units', null);
    setValue('dateOrder', undefined);
    setValue('gridPoint', '');
    setProgress(null);
    setCancelled(false);
    setFileError(null);
    importMutation.reset();
    pointsQuery.reset();
    if (f && !chosenByUser.name) setValue('name', stripExtension(f.name));
    await choose(f);
  }

  // The kind follows the file's format (buoy text: observation) until the user picks one.
  const detectedNdbc = head !== null && detectFormat(head) === 'ndbc';
  useEffect(() => {
    if (file && !chosenByUser.kind) setValue('kind', detectedNdbc ? 'observation' : 'hindcast');
  }, [file, detectedNdbc, chosenByUser.kind, setValue]);

  function onCsvChange(patch: Partial<CsvOptionsValues>) {
    if (!preview) return;
    if (patch.mapping !== undefined) {
      setValue('mapping', patch.mapping);
      clearErrors('mapping');
    }
    if (patch.units !== undefined) setValue('units', patch.units);
    if (patch.timeZone !== undefined) {
      setValue('timeZone', patch.timeZone);
      clearErrors('timeZone');
    }
    if (patch.missingText !== undefined) {
      setValue('missingText', patch.missingText);
      clearErrors('missingText');
    }
    if (patch.emptyIsMissing !== undefined) setValue('emptyIsMissing', patch.emptyIsMissing);
    if ('dateOrder' in patch) setValue('dateOrder', patch.dateOrder);
    if (patch.decimalComma !== undefined) setValue('decimalComma', patch.decimalComma);
  }

  function onValid(values: ImportPageValues) {
    if (importMutation.isPending || !file || tooLarge) return;
    const checked = checkImport(values, context);
    if ('errors' in checked) {
      for (const [field, message] of Object.entries(checked.errors))
        form.setError(field as keyof ImportPageValues, { type: 'validate', message });
      return;
    }
    const parsed = checked.form;
    const fields: ImportFields = {
      name: parsed.name,
      kind: parsed.kind,
      format: parsed.format,
      dataPointDepth: parsed.dataPointDepth === 'deep' ? 'deep' : String(parsed.dataPointDepth),
      onBadRows: parsed.onBadRows,
    };
    if (parsed.anemometerHeight !== undefined) fields.anemometerHeight = String(parsed.anemometerHeight);
    fields.windExponent = values.exponent === 'over-land' ? '1/7' : String(DEFAULT_WIND_EXPONENT);
    if (effectiveFormat === 'csv') {
      if (parsed.timeZone) fields.timeZone = parsed.timeZone;
      if (parsed.columns) fields.columns = JSON.stringify(parsed.columns);
      if (parsed.units) fields.units = JSON.stringify(parsed.units);
      if (parsed.missingCodes) fields.missingCodes = JSON.stringify(parsed.missingCodes);
      if (parsed.dateOrder) fields.dateOrder = parsed.dateOrder;
      if (parsed.delimiter) fields.delimiter = parsed.delimiter;
      if (parsed.decimalComma !== undefined) fields.decimalComma = String(parsed.decimalComma);
      fields.directionConvention = parsed.directionConvention;
      if (parsed.waterLevelReference) fields.waterLevelReference = parsed.waterLevelReference;
      fields.currentDirConvention = parsed.currentDirConvention;
    }
    if (effectiveFormat === 'netcdf') {
      if (parsed.gridPoint) fields.gridPoint = parsed.gridPoint.join(',');
      if (parsed.waterLevelOffset !== undefined) fields.waterLevelOffset = String(parsed.waterLevelOffset);
    }
    const controller = new AbortController();
    abort.current = controller;
    setCancelled(false);
    setProgress({ phase: 'sending', sentBytes: 0, totalBytes: file.size });
    importMutation.mutate(
      { file, fields, onProgress: setProgress, signal: controller.signal },
      {
        onSuccess: (answer) =>
          void navigate(`/projects/${project.id}/sea-data/${answer.id}`, {
            state: { imported: { records: answer.records, skipped: answer.skipped, warning: answer.warning } },
          }),
        onError: (err) => {
          if (err instanceof DOMException && err.name === 'AbortError') setCancelled(true);
        },
        onSettled: () => {
          abort.current = null;
        },
      },
    );
  }

  function onSubmit(e: FormEvent) {
    e.preventDefault();
    if (importMutation.isPending) return;
    if (!file) {
      setFileError('Choose a file to import.');
      return;
    }
    void form.handleSubmit(onValid)(e);
  }

  const error = importMutation.error;
  const badFile = error instanceof ApiError && error.code === 'bad_file' ? error : null;
  const busy = importMutation.isPending;
  const readError = read.error;
  const blocked =
    !file || tooLarge || readError !== null || (effectiveFormat === 'csv' && (needTime || !zoneOk)) || !!anemometerError || needHeight;

  return (
    <div>
      <PageHeader
        title="Import sea data"
        subtitle={`CSV or NDBC standard meteorological text up to ${LIMIT_MB} MB, or NetCDF (CF conventions) up to ${NETCDF_LIMIT_GB} GB. Nothing is stored until the whole file has been read and checked.`}
        actions={
          <Link
            to={`/projects/${project.id}/sea-data`}
            className="inline-flex min-h-11 items-center rounded-lg px-3 text-sm font-semibold text-ink hover:bg-surface-2"
          >
            Back to the list
          </Link>
        }
      />
      <form className="flex flex-col gap-5" onSubmit={onSubmit} noValidate>
        <Card>
          <h2 className="mb-3 text-lg font-bold">1. The file</h2>
          <div className="grid gap-4 md:grid-cols-[2fr_1fr]">
            <FieldShell
              label="File"
              htmlFor="file"
              hint={`Text up to ${LIMIT_MB} MB (UTF-8); NetCDF up to ${NETCDF_LIMIT_GB} GB.`}
              error={fileError ?? undefined}
            >
              <input
                id="file"
                type="file"
                accept=".csv,.txt,.tsv,.dat,.nc,.nc4,.cdf,.netcdf,text/csv,text/plain,application/x-netcdf"
                disabled={busy}
                onChange={(e) => void chooseFile(e.target.files?.[0] ?? null)}
                className="min-h-11 w-full rounded-lg border border-line bg-surface text-sm text-ink file:mr-3 file:min-h-11 file:cursor-pointer file:border-0 file:border-r file:border-line file:bg-surface-2 file:px-4 file:font-semibold file:text-ink"
              />
            </FieldShell>
            <FieldShell label="Format" htmlFor="format" hint="Automatic looks at the first lines.">
              <Select id="format" disabled={busy} {...register('format')}>
                <option value="auto">Automatic{detected ? ` (${FOUND[detected]})` : ''}</option>
                <option value="csv">CSV</option>
                <option value="ndbc">NDBC standard meteorological</option>
                <option value="netcdf">NetCDF (CF conventions)</option>
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
                This file is {formatBytes(file.size)}: the upload limit is {read.netcdf ? `${NETCDF_LIMIT_GB} GB` : `${LIMIT_MB} MB`}. Split
                it into parts (for example by decade) and import each part.
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
            <TextField
              label="Name"
              id="name"
              error={errors.name?.message}
              hint="Shown in lists and plans."
              maxLength={120}
              {...register('name', { onChange: () => setChosenByUser((c) => ({ ...c, name: true })) })}
            />
            <FieldShell label="Kind" htmlFor="kind" hint={KIND_HINTS[v.kind]}>
              <Select id="kind" {...register('kind', { onChange: () => setChosenByUser((c) => ({ ...c, kind: true })) })}>
                <PlainOptions values={DATASET_KINDS} labels={KIND_LABELS} />
              </Select>
            </FieldShell>
            <div className="flex flex-col gap-1">
              <TextField
                label="Water depth at the data point"
                id="depth"
                hint={`Project setting: ${formatDepth(project.dataPointDepthM)}.${isNetcdf ? ' A model depth in the file replaces it.' : ''}`}
                {...(v.deep ? { ...metres('depth'), value: '', placeholder: 'deep water', disabled: true } : metresInput('depth'))}
              />
              <Checkbox {...register('deep', { onChange: () => clearErrors('depth') })}>
                Deep water (depth unknown or no effect on the waves)
              </Checkbox>
            </div>
            <TextField
              label={
                effectiveFormat === 'ndbc' ? 'Anemometer height above the sea (required for buoy wind)' : 'Anemometer height above the sea'
              }
              id="anemometer"
              hint={
                effectiveFormat === 'ndbc'
                  ? 'Limits are for wind at 10 m; NDBC buoys measure it at about 4-5 m (see the station page). Enter the height, or 10 when the wind is already at 10 m. Wind becomes U10 = Uz·(10/z)^a.'
                  : isNetcdf
                    ? 'Empty: the wind in the file is taken as given at 10 m (as wave models give it). Enter the height when it is not; wind becomes U10 = Uz·(10/z)^a.'
                    : 'Empty: the wind in the file is already at 10 m (no correction). Enter the height when it is not; wind becomes U10 = Uz·(10/z)^a.'
              }
              placeholder={effectiveFormat === 'ndbc' ? 'e.g. 4.1' : 'already at 10 m'}
              {...metresInput('anemometer')}
              error={errors.anemometer?.message ?? anemometerError}
            />
            {CHOICE_FIELDS.filter((f) => !f.csvOnly || effectiveFormat === 'csv').map((f) => (
              <FieldShell key={f.id} label={f.label} htmlFor={f.id} hint={f.hint}>
                <Select id={f.id} {...register(f.name)}>
                  {f.options.map(([value, text]) => (
                    <option key={value} value={value}>
                      {text}
                    </option>
                  ))}
                </Select>
              </FieldShell>
            ))}
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
                  errors={{
                    columns: errors.mapping?.message,
                    missingCodes: errors.missingText?.message,
                    timeZone: errors.timeZone?.message ?? (zoneOk ? undefined : 'Unknown time zone: use an IANA name such as Europe/Oslo.'),
                  }}
                  onDelimiter={(d) => {
                    setValue('delimiter', d);
                    setValue('decimalComma', null);
                    setValue('mapping', null);
                    setValue('units', null);
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
              NDBC standard meteorological text: times are UTC; WVHT is read as Hs, DPD as Tp, APD as Tz, MWD as wave direction, WSPD and
              WDIR as wind; NDBC’s missing codes (99.00, 999, 9999.0, MM) become missing values.
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

        {isNetcdf && file && !tooLarge ? (
          <Card>
            <h2 className="mb-3 text-lg font-bold">3. Point and water level</h2>
            <p className="mb-3 text-sm text-ink-soft">
              Variables are found by their CF standard names (or, without them, by the usual column names); only the chosen point’s series
              is read. Without a choice, the sea point nearest the data point is read (points with over half their wave heights missing are
              skipped). Partitions (wind sea, swells) are read and give the total when the file has none, but only the total is stored for
              now.
            </p>
            <div className="mb-4 flex flex-wrap items-center gap-3">
              <Button variant="secondary" disabled={pointsQuery.isPending || busy} onClick={() => pointsQuery.mutate(file)}>
                {pointsQuery.isPending ? 'Reading the grid…' : 'List the grid points'}
              </Button>
              <span className="text-sm text-ink-soft" data-testid="grid-point-choice">
                {v.gridPoint ? `Chosen point: index [${v.gridPoint}]` : 'Point: the sea point nearest the data point'}
              </span>
            </div>
            {pointsQuery.error ? <ErrorNotice error={pointsQuery.error} /> : null}
            {pointsQuery.data ? (
              <div className="mb-4 flex flex-col gap-2">
                <p className="text-sm">
                  Variables found: {pointsQuery.data.variables.map((x) => `${x.role} = ${x.variable}`).join('; ') || 'none'}
                </p>
                <NetcdfPointsTable answer={pointsQuery.data} value={v.gridPoint} onChange={(g) => setValue('gridPoint', g)} />
              </div>
            ) : null}
            <div className="grid gap-4 md:grid-cols-2">
              <TextField
                label="Water level datum above chart datum"
                id="water-level-offset"
                hint="Only for files with a water level: the height of the datum its standard name states (e.g. mean sea level) above the worksite's chart datum. Without it such a file is refused; a datum is never guessed."
                {...metresInput('waterLevelOffset')}
              />
            </div>
          </Card>
        ) : null}

        <Card>
          <h2 className="mb-3 text-lg font-bold">{head !== null || isNetcdf ? '4' : '3'}. Import</h2>
          <fieldset className="mb-4" hidden={isNetcdf}>
            <legend className="mb-1 text-sm font-semibold">When a row is bad</legend>
            <div className="flex flex-col gap-1 sm:flex-row sm:gap-6">
              {(
                [
                  ['refuse', 'Refuse the file (nothing saved)'],
                  ['skip', 'Skip bad rows and list them'],
                ] as const
              ).map(([value, label]) => (
                <label key={value} className="flex min-h-11 items-center gap-3 text-sm">
                  <input type="radio" value={value} className="size-5 accent-[var(--color-accent)]" {...register('onBadRows')} />
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
                  {v.onBadRows === 'refuse' && !isNetcdf && (badFile.details?.some((d) => (d.line ?? 0) > 0) ?? false) ? (
                    <p className="mt-1">
                      To keep the good rows and list the bad ones, choose “Skip bad rows and list them” and import again.
                    </p>
                  ) : null}
                </Notice>
                {badFile.details && badFile.details.length > 0 ? (
                  <IssuesTable issues={badFile.details} limit={20} caption="Problems found" />
                ) : null}
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
