import { useEffect, useMemo, useState } from 'react';
import type { FieldErrors } from 'react-hook-form';
import { z } from 'zod';
import { TIDE_PREVIEW_DAYS, TIDE_SOURCES, WorksiteTideInput, type TidePreviewInput } from '../../../../shared/schemas/sites';
import { TideCurve } from '../../../components/tide/tide-curve';
import { Button, ErrorNotice, FieldShell, Input, Select } from '../../../components/ui';
import { useTidePreview } from '../api/tide-preview';
import { useTideStations } from '../api/tide-stations';
import { CellInput, errorAt, GridErrors } from './form-bits';
import { numberFromText, textFromNumber } from './number-text';
import { StationFieldset, StationRadio } from './station-choice';

/** The tide section as typed: the request body's field names, numbers as text. */
export const TideText = z.object({
  source: z.enum(TIDE_SOURCES),
  stationId: z.string(),
  constituents: z.array(z.object({ name: z.string(), amplitude: z.string(), phase: z.string() })),
  z0: z.string(),
  datum: z.string(),
});
export type TideText = z.infer<typeof TideText>;

/** A worksite's tide as the form starts it (none: an empty M2 row waits for constants). */
export function tideToText(tide: WorksiteTideInput | null | undefined): TideText {
  return {
    source: tide?.source ?? 'none',
    stationId: tide?.stationId ?? '',
    constituents:
      tide?.constituents && tide.constituents.length > 0
        ? tide.constituents.map((c) => ({ name: c.name, amplitude: textFromNumber(c.amplitude), phase: textFromNumber(c.phase) }))
        : [{ name: 'M2', amplitude: '', phase: '' }],
    z0: textFromNumber(tide?.z0),
    datum: tide?.datum ?? 'LAT',
  };
}

/** The typed tide as the request body's `tide` (null for none); the shared schema then checks it. */
export function tideFromText(t: TideText): z.input<typeof WorksiteTideInput> | null {
  if (t.source === 'none') return null;
  if (t.source === 'station') return { source: 'station', stationId: t.stationId, datum: t.datum };
  return {
    source: 'constants',
    constituents: t.constituents.map((c) => ({ name: c.name, amplitude: numberFromText(c.amplitude), phase: numberFromText(c.phase) })),
    z0: numberFromText(t.z0),
    datum: t.datum,
  };
}

type Constituent = TideText['constituents'][number];

/**
 * The columns of the constituents' table: heading, what the cell's label and error name it, and
 * for the name (text, where the others are numbers) the cell's own input mode and alignment.
 */
const CONSTITUENT_COLUMNS: {
  field: keyof Constituent;
  heading: string;
  label: string;
  where: string;
  cell?: { inputMode: 'text'; className: string };
}[] = [
  { field: 'name', heading: 'Name', label: 'name', where: 'name', cell: { inputMode: 'text', className: 'text-left' } },
  { field: 'amplitude', heading: 'Amplitude (m)', label: 'amplitude, m', where: 'amplitude' },
  { field: 'phase', heading: 'Phase lag (° UTC)', label: 'phase lag, degrees referred to UTC', where: 'phase lag' },
];

/** The value after it stopped changing for `ms`. */
function useSettled<T>(value: T, ms: number): T {
  const [settled, setSettled] = useState(value);
  useEffect(() => {
    const timer = setTimeout(() => setSettled(value), ms);
    return () => clearTimeout(timer);
  }, [value, ms]);
  return settled;
}

/**
 * The worksite form's tide (docs/domain.md#tide): none, a table of harmonic constants (name,
 * amplitude, phase lag referred to UTC) with Z0 and the chart datum, or the nearest station of the
 * public tide database (name, distance, datum, source and its warnings). Below it, the predicted
 * curve of the next 3 days with high and low waters at the worksite's local time (the zone typed
 * in this form), and the cautions.
 */
export function TideFields({
  projectId,
  idPrefix,
  value,
  onChange,
  errors,
  position,
  timeZone,
}: {
  projectId: string;
  idPrefix: string;
  value: TideText;
  onChange: (next: TideText) => void;
  errors: FieldErrors;
  position: { latitude: number; longitude: number } | null;
  timeZone: string;
}) {
  const set = (patch: Partial<TideText>) => onChange({ ...value, ...patch });
  const rows = value.constituents;
  const setRow = (i: number, patch: Partial<Constituent>) => set({ constituents: rows.map((r, k) => (k === i ? { ...r, ...patch } : r)) });
  const cellError = (i: number, field: keyof Constituent) => errorAt(errors, `tide.constituents.${i}.${field}`);
  const rowErrors = rows.flatMap((_, i) =>
    CONSTITUENT_COLUMNS.flatMap(({ field, where }) => {
      const message = cellError(i, field);
      return message ? [{ where: `Row ${i + 1}, ${where}`, message }] : [];
    }),
  );

  // The preview follows what is typed once it is a complete tide (the same schema as the server).
  const body = tideFromText(value);
  const parsed = body ? WorksiteTideInput.safeParse(body) : null;
  // A string is a stable identity for the settle timer; it is read back once it stops changing.
  const previewKey = parsed?.success
    ? JSON.stringify({ tide: parsed.data, latitude: position?.latitude ?? null, longitude: position?.longitude ?? null })
    : '';
  const settledKey = useSettled(previewKey, 400);
  const settled = useMemo(() => (settledKey ? (JSON.parse(settledKey) as TidePreviewInput) : null), [settledKey]);
  const preview = useTidePreview(projectId, settled);
  const stations = useTideStations(projectId, value.source === 'station' ? position : null);
  const zoneValid = useMemo(() => {
    try {
      new Intl.DateTimeFormat('en', { timeZone });
      return true;
    } catch {
      return false;
    }
  }, [timeZone]);

  return (
    <div className="flex flex-col gap-3">
      <div className="grid gap-4 sm:grid-cols-2">
        <FieldShell label="Tide from" htmlFor={`${idPrefix}-tide-source`} error={errorAt(errors, 'tide.source')}>
          <Select
            id={`${idPrefix}-tide-source`}
            value={value.source}
            onChange={(e) => set({ source: e.target.value as TideText['source'] })}
          >
            <option value="none">No tide: the depth stays the chart depth</option>
            <option value="constants">Harmonic constants I enter</option>
            <option value="station">The nearest station of the public tide database</option>
          </Select>
        </FieldShell>
        {value.source !== 'none' ? (
          <FieldShell
            label="Chart datum of the worksite depth"
            htmlFor={`${idPrefix}-tide-datum`}
            error={errorAt(errors, 'tide.datum')}
            hint="LAT, MLLW or the chart’s own. The depth above must be referred to it (the app cannot check that)."
          >
            <Input id={`${idPrefix}-tide-datum`} value={value.datum} onChange={(e) => set({ datum: e.target.value })} autoComplete="off" />
          </FieldShell>
        ) : null}
      </div>

      {value.source === 'constants' ? (
        <div className="flex flex-col gap-2">
          <table className="w-fit text-sm" aria-label="Tide constituents">
            <thead>
              <tr className="text-left text-ink-soft">
                {CONSTITUENT_COLUMNS.map((c) => (
                  <th key={c.field} className="pr-2 font-semibold">
                    {c.heading}
                  </th>
                ))}
                <th />
              </tr>
            </thead>
            <tbody>
              {rows.map((r, i) => (
                <tr key={i}>
                  {CONSTITUENT_COLUMNS.map(({ field, label, cell }) => (
                    <td key={field} className="pr-2 py-0.5">
                      <CellInput
                        label={`Constituent ${i + 1} ${label}`}
                        {...cell}
                        value={r[field]}
                        onValue={(text) => setRow(i, { [field]: text })}
                        error={cellError(i, field)}
                      />
                    </td>
                  ))}
                  <td>
                    <Button
                      variant="secondary"
                      aria-label={`Remove constituent ${i + 1}`}
                      disabled={rows.length === 1}
                      onClick={() => set({ constituents: rows.filter((_, k) => k !== i) })}
                    >
                      Remove
                    </Button>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
          <GridErrors messages={rowErrors} />
          {errorAt(errors, 'tide.constituents') ? (
            <p role="alert" className="text-sm text-danger">
              {errorAt(errors, 'tide.constituents')}
            </p>
          ) : null}
          <Button
            variant="secondary"
            className="self-start"
            onClick={() => set({ constituents: [...rows, { name: '', amplitude: '', phase: '' }] })}
          >
            Add a constituent
          </Button>
          <div className="max-w-xs">
            <FieldShell
              label="Z0, mean sea level above chart datum"
              unit="m"
              htmlFor={`${idPrefix}-tide-z0`}
              error={errorAt(errors, 'tide.z0')}
            >
              <Input
                id={`${idPrefix}-tide-z0`}
                inputMode="decimal"
                value={value.z0}
                onChange={(e) => set({ z0: e.target.value })}
                invalid={!!errorAt(errors, 'tide.z0')}
              />
            </FieldShell>
          </div>
          <p className="text-xs text-ink-soft">
            Names as the tide package knows them (M2, S2, N2, K2, K1, O1, P1, Q1, M4, …); phase lags g referred to UTC (Greenwich), as
            published tables give them.
          </p>
        </div>
      ) : null}

      {value.source === 'station' ? (
        <StationChooser
          idPrefix={idPrefix}
          position={position}
          stations={stations}
          chosen={value.stationId}
          onChoose={(stationId) => set({ stationId })}
          error={errorAt(errors, 'tide.stationId')}
        />
      ) : null}

      {value.source !== 'none' ? (
        <section aria-label="Predicted tide, next 3 days" data-testid="tide-preview" className="rounded-md border border-line p-3">
          <h4 className="text-sm font-bold">
            Predicted tide, next {TIDE_PREVIEW_DAYS} days{' '}
            <span className="font-normal text-ink-soft">
              (m above {preview.data?.datum ?? value.datum}; times at this worksite’s local time)
            </span>
          </h4>
          {!settled ? (
            <p className="text-sm text-ink-soft">Complete the tide above to see its curve.</p>
          ) : preview.isError ? (
            <ErrorNotice error={preview.error} />
          ) : preview.data && zoneValid ? (
            <TideCurve answer={preview.data} zone={timeZone} label="Predicted water level at this worksite, next 3 days" />
          ) : (
            <p className="text-sm text-ink-soft">{zoneValid ? 'Predicting…' : 'Enter a valid time zone to see the times.'}</p>
          )}
        </section>
      ) : null}
    </div>
  );
}

function StationChooser({
  idPrefix,
  position,
  stations,
  chosen,
  onChoose,
  error,
}: {
  idPrefix: string;
  position: { latitude: number; longitude: number } | null;
  stations: ReturnType<typeof useTideStations>;
  chosen: string;
  onChoose: (id: string) => void;
  error: string | undefined;
}) {
  if (!position) return <p className="text-sm text-ink-soft">Enter the worksite’s latitude and longitude to find the nearest stations.</p>;
  if (stations.isError) return <ErrorNotice error={stations.error} />;
  const list = stations.data?.stations ?? [];
  return (
    <StationFieldset legend="Tide station" error={error}>
      {stations.isPending ? <p className="text-sm text-ink-soft">Looking for stations…</p> : null}
      {!stations.isPending && list.length === 0 ? (
        <p className="text-sm text-ink-soft">No station of the database within 200 km: enter harmonic constants instead.</p>
      ) : null}
      {list.map((s) => (
        <StationRadio key={s.id} group={`${idPrefix}-station`} id={s.id} chosen={chosen} onChoose={onChoose}>
          <span className="font-semibold">{s.name}</span>
          {s.distanceKm !== null ? `, ${s.distanceKm.toFixed(1)} km away` : ''} · datum {s.datum ?? 'not named'} · {s.source} ·{' '}
          {s.constituents} constituents{s.type === 'subordinate' ? ' · subordinate' : ''}
          {s.warnings.length > 0 ? <span className="block text-danger">{s.warnings.join(' ')}</span> : null}
        </StationRadio>
      ))}
    </StationFieldset>
  );
}
