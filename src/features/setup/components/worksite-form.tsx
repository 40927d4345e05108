import { useId, useMemo, useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import type { SiteResponse } from '../../../../shared/api-types-sites';
import { TRANSFORMATION_CAUTION } from '../../../../shared/caution';
import { BREAKER_INDEX_RANGE, SITE_DEPTH_RANGE_M, WorksiteInput, type WorksiteFormValues } from '../../../../shared/schemas/sites';
import { Button, FieldShell, Input, Select } from '../../../components/ui';
import { useCreateSite } from '../api/create-site';
import { useHindcasts } from '../../../api/datasets';
import { useUpdateSite } from '../api/update-site';
import { useProject } from '../../../api/projects';
import { useMapStyle } from '../../../api/map-style';
import { LazySiteMap } from '../../../components/map/lazy-site-map';
import { applyServerErrors, blankAware, EditForm, DecimalFields, errorAt, FormSection, NameField, type DecimalSpec } from './form-bits';
import { numberFromText, numberOrNull, pairText, textFields, textFromNumber } from './number-text';
import { TideFields, tideFromText, TideText, tideToText } from './tide-fields';
import { CurrentStationField } from './current-station-field';
import { COMMON_TIME_ZONES } from './time-zones';
import {
  starterTransferTable,
  TransferTableEditor,
  transferTableFromText,
  transferTableToText,
  type TransferTableText,
} from './transfer-table-editor';

/** The worksite form as typed: the request body's field names, numbers as text. */
const WorksiteText = z.object({
  ...textFields(
    'name',
    'latitude',
    'longitude',
    'depth',
    'shoreNormal',
    'breakerIndex',
    'timeZone',
    'hindcastDatasetId',
    'currentStationId',
  ),
  transferTable: z
    .object({ directionSectorsDeg: z.array(pairText), tpBandsS: z.array(pairText), factors: z.array(z.array(z.string())) })
    .nullable(),
  tide: TideText,
});
type WorksiteText = z.infer<typeof WorksiteText>;

/**
 * Text to the request body, then the shared {@link WorksiteInput} schema: the same checks and
 * messages as the server, on the same field paths.
 */
const WorksiteFormSchema = WorksiteText.transform((v): WorksiteFormValues => ({
  name: v.name,
  latitude: numberOrNull(v.latitude),
  longitude: numberOrNull(v.longitude),
  depth: numberFromText(v.depth),
  shoreNormal: numberOrNull(v.shoreNormal),
  breakerIndex: numberFromText(v.breakerIndex),
  timeZone: v.timeZone,
  hindcastDatasetId: v.hindcastDatasetId === '' ? null : v.hindcastDatasetId,
  transferTable: v.transferTable ? transferTableFromText(v.transferTable) : null,
  tide: tideFromText(v.tide),
  currentStationId: v.currentStationId === '' ? null : v.currentStationId,
})).pipe(WorksiteInput);

function initialValues(site: SiteResponse | null, defaultZone: string): WorksiteText {
  return {
    name: site?.name ?? '',
    latitude: textFromNumber(site?.latitude),
    longitude: textFromNumber(site?.longitude),
    depth: textFromNumber(site?.depth),
    shoreNormal: textFromNumber(site?.shoreNormal),
    breakerIndex: textFromNumber(site?.breakerIndex ?? BREAKER_INDEX_RANGE.default),
    timeZone: site?.timeZone ?? defaultZone,
    hindcastDatasetId: site?.hindcastDatasetId ?? '',
    transferTable: site?.transferTable ? transferTableToText(site.transferTable) : null,
    tide: tideToText(site?.tide),
    currentStationId: site?.currentStationId ?? '',
  };
}

type DecimalName = 'depth' | 'shoreNormal' | 'breakerIndex' | 'latitude' | 'longitude';

/** Depth, shore normal and breaker index: the first row of the form's numbers. */
const PLACE_FIELDS: DecimalSpec<DecimalName>[] = [
  {
    name: 'depth',
    id: 'depth',
    label: 'Water depth',
    unit: 'm',
    hint: `Still-water depth d at the worksite, ${SITE_DEPTH_RANGE_M.min}–${SITE_DEPTH_RANGE_M.max} m.`,
  },
  {
    name: 'shoreNormal',
    id: 'shore',
    label: 'Shore normal',
    unit: '° from true north',
    hint: 'Coming-from direction of waves that cross the depth contours head-on; leave empty for no refraction.',
  },
  {
    name: 'breakerIndex',
    id: 'gamma',
    label: 'Breaker index γb',
    unit: 'Hs/d',
    hint: `Depth limit Hs ≤ γb·d; ${BREAKER_INDEX_RANGE.default} is common practice (${BREAKER_INDEX_RANGE.min}–${BREAKER_INDEX_RANGE.max}).`,
  },
];

/** The position, optional (the map below fills it in too). */
const POSITION_FIELDS: DecimalSpec<DecimalName>[] = [
  { name: 'latitude', id: 'lat', label: 'Latitude', unit: '° north, negative south', hint: 'Optional.' },
  { name: 'longitude', id: 'lon', label: 'Longitude', unit: '° east, negative west', hint: 'Optional.' },
];

/**
 * Add or edit a worksite. `site` null adds one; `defaultZone` starts a new worksite in the zone
 * of the project's other worksites (else the browser's own).
 */
export function WorksiteForm({
  projectId,
  site,
  defaultZone,
  onDone,
}: {
  projectId: string;
  site: SiteResponse | null;
  defaultZone: string;
  onDone: (saved: SiteResponse | null) => void;
}) {
  const id = useId();
  const create = useCreateSite(projectId);
  const update = useUpdateSite(projectId);
  const hindcasts = useHindcasts(projectId);
  const mutation = site ? update : create;
  const form = useForm<z.input<typeof WorksiteFormSchema>, unknown, z.output<typeof WorksiteFormSchema>>({
    resolver: blankAware(zodResolver(WorksiteFormSchema)),
    defaultValues: initialValues(site, defaultZone),
  });
  const errors = form.formState.errors;
  const table = useWatch({ control: form.control, name: 'transferTable' }) as TransferTableText | null;
  const [showMap, setShowMap] = useState(false);
  const [latText, lonText, shoreText] = useWatch({ control: form.control, name: ['latitude', 'longitude', 'shoreNormal'] }) as [
    string,
    string,
    string,
  ];

  const tide = useWatch({ control: form.control, name: 'tide' }) as TideText;
  const currentStationId = useWatch({ control: form.control, name: 'currentStationId' }) as string;
  const zoneText = useWatch({ control: form.control, name: 'timeZone' }) as string;
  const lat = numberOrNull(latText);
  const lon = numberOrNull(lonText);
  const position = useMemo(
    () => (lat !== null && lon !== null && Number.isFinite(lat) && Number.isFinite(lon) ? { latitude: lat, longitude: lon } : null),
    [lat, lon],
  );

  const setTable = (next: TransferTableText | null) =>
    form.setValue('transferTable', next, { shouldDirty: true, shouldValidate: form.formState.isSubmitted });

  const onSubmit = form.handleSubmit((input) => {
    const done = { onSuccess: (saved: SiteResponse) => onDone(saved), onError: (e: unknown) => applyServerErrors(e, form.setError) };
    if (site) update.mutate({ siteId: site.id, patch: input }, done);
    else create.mutate(input, done);
  });

  const f = (name: string) => `${id}-${name}`;
  const bind = ({ name, id }: DecimalSpec<DecimalName>) => ({
    id: f(id),
    error: errors[name]?.message,
    registration: form.register(name),
  });
  const hindcastList = hindcasts.data ?? [];
  const knownHindcast = !site?.hindcastDatasetId || hindcastList.some((d) => d.id === site.hindcastDatasetId);

  return (
    <EditForm thing="worksite" editing={site?.name} onSubmit={onSubmit} mutation={mutation} onCancel={() => onDone(null)}>
      <div className="grid gap-4 sm:grid-cols-2">
        <NameField id={f('name')} error={errors.name?.message} registration={form.register('name')} />
        <FieldShell
          label="Time zone"
          htmlFor={f('tz')}
          error={errors.timeZone?.message}
          hint="IANA name; the worksite's hours, days and months are shown in it, with its daylight-saving rules."
        >
          <Input
            id={f('tz')}
            list={f('tz-list')}
            autoComplete="off"
            spellCheck={false}
            {...form.register('timeZone')}
            invalid={!!errors.timeZone}
          />
          <datalist id={f('tz-list')}>
            {COMMON_TIME_ZONES.map((z) => (
              <option key={z} value={z} />
            ))}
          </datalist>
        </FieldShell>
      </div>
      <div className="grid gap-4 sm:grid-cols-3">
        <DecimalFields fields={PLACE_FIELDS} bind={bind} />
      </div>
      <div className="grid gap-4 sm:grid-cols-3">
        <DecimalFields fields={POSITION_FIELDS} bind={bind} />
        <FieldShell
          label="Hindcast for statistics"
          htmlFor={f('hindcast')}
          error={errors.hindcastDatasetId?.message}
          hint={hindcasts.isPending ? 'Loading the project’s hindcasts…' : 'Downtime statistics of this worksite are computed from it.'}
        >
          <Select id={f('hindcast')} {...form.register('hindcastDatasetId')} invalid={!!errors.hindcastDatasetId}>
            <option value="">The project’s newest hindcast</option>
            {hindcastList.map((d) => (
              <option key={d.id} value={d.id}>
                {d.name} ({d.start.slice(0, 4)}–{d.end.slice(0, 4)})
              </option>
            ))}
            {!knownHindcast && site?.hindcastDatasetId ? <option value={site.hindcastDatasetId}>A dataset no longer listed</option> : null}
          </Select>
        </FieldShell>
      </div>
      <Button variant="secondary" className="self-start" aria-expanded={showMap} onClick={() => setShowMap((v) => !v)}>
        {showMap ? 'Hide the map' : 'Set the position on a map'}
      </Button>
      {showMap ? (
        <PositionPicker
          projectId={projectId}
          name={site?.name ?? 'New worksite'}
          siteId={site?.id ?? 'new'}
          latitude={latText}
          longitude={lonText}
          shoreNormal={shoreText}
          onPick={(lat, lon) => {
            form.setValue('latitude', String(lat), { shouldDirty: true, shouldValidate: form.formState.isSubmitted });
            form.setValue('longitude', String(lon), { shouldDirty: true, shouldValidate: form.formState.isSubmitted });
          }}
        />
      ) : null}
      <p className="text-xs text-ink-soft">{TRANSFORMATION_CAUTION}</p>

      <FormSection
        id={f('transfer')}
        title="Transfer table (optional)"
        hint="From a site-specific wave model study: Hs at the worksite ÷ Hs at the data point, by direction sector and Tp band. Where set, it replaces refraction and shoaling; the depth limit still applies."
        error={errorAt(errors, 'transferTable')}
      >
        <label className="flex min-h-11 items-center gap-3 text-sm font-semibold">
          <input
            type="checkbox"
            className="size-5 accent-[var(--color-accent)]"
            checked={table !== null}
            onChange={(e) =>
              setTable(e.target.checked ? (site?.transferTable ? transferTableToText(site.transferTable) : starterTransferTable()) : null)
            }
          />
          Use a transfer table for this worksite
        </label>
        {table ? <TransferTableEditor value={table} onChange={setTable} errors={errors} /> : null}
      </FormSection>

      <FormSection
        id={f('tide')}
        title="Tide and tidal current (optional)"
        hint="The depth then moves with the predicted tide: h(t) = chart depth + water level, in the transformation, the depth limit and the tide and depth limits of operations. A current station's predicted tidal current fills the hours a dataset has no current for (the current limit): tidal current only, no wind-driven or surge current; not for navigation."
        error={errorAt(errors, 'tide')}
      >
        <TideFields
          projectId={projectId}
          idPrefix={f('tide')}
          value={tide}
          onChange={(next) => form.setValue('tide', next, { shouldDirty: true, shouldValidate: form.formState.isSubmitted })}
          errors={errors}
          position={position}
          timeZone={zoneText}
        />
        <CurrentStationField
          projectId={projectId}
          idPrefix={f('current')}
          position={position}
          chosen={currentStationId}
          onChoose={(next) => form.setValue('currentStationId', next, { shouldDirty: true, shouldValidate: form.formState.isSubmitted })}
          error={errorAt(errors, 'currentStationId')}
        />
      </FormSection>
    </EditForm>
  );
}

/** The worksite on the project's map at the typed position; a click fills in latitude and longitude. */
function PositionPicker(props: {
  projectId: string;
  name: string;
  siteId: string;
  latitude: string;
  longitude: string;
  shoreNormal: string;
  onPick: (latitude: number, longitude: number) => void;
}) {
  const project = useProject(props.projectId);
  const style = useMapStyle();
  const lat = numberOrNull(props.latitude);
  const lon = numberOrNull(props.longitude);
  const beta = numberOrNull(props.shoreNormal);
  const sites = useMemo(
    () =>
      lat !== null && lon !== null && Number.isFinite(lat) && Number.isFinite(lon)
        ? [{ id: props.siteId, name: props.name, latitude: lat, longitude: lon, shoreNormal: beta }]
        : [],
    [lat, lon, beta, props.siteId, props.name],
  );
  const p = project.data;
  const dataPoint = useMemo(
    () =>
      p && p.dataPointLatitude !== null && p.dataPointLongitude !== null
        ? { name: p.dataPointName || 'Data point', latitude: p.dataPointLatitude, longitude: p.dataPointLongitude }
        : null,
    [p],
  );
  return (
    <div className="grid gap-1">
      <p className="text-sm text-ink-soft">Click the map to set this worksite’s latitude and longitude; zoom in for a closer coast.</p>
      <LazySiteMap
        label={`Map: click to set the position of ${props.name}`}
        sites={sites}
        dataPoint={dataPoint}
        waveDirection={null}
        pickSiteId={props.siteId}
        onPick={props.onPick}
        styleUrl={style.data?.styleUrl ?? null}
        attribution={style.data?.attribution ?? null}
      />
    </div>
  );
}
