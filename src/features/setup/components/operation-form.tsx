import { useId } from 'react';
import { useFieldArray, useForm, useWatch, type FieldErrors } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import type { OperationResponse, SiteResponse } from '../../../../shared/api-types-sites';
import { alphaFor, WEATHER_RESTRICTED_MAX_TPOP_H, WEATHER_RESTRICTED_MAX_TR_H } from '../../../../shared/engine/alpha-factor';
import { BED_VELOCITY_METHODS, HS_TARGETS, LIMIT_RANGES, RESPONSE_STATISTICS, TIDE_REFERENCES } from '../../../../shared/engine/schemas';
import { DEFAULT_MPM_DURATION_H } from '../../../../shared/engine/response-limits';
import { responseLabel, responseUnit } from '../../../../shared/response/rao';
import { HS_TARGET_LABELS } from '../../../../shared/engine/explain-hour';
import type { AlphaTable, OperationLimits } from '../../../../shared/engine/types';
import { OperationInput, type OperationFormValues } from '../../../../shared/schemas/sites';
import { Button, FieldShell, PlainOptions, Select, Spinner, TextArea } from '../../../components/ui';
import { useCreateOperation } from '../api/create-operation';
import { useUpdateOperation } from '../api/update-operation';
import { useMembers } from '../api/get-members';
import { useVessels } from '../../../api/vessels';
import {
  applyServerErrors,
  blankAware,
  EditForm,
  DecimalField,
  errorAt,
  FormSection,
  NameField,
  rangeHint,
  TickList,
  withSubject,
  type DecimalSpec,
  type PairListEditorProps,
} from './form-bits';
import { CurveEditor } from './hs-tp-curve-editor';
import { BandsEditor } from './tp-bands-editor';
import { fmt } from './format';
import { HsTpPlot } from './hs-tp-plot';
import { BED_VELOCITY_METHOD_LABEL } from '../../../../shared/limits-in-words';
import { numberFromText, numberOrNull, pairText, textFields, textFromNumber } from './number-text';

/** The operation form as typed: the request body's field names, numbers as text; vesselId '' is no vessel. */
const OperationText = z.object({
  ...textFields('name', 'description', 'tpop', 'tc', 'vesselId', 'heading'),
  weatherRestricted: z.boolean(),
  siteIds: z.array(z.string()),
  skipperIds: z.array(z.string()),
  limits: z.object({
    ...textFields('hsMax', 'tpMin', 'tpMax', 'bedVelocityMax', 'windMax', 'draught', 'clearance', 'maxDepth', 'currentMax'),
    ...textFields('tideBefore', 'tideAfter', 'targetMax', 'targetMinPeriod'),
    hsTpCurve: z.array(pairText),
    tpExcluded: z.array(pairText),
    bedVelocityMethod: z.enum(BED_VELOCITY_METHODS),
    tideReference: z.enum(['none', ...TIDE_REFERENCES]),
    targetKind: z.enum(['none', ...HS_TARGETS]),
    responses: z.array(
      z.object({ response: z.string(), statistic: z.enum(RESPONSE_STATISTICS), durationH: z.string().optional(), max: z.string() }),
    ),
  }),
});
type OperationText = z.infer<typeof OperationText>;
type LimitsText = OperationText['limits'];

const pairNumbers = ([a, b]: [string, string]): [number, number] => [numberFromText(a), numberFromText(b)];

/** Typed limits to the body's: blank = not set, an empty curve or band list = not set. */
function limitsFromText(l: LimitsText): OperationLimits {
  const bedVelocityMax = numberOrNull(l.bedVelocityMax);
  // Min depth is entered as draught plus under-keel clearance (docs/domain.md#tide); either blank = no min depth.
  const draught = numberOrNull(l.draught);
  const clearance = numberOrNull(l.clearance);
  const parts = draught !== null && clearance !== null ? { draught, clearance } : null;
  return {
    minDepth: parts ? parts.draught + parts.clearance : draught !== null || clearance !== null ? Number.NaN : null,
    minDepthParts: parts,
    maxDepth: numberOrNull(l.maxDepth),
    currentMax: numberOrNull(l.currentMax),
    tideWindow:
      l.tideReference === 'none'
        ? null
        : { reference: l.tideReference, before: numberFromText(l.tideBefore), after: numberFromText(l.tideAfter) },
    hsMax: numberOrNull(l.hsMax),
    hsTpCurve: l.hsTpCurve.length > 0 ? l.hsTpCurve.map(pairNumbers) : null,
    tpMin: numberOrNull(l.tpMin),
    tpMax: numberOrNull(l.tpMax),
    tpExcluded: l.tpExcluded.length > 0 ? l.tpExcluded.map(pairNumbers) : null,
    bedVelocityMax,
    bedVelocityMethod: bedVelocityMax !== null ? l.bedVelocityMethod : undefined,
    windMax: numberOrNull(l.windMax),
    // One Hs limit on a partition target (docs/domain.md#partitions); further ones kept as they were.
    hsTargets:
      l.targetKind === 'none'
        ? null
        : [
            {
              target: l.targetKind,
              max: numberFromText(l.targetMax),
              minPeriodS: l.targetKind === 'longPeriod' ? numberFromText(l.targetMinPeriod) : null,
            },
          ],
    // Vessel response limits (docs/domain.md#vessel-response): a blank duration takes the engine's 3 h.
    responses:
      l.responses.length > 0
        ? l.responses.map((r) => ({
            response: r.response,
            statistic: r.statistic,
            durationH: r.statistic === 'mpm' ? numberOrNull(r.durationH ?? '') : null,
            max: numberFromText(r.max),
          }))
        : null,
  };
}

/**
 * Text to the request body, then the shared {@link OperationInput} schema (limits with
 * `operationLimitsSchema`, TPOP ≤ 72 h and TR ≤ 96 h for weather-restricted operations): the server's checks and
 * words, on the same field paths.
 */
const OperationFormSchema = OperationText.transform((v): OperationFormValues => ({
  name: v.name,
  description: v.description,
  tpop: numberFromText(v.tpop),
  tc: numberFromText(v.tc),
  weatherRestricted: v.weatherRestricted,
  siteIds: v.siteIds,
  skipperIds: v.skipperIds,
  vesselId: v.vesselId === '' ? null : v.vesselId,
  heading: numberOrNull(v.heading),
  limits: limitsFromText(v.limits),
})).pipe(OperationInput);

const pairText2 = ([a, b]: [number, number]): [string, string] => [textFromNumber(a), textFromNumber(b)];

function initialValues(op: OperationResponse | null): OperationText {
  const l = op?.limits ?? {};
  return {
    name: op?.name ?? '',
    description: op?.description ?? '',
    tpop: textFromNumber(op?.tpop),
    tc: textFromNumber(op?.tc),
    weatherRestricted: op?.weatherRestricted ?? true,
    siteIds: op?.siteIds ?? [],
    skipperIds: op?.skipperIds ?? [],
    vesselId: op?.vesselId ?? '',
    heading: textFromNumber(op?.heading),
    limits: {
      hsMax: textFromNumber(l.hsMax),
      hsTpCurve: (l.hsTpCurve ?? []).map(pairText2),
      tpMin: textFromNumber(l.tpMin),
      tpMax: textFromNumber(l.tpMax),
      tpExcluded: (l.tpExcluded ?? []).map(pairText2),
      bedVelocityMax: textFromNumber(l.bedVelocityMax),
      bedVelocityMethod: l.bedVelocityMethod ?? 'linear',
      windMax: textFromNumber(l.windMax),
      draught: textFromNumber(l.minDepthParts?.draught ?? l.minDepth),
      clearance: textFromNumber(l.minDepthParts?.clearance ?? (l.minDepth != null ? 0 : null)),
      maxDepth: textFromNumber(l.maxDepth),
      currentMax: textFromNumber(l.currentMax),
      tideReference: l.tideWindow?.reference ?? 'none',
      tideBefore: textFromNumber(l.tideWindow?.before),
      tideAfter: textFromNumber(l.tideWindow?.after),
      targetKind: l.hsTargets?.[0]?.target ?? 'none',
      targetMax: textFromNumber(l.hsTargets?.[0]?.max),
      targetMinPeriod: textFromNumber(l.hsTargets?.[0]?.minPeriodS),
      responses: (l.responses ?? []).map((r) => ({
        response: r.response,
        statistic: r.statistic,
        durationH: r.statistic === 'mpm' ? textFromNumber(r.durationH ?? DEFAULT_MPM_DURATION_H) : '',
        max: textFromNumber(r.max),
      })),
    },
  };
}

const R = LIMIT_RANGES;

type DecimalName =
  | 'tpop'
  | 'tc'
  | 'heading'
  | `limits.${'hsMax' | 'targetMax' | 'targetMinPeriod' | 'tpMin' | 'tpMax' | 'bedVelocityMax' | 'windMax'}`
  | `limits.${'draught' | 'clearance' | 'maxDepth' | 'currentMax' | 'tideBefore' | 'tideAfter'}`;

/**
 * The form's decimal fields: id, label, unit and hint, and the body paths whose error they show
 * where those are not the field's own name (the first error found is shown).
 */
const DECIMAL_FIELDS: Record<DecimalName, Omit<DecimalSpec<DecimalName>, 'name'> & { errorPaths?: readonly string[] }> = {
  tpop: {
    id: 'tpop',
    label: 'Planned duration TPOP',
    unit: 'h',
    hint: `Time the operation takes in workable weather, ${rangeHint(R.tpopH, 'h')}.`,
  },
  tc: { id: 'tc', label: 'Contingency TC', unit: 'h', hint: `Allowance for delays and uncertainty in TPOP, ${rangeHint(R.tcH, 'h')}.` },
  'limits.hsMax': { id: 'hsmax', label: 'Hs max', unit: 'm', hint: `Significant wave height at the worksite, ${rangeHint(R.hsM, 'm')}.` },
  'limits.targetMax': { id: 'hstargetmax', label: 'Hs max (target)', unit: 'm', errorPaths: ['limits.hsTargets.0.max'] },
  'limits.targetMinPeriod': { id: 'hstargett', label: 'T*', unit: 's', errorPaths: ['limits.hsTargets.0.minPeriodS'] },
  'limits.tpMin': { id: 'tpmin', label: 'Tp min', unit: 's', hint: `Peak period, ${rangeHint(R.tpS, 's')}.` },
  'limits.tpMax': { id: 'tpmax', label: 'Tp max', unit: 's', hint: `Peak period, ${rangeHint(R.tpS, 's')}.` },
  'limits.bedVelocityMax': {
    id: 'ub',
    label: 'Near-bed orbital velocity max',
    unit: 'm/s',
    hint: `Significant amplitude at the seabed, ${rangeHint(R.bedVelocityMps, 'm/s')}.`,
  },
  'limits.windMax': { id: 'wind', label: 'Wind max', unit: 'm/s', hint: `Mean wind speed at 10 m, ${rangeHint(R.windMps, 'm/s')}.` },
  heading: {
    id: 'heading',
    label: 'Vessel heading',
    unit: 'deg true',
    hint: "The fixed heading the vessel keeps, 0–360° true; each hour the sea's direction relative to it picks the RAO.",
  },
  'limits.draught': {
    id: 'draught',
    label: 'Draught',
    unit: 'm',
    hint: 'Min depth = draught + under-keel clearance.',
    errorPaths: ['limits.minDepthParts.draught', 'limits.minDepth'],
  },
  'limits.clearance': { id: 'ukc', label: 'Under-keel clearance', unit: 'm', errorPaths: ['limits.minDepthParts.clearance'] },
  'limits.maxDepth': { id: 'maxdepth', label: 'Max depth', unit: 'm', hint: `Still-water depth, ${rangeHint(R.depthM, 'm')}.` },
  'limits.currentMax': {
    id: 'current',
    label: 'Current max',
    unit: 'm/s',
    hint: `Current speed, ${rangeHint(R.currentMps, 'm/s')}: the dataset’s current, else the worksite’s predicted tidal current (no data without either).`,
  },
  'limits.tideBefore': {
    id: 'tidebefore',
    label: 'Hours before',
    unit: 'h',
    hint: rangeHint(R.tideWindowH, 'h'),
    errorPaths: ['limits.tideWindow.before'],
  },
  'limits.tideAfter': {
    id: 'tideafter',
    label: 'Hours after',
    unit: 'h',
    hint: rangeHint(R.tideWindowH, 'h'),
    errorPaths: ['limits.tideWindow.after'],
  },
};

/** Add or edit an operation with its limits. `op` null adds one. */
export function OperationForm({
  projectId,
  op,
  sites,
  alphaTable,
  onDone,
}: {
  projectId: string;
  op: OperationResponse | null;
  sites: SiteResponse[];
  alphaTable: AlphaTable | undefined;
  onDone: (saved: OperationResponse | null) => void;
}) {
  const id = useId();
  const create = useCreateOperation(projectId);
  const update = useUpdateOperation(projectId);
  const mutation = op ? update : create;
  const form = useForm<z.input<typeof OperationFormSchema>, unknown, z.output<typeof OperationFormSchema>>({
    resolver: blankAware(zodResolver(OperationFormSchema)),
    defaultValues: initialValues(op),
  });
  const errors = form.formState.errors;
  const [tpopText, tcText, weatherRestricted, siteIds, limitsText, skipperIds] = useWatch({
    control: form.control,
    name: ['tpop', 'tc', 'weatherRestricted', 'siteIds', 'limits', 'skipperIds'],
  });
  const members = useMembers(projectId).data;
  const vesselsQuery = useVessels(projectId);
  const vessels = vesselsQuery.data ?? [];
  const responseRows = useFieldArray({ control: form.control, name: 'limits.responses' });
  const [vesselIdText] = useWatch({ control: form.control, name: ['vesselId'] });
  const vessel = vessels.find((v) => v.id === vesselIdText);
  const vesselResponses = vessel?.responses ?? [];
  const skippers = (members ?? []).filter((m) => m.role === 'skipper');
  const setSkipperIds = (next: string[]) => form.setValue('skipperIds', next, { shouldDirty: true, shouldValidate: revalidate });
  const revalidate = form.formState.isSubmitted;

  const setSiteIds = (next: string[]) => form.setValue('siteIds', next, { shouldDirty: true, shouldValidate: revalidate });

  const onSubmit = form.handleSubmit((parsed) => {
    // The spectrum settings of the response limits are not edited here: kept as they were.
    const responseSea = op?.limits.responseSea;
    const input = responseSea ? { ...parsed, limits: { ...parsed.limits, responseSea } } : parsed;
    const done = {
      onSuccess: (saved: OperationResponse) => onDone(saved),
      onError: (e: unknown) => applyServerErrors(e, form.setError),
    };
    if (op) {
      // Without the members list (it is for coordinators) skipper assignments are left as they are.
      const { skipperIds, ...rest } = input;
      update.mutate({ operationId: op.id, patch: members ? { ...rest, skipperIds } : rest }, done);
    } else {
      create.mutate(input, done);
    }
  });

  // Live figures: TR, alpha and the plot follow the inputs as typed.
  const tpop = numberFromText(tpopText);
  const tc = numberFromText(tcText);
  const tr = tpop + tc;
  const trKnown = Number.isFinite(tr);
  const liveLimits = limitsFromText(limitsText);
  const alphaApplies =
    weatherRestricted &&
    trKnown &&
    tpop >= 0 &&
    tr >= 0 &&
    tpop <= WEATHER_RESTRICTED_MAX_TPOP_H &&
    tr <= WEATHER_RESTRICTED_MAX_TR_H &&
    alphaTable !== undefined;
  const alphaAt = alphaApplies
    ? (hsM: number) => {
        try {
          return alphaFor(alphaTable, tpop, hsM, tr, true);
        } catch {
          return 1;
        }
      }
    : null;
  const hsMaxLive = liveLimits.hsMax;

  const f = (name: string) => `${id}-${name}`;
  const err = (path: string) => errorAt(errors as FieldErrors, path);
  const pairList = (key: 'hsTpCurve' | 'tpExcluded'): PairListEditorProps => ({
    value: limitsText[key],
    onChange: (next) => form.setValue(`limits.${key}`, next, { shouldDirty: true, shouldValidate: revalidate }),
    errorOf: (suffix) => err(`limits.${key}${suffix}`),
  });
  const decimal = (name: DecimalName, disabled?: boolean) => {
    const { errorPaths = [name], ...spec } = DECIMAL_FIELDS[name];
    const error = errorPaths.map(err).find(Boolean);
    return <DecimalField {...spec} id={f(spec.id)} error={error} registration={form.register(name)} disabled={disabled} />;
  };

  return (
    <EditForm thing="operation" editing={op?.name} onSubmit={onSubmit} mutation={mutation} onCancel={() => onDone(null)}>
      <div className="grid gap-4 sm:grid-cols-2">
        <NameField id={f('name')} error={errors.name?.message} registration={form.register('name')} />
        <FieldShell
          label="Description"
          htmlFor={f('desc')}
          error={withSubject('Description', errors.description?.message)}
          hint="Optional: vessel, method, what limits it."
        >
          <TextArea id={f('desc')} rows={2} {...form.register('description')} invalid={!!errors.description} />
        </FieldShell>
      </div>

      <FormSection id={f('time')} title="Duration">
        <div className="grid gap-4 sm:grid-cols-3">
          {decimal('tpop')}
          {decimal('tc')}
          <div className="flex flex-col gap-1">
            <span className="text-sm font-semibold">
              Reference period TR <span className="font-normal text-ink-soft">(h)</span>
            </span>
            <output
              htmlFor={`${f('tpop')} ${f('tc')}`}
              className="flex min-h-11 items-center rounded-lg border border-dashed border-line bg-surface-2 px-3 text-base tabular-nums"
              aria-live="polite"
            >
              {trKnown ? `${fmt(tpop)} + ${fmt(tc)} = ${fmt(tr)} h` : 'TPOP + TC'}
            </output>
            <p className="text-xs text-ink-soft">A go-start needs TR of workable weather in a row.</p>
          </div>
        </div>
        {Number.isFinite(tc) && tc === 0 ? (
          <p
            role="status"
            className="rounded-lg border border-st-marginal bg-surface-2 px-3 py-2 text-sm font-semibold"
            data-testid="tc-zero-warning"
          >
            Warning: TC is 0 h, no contingency. Any delay or error in TPOP runs the operation past the forecast window it was started in.
          </p>
        ) : null}
        <div className="flex flex-col gap-1">
          <label className="flex min-h-11 items-center gap-3 text-sm font-semibold">
            <input type="checkbox" className="size-5 accent-[var(--color-accent)]" {...form.register('weatherRestricted')} />
            Weather-restricted operation
          </label>
          {errors.weatherRestricted?.message ? (
            <p role="alert" className="text-sm text-danger">
              {errors.weatherRestricted.message}
            </p>
          ) : null}
          <p className="text-xs text-ink-soft">
            Planned on a weather forecast, so the Hs limits are reduced to the forecast limit OPWF = α·OPLIM, α from the project’s alpha
            table by TPOP and Hs limit. Only for TPOP up to {WEATHER_RESTRICTED_MAX_TPOP_H} h and TR up to {WEATHER_RESTRICTED_MAX_TR_H} h
            (DNV-ST-N001, from memory). An operation that is not weather-restricted is designed for statistical extremes or split into
            sub-operations with safe points: the watch board shows its hours against OPLIM for information only, never a go-start, window or
            “may start now”.
          </p>
          {weatherRestricted && Number.isFinite(tpop) && tpop > WEATHER_RESTRICTED_MAX_TPOP_H ? (
            <p className="text-sm font-semibold text-danger">
              TPOP is {fmt(tpop)} h, above {WEATHER_RESTRICTED_MAX_TPOP_H} h: split it at safe points, or untick weather-restricted.
            </p>
          ) : weatherRestricted && trKnown && tr > WEATHER_RESTRICTED_MAX_TR_H ? (
            <p className="text-sm font-semibold text-danger">
              TR is {fmt(tr)} h, above {WEATHER_RESTRICTED_MAX_TR_H} h: shorten TPOP or TC, or untick weather-restricted.
            </p>
          ) : null}
          {alphaAt && hsMaxLive !== null && hsMaxLive !== undefined && Number.isFinite(hsMaxLive) ? (
            <p className="text-sm" aria-live="polite">
              With this TPOP, Hs max {fmt(hsMaxLive)} m becomes a forecast limit of {fmt(alphaAt(hsMaxLive), 3)} × {fmt(hsMaxLive)} ={' '}
              <span className="font-semibold">{fmt(alphaAt(hsMaxLive) * hsMaxLive)} m</span>.
            </p>
          ) : null}
        </div>
      </FormSection>

      <FormSection
        id={f('sites')}
        title="Worksites"
        hint="Tick where the operation happens; none ticked means every worksite of the project."
        error={err('siteIds')}
      >
        {sites.length === 0 ? (
          <p className="text-sm text-ink-soft">No worksites yet: the operation will apply to every worksite added later.</p>
        ) : (
          <TickList items={sites} idOf={(s) => s.id} chosen={siteIds} onChange={setSiteIds}>
            {(s) => (
              <>
                {s.name} <span className="text-ink-soft">({fmt(s.depth)} m)</span>
              </>
            )}
          </TickList>
        )}
      </FormSection>

      <FormSection
        id={f('skippers')}
        title="Skippers"
        hint="Assigned skippers hear about this operation's windows by default (they can change that on the Alerts page)."
        error={err('skipperIds')}
      >
        {skippers.length === 0 ? (
          <p className="text-sm text-ink-soft">
            No skippers in this project yet: an administrator adds people on the People &amp; access page.
          </p>
        ) : (
          <TickList items={skippers} idOf={(m) => m.userId} chosen={skipperIds} onChange={setSkipperIds}>
            {(m) => (
              <>
                {m.name} <span className="text-ink-soft">({m.email})</span>
              </>
            )}
          </TickList>
        )}
      </FormSection>

      <FormSection
        id={f('limits')}
        title="Limits (OPLIM)"
        hint="Set at least one. Limits are inclusive: a value equal to a maximum or minimum meets it."
        error={err('limits')}
      >
        <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
          <div className="flex min-w-0 flex-col gap-4">
            {decimal('limits.hsMax')}
            <FieldShell
              label="Hs max on"
              htmlFor={f('hstarget')}
              error={err('limits.hsTargets')}
              hint="A second Hs limit on part of the sea, where the data give wind sea and swell: all swell, the wind sea, the long-period sea (Tp at least T*), or the total."
            >
              <Select id={f('hstarget')} {...form.register('limits.targetKind')}>
                <option value="none">No partition limit</option>
                <PlainOptions values={HS_TARGETS} labels={HS_TARGET_LABELS} />
              </Select>
            </FieldShell>
            {limitsText.targetKind !== 'none' ? (
              <div className="grid gap-4 sm:grid-cols-2">
                {decimal('limits.targetMax')}
                {limitsText.targetKind === 'longPeriod' ? decimal('limits.targetMinPeriod') : null}
              </div>
            ) : null}
            <CurveEditor {...pairList('hsTpCurve')} />
          </div>
          <HsTpPlot
            limits={{
              hsMax: liveLimits.hsMax ?? null,
              curve: liveLimits.hsTpCurve ?? [],
              tpMin: liveLimits.tpMin ?? null,
              tpMax: liveLimits.tpMax ?? null,
              bands: liveLimits.tpExcluded ?? [],
            }}
            alphaAt={alphaAt}
          />
        </div>
        <div className="grid gap-4 sm:grid-cols-2">
          {decimal('limits.tpMin')}
          {decimal('limits.tpMax')}
        </div>
        <BandsEditor {...pairList('tpExcluded')} />
        <div className="grid gap-4 sm:grid-cols-3">
          {decimal('limits.bedVelocityMax')}
          <FieldShell
            label="Bed velocity method"
            htmlFor={f('ubm')}
            error={err('limits.bedVelocityMethod')}
            hint="Linear: π·Hs/(Tp·sinh(k·d)) at Tp. Soulsby (2006): from Tz over a JONSWAP-type spectrum."
          >
            <Select id={f('ubm')} {...form.register('limits.bedVelocityMethod')}>
              <PlainOptions values={BED_VELOCITY_METHODS} labels={BED_VELOCITY_METHOD_LABEL} />
            </Select>
          </FieldShell>
          {decimal('limits.windMax')}
        </div>
      </FormSection>

      <FormSection
        id={f('vessel')}
        title="Vessel response"
        hint="Limits on what the vessel does (roll, heave, pitch, a point's motion), from its RAO table and each hour's sea at the worksite, partition by partition. Alpha applies through the equivalent Hs limit. Vessels and their RAO tables are on the Vessels page."
      >
        {vesselsQuery.isPending ? (
          <Spinner label="Loading the project’s vessels" />
        ) : (
          <>
            <div className="grid gap-4 sm:grid-cols-2">
              <FieldShell
                label="Vessel"
                htmlFor={f('vessel-id')}
                error={err('vesselId')}
                hint={vessels.length === 0 ? 'No vessels in this project yet.' : 'The vessel the operation is done from, or none.'}
              >
                <Select id={f('vessel-id')} {...form.register('vesselId')} invalid={!!err('vesselId')}>
                  <option value="">No vessel</option>
                  {vessels.map((v) => (
                    <option key={v.id} value={v.id}>
                      {v.name}
                      {v.responses.length === 0 ? ' (no RAO table yet)' : ''}
                    </option>
                  ))}
                  {vesselIdText && !vessel ? <option value={vesselIdText}>Vessel not found</option> : null}
                </Select>
              </FieldShell>
              {decimal('heading')}
            </div>
            {err('limits.responses') ? (
              <p role="alert" className="text-sm font-semibold text-danger">
                {err('limits.responses')}
              </p>
            ) : null}
            <ol className="flex flex-col gap-3" aria-label="Response limits">
              {responseRows.fields.map((row, i) => {
                const current = limitsText.responses[i];
                const unit = current ? responseUnit(current.response) : '';
                const choices =
                  current && current.response && !vesselResponses.includes(current.response)
                    ? [current.response, ...vesselResponses]
                    : vesselResponses;
                const p = `limits.responses.${i}`;
                return (
                  <li key={row.id}>
                    <fieldset className="rounded-lg border border-line p-3" data-testid="response-limit">
                      <legend className="px-1 text-sm font-semibold">Response limit {i + 1}</legend>
                      <div className="grid gap-3 sm:grid-cols-[2fr_2fr_1fr_1fr_auto] sm:items-start">
                        <FieldShell label="Response" htmlFor={f(`resp-${i}`)} error={err(`${p}.response`)}>
                          <Select id={f(`resp-${i}`)} {...form.register(`limits.responses.${i}.response`)} invalid={!!err(`${p}.response`)}>
                            {choices.length === 0 ? <option value="">Choose a vessel with an RAO table first</option> : null}
                            {choices.map((c) => (
                              <option key={c} value={c}>
                                {responseLabel(c)}
                                {vesselResponses.includes(c) ? '' : ' (not in the vessel’s RAO table)'}
                              </option>
                            ))}
                          </Select>
                        </FieldShell>
                        <FieldShell label="Statistic" htmlFor={f(`stat-${i}`)} error={err(`${p}.statistic`)}>
                          <Select id={f(`stat-${i}`)} {...form.register(`limits.responses.${i}.statistic`)}>
                            <option value="significant">Significant amplitude R_s</option>
                            <option value="mpm">Most probable maximum R_mpm</option>
                          </Select>
                        </FieldShell>
                        <DecimalField
                          id={f(`dur-${i}`)}
                          label="Duration"
                          unit="h"
                          hint={current?.statistic === 'mpm' ? `Blank: ${DEFAULT_MPM_DURATION_H} h.` : 'For R_mpm only.'}
                          error={err(`${p}.durationH`)}
                          registration={form.register(`limits.responses.${i}.durationH`)}
                          disabled={current?.statistic !== 'mpm'}
                        />
                        <DecimalField
                          id={f(`max-${i}`)}
                          label="Max"
                          unit={unit || undefined}
                          error={err(`${p}.max`)}
                          registration={form.register(`limits.responses.${i}.max`)}
                        />
                        <Button
                          variant="ghost"
                          className="sm:mt-6"
                          onClick={() => responseRows.remove(i)}
                          aria-label={`Remove response limit ${i + 1}`}
                        >
                          Remove
                        </Button>
                      </div>
                    </fieldset>
                  </li>
                );
              })}
            </ol>
            <div>
              <Button
                variant="secondary"
                disabled={vesselResponses.length === 0}
                onClick={() =>
                  responseRows.append({
                    response: vesselResponses[0] ?? '',
                    statistic: 'mpm',
                    durationH: String(DEFAULT_MPM_DURATION_H),
                    max: '',
                  })
                }
              >
                Add a response limit
              </Button>
              {vesselResponses.length === 0 ? (
                <p className="mt-1 text-xs text-ink-soft">Choose a vessel with an RAO table to add limits on its responses.</p>
              ) : null}
            </div>
          </>
        )}
      </FormSection>

      <FormSection
        id={f('tide')}
        title="Water depth, current and tide (exact limits)"
        hint="Checked against the still-water depth h = chart depth + water level, the current and the predicted high and low waters of the worksite's tide. Alpha never applies; without a tide a tide window finds no data."
      >
        <div className="grid gap-4 sm:grid-cols-4">
          {decimal('limits.draught')}
          {decimal('limits.clearance')}
          {decimal('limits.maxDepth')}
          {decimal('limits.currentMax')}
        </div>
        <div className="grid gap-4 sm:grid-cols-3">
          <FieldShell label="Tide window around" htmlFor={f('tideref')} error={err('limits.tideWindow')}>
            <Select id={f('tideref')} {...form.register('limits.tideReference')}>
              <option value="none">No tide window</option>
              <option value="high">High water</option>
              <option value="low">Low water</option>
            </Select>
          </FieldShell>
          {decimal('limits.tideBefore', limitsText.tideReference === 'none')}
          {decimal('limits.tideAfter', limitsText.tideReference === 'none')}
        </div>
      </FormSection>
    </EditForm>
  );
}
