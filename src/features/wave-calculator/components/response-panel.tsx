import { lazy, Suspense } from 'react';
import { RESPONSE_FORM_PARTITIONS, ResponseForm, type ResponseFormFields } from '../../../../shared/schemas/vessel';
import type { ProjectSummary } from '../../../../shared/api-types';
import { useProjects } from '../../../api/projects';
import { Card, ErrorNotice, FieldShell, Notice, Select, Spinner } from '../../../components/ui';
import { useVesselResponse, type VesselResponseAnswer } from '../api/get-vessel-response';
import { useVesselsOfProjects, type VesselSummary } from '../api/get-vessels';
import { formatSig } from '../utils/format-number';
import { useCalculator } from '../utils/use-calculator';
import { NumberField, NumberFields, type NumberFieldSpec } from './number-field';
import { FirstAnswerStatus, ResultStatus } from './result-status';
import { withSub } from './symbol';
import { HeadingRow } from '../../../components/ui/table';

// The chart library is large: it arrives in its own chunk when the first result is drawn.
const ResponseSpectraChart = lazy(() => import('./response-spectra-chart'));

export type ResponseFields = ResponseFormFields;

/** A 1.5 m wind sea over a 1 m, 12 s swell on the beam of a vessel heading north. */
export const DEFAULT_RESPONSE_FIELDS: ResponseFields = {
  projectId: '',
  vesselId: '',
  heading: '0',
  sea: 'total',
  hs: '2',
  tp: '9',
  dir: '90',
  windSeaHs: '1.5',
  windSeaTp: '6',
  windSeaDir: '60',
  swell1Hs: '1',
  swell1Tp: '12',
  swell1Dir: '90',
  swell2Hs: '',
  swell2Tp: '',
  swell2Dir: '',
};

const TOTAL_SEA_INPUTS: readonly NumberFieldSpec<keyof ResponseFields>[] = [
  { name: 'hs', id: 'rs-hs', label: 'Significant wave height Hs', unit: 'm', hint: '0 to 30 m' },
  { name: 'tp', id: 'rs-tp', label: 'Peak period Tp', unit: 's', hint: '1 to 40 s' },
  { name: 'dir', id: 'rs-dir', label: 'Wave direction', unit: '° from', hint: '0 to 360°' },
];

const withRaos = (vs: VesselSummary[]) => vs.filter((v) => v.responses.length > 0);

/**
 * Response mode (docs/domain.md#vessel-response): a vessel of one of the user's projects, its
 * heading and one sea state (total, or wind sea and up to two swells) give each response's
 * significant amplitude, most probable maximum over 3 h and zero-crossing period, and the spectra.
 */
export function ResponsePanel({ fields, onChange }: { fields: ResponseFields; onChange: (fields: ResponseFields) => void }) {
  const projects = useProjects();
  const list = useVesselsOfProjects(projects.data ?? []);
  if (projects.error) return <ErrorNotice error={projects.error} />;
  if (list.error) return <ErrorNotice error={list.error} />;
  if (projects.isPending || list.pending) return <Spinner label="Loading your projects and their vessels" />;
  const usable = list.byProject.filter((p) => withRaos(p.vessels).length > 0);
  if (usable.length === 0) {
    const anyVessel = list.byProject.some((p) => p.vessels.length > 0);
    return (
      <Notice>
        <span data-testid="response-no-vessel">
          {anyVessel
            ? 'None of the vessels in your projects has an RAO table yet, so there is nothing to compute. A coordinator imports the RAO table on the project’s vessel page.'
            : 'None of your projects has a vessel yet, so there is nothing to compute. A coordinator adds a vessel and imports its RAO table on the project’s vessel page.'}
        </span>
      </Notice>
    );
  }
  // Start on the first vessel with RAOs, or keep what was chosen before switching modes.
  const chosen = usable.find((p) => p.project.id === fields.projectId);
  const start: ResponseFields = chosen
    ? fields
    : { ...fields, projectId: usable[0].project.id, vesselId: withRaos(usable[0].vessels)[0].id };
  return <ResponseForm_ fields={start} onChange={onChange} usable={usable} />;
}

function ResponseForm_({
  fields,
  onChange,
  usable,
}: {
  fields: ResponseFields;
  onChange: (fields: ResponseFields) => void;
  usable: { project: ProjectSummary; vessels: VesselSummary[] }[];
}) {
  const { check, answer, errors, otherError, stale } = useCalculator(ResponseForm, fields, onChange, useVesselResponse);
  const v = check.values;
  const project = usable.find((p) => p.project.id === v.projectId) ?? usable[0];
  const vessels = project.vessels;
  const partitioned = v.sea === 'partitions';
  const a = answer.data;
  const projectReg = check.register('projectId');

  return (
    <div className="grid grid-cols-1 gap-4">
      <Card aria-labelledby="response-inputs-title">
        <h2 id="response-inputs-title" className="sr-only">
          Vessel and sea state
        </h2>
        <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
          <FieldShell label="Project" htmlFor="rs-project" error={errors.projectId}>
            <Select
              id="rs-project"
              {...projectReg}
              onChange={(e) => {
                void projectReg.onChange(e);
                const first = withRaos(usable.find((p) => p.project.id === e.target.value)?.vessels ?? [])[0];
                check.setValue('vesselId', first?.id ?? '');
              }}
            >
              {usable.map((p) => (
                <option key={p.project.id} value={p.project.id}>
                  {p.project.name}
                </option>
              ))}
            </Select>
          </FieldShell>
          <FieldShell label="Vessel" htmlFor="rs-vessel" error={errors.vesselId} hint="A vessel needs an RAO table to be chosen">
            <Select id="rs-vessel" {...check.register('vesselId')} invalid={!!errors.vesselId}>
              {vessels.map((x) => (
                <option key={x.id} value={x.id} disabled={x.responses.length === 0}>
                  {x.responses.length === 0 ? `${x.name} (no RAO table yet)` : x.name}
                </option>
              ))}
            </Select>
          </FieldShell>
          <NumberField
            id="rs-heading"
            label="Vessel heading"
            unit="° true"
            registration={check.register('heading')}
            error={errors.heading}
            hint="Where the bow points, 0 to 360°"
          />
        </div>
        <fieldset className="mt-4">
          <legend className="text-sm font-semibold">Sea state</legend>
          <div className="mt-1 flex flex-wrap gap-4">
            <label className="inline-flex min-h-11 items-center gap-2 text-sm">
              <input type="radio" value="total" {...check.register('sea')} className="size-5" />
              Total sea (one sea, treated as wind sea)
            </label>
            <label className="inline-flex min-h-11 items-center gap-2 text-sm">
              <input type="radio" value="partitions" {...check.register('sea')} className="size-5" />
              Partitions (wind sea and up to two swells)
            </label>
          </div>
          <p className="text-xs text-ink-soft">Directions are where the waves come from, in degrees true.</p>
        </fieldset>
        {partitioned ? (
          <div className="mt-3 grid gap-4">
            {RESPONSE_FORM_PARTITIONS.map((p) => (
              <fieldset key={p.key} className="grid gap-3 sm:grid-cols-3" data-testid={`rs-partition-${p.key}`}>
                <legend className="mb-1 text-sm font-semibold">
                  {p.label}
                  {p.key === 'windSea' ? null : <span className="ml-1 font-normal text-ink-soft">(leave blank when absent)</span>}
                </legend>
                {(
                  [
                    ['Hs', 'hs', 'Hs', 'm'],
                    ['Tp', 'tp', 'Tp', 's'],
                    ['Dir', 'dir', 'direction', '° from'],
                  ] as const
                ).map(([suffix, id, words, unit]) => (
                  <NumberField
                    key={suffix}
                    id={`rs-${p.key}-${id}`}
                    label={`${p.label} ${words}`}
                    unit={unit}
                    registration={check.register(`${p.key}${suffix}`)}
                    error={errors[`${p.key}${suffix}`]}
                  />
                ))}
              </fieldset>
            ))}
          </div>
        ) : (
          <NumberFields className="mt-3 grid gap-3 sm:grid-cols-3" fields={TOTAL_SEA_INPUTS} register={check.register} errors={errors} />
        )}
      </Card>

      <FirstAnswerStatus error={otherError} computing={!a && answer.isFetching} label="Computing the responses" />
      {a ? (
        <div className={`grid grid-cols-1 gap-4 ${stale && !check.typing ? 'opacity-80' : ''}`}>
          <Card aria-labelledby="response-results-title">
            <div className="mb-3 flex flex-wrap items-baseline justify-between gap-2">
              <h2 id="response-results-title" className="text-lg font-bold">
                Responses
              </h2>
              <ResultStatus
                updating={check.typing || answer.isFetching}
                lastValid={!check.data}
                caption={`${vessels.find((x) => x.id === a.vesselId)?.name ?? 'Vessel'} heading ${formatSig(a.heading, 4)}°`}
              />
            </div>
            <ResponseTable answer={a} />
            {a.responses.some((r) => r.warning) ? (
              <ul className="mt-3 grid gap-1 text-sm" data-testid="response-warnings">
                {a.responses
                  .filter((r) => r.warning)
                  .map((r) => (
                    <li key={r.response} className="border-l-4 border-st-marginal pl-3">
                      {r.label}: {r.warning}
                    </li>
                  ))}
              </ul>
            ) : null}
            <p className="mt-3 text-xs text-ink-soft">
              JONSWAP spectra per partition (γ by the DNV-RP-C205 rule for the wind sea, 5 for swell), cos-power spreading (n = 2 wind sea,
              8 swell), the vessel&apos;s RAOs at zero speed. R<sub>s</sub> = 2√m<sub>0</sub>; R<sub>mpm</sub> = √(2 m<sub>0</sub> ln(3 h /
              T<sub>z,R</sub>)). Linear response: decision support only; the master and the marine warranty surveyor decide.
            </p>
          </Card>
          <Card aria-labelledby="response-spectra-title">
            <Suspense fallback={<Spinner label="Drawing the spectra" />}>
              <ResponseSpectraChart answer={a} />
            </Suspense>
          </Card>
        </div>
      ) : null}
    </div>
  );
}

/** The figures of every response, one row each (the screen reader's view of the results as well). */
function ResponseTable({ answer }: { answer: VesselResponseAnswer }) {
  return (
    <div className="overflow-x-auto">
      <table className="w-full min-w-[32rem] text-sm" data-testid="response-table">
        <caption className="sr-only">
          Response of the vessel to the sea state: significant amplitude, most probable maximum over 3 hours and zero-crossing period
        </caption>
        <thead>
          <HeadingRow
            className="border-b border-line text-left"
            cellClassName="py-2 pr-3"
            right={[1, 2, 3]}
            headings={['Response', withSub('R', 's', ', significant'), withSub('R', 'mpm', ', 3 h'), withSub('T', 'z,R')]}
          />
        </thead>
        <tbody>
          {answer.responses.map((r) => (
            <tr key={r.response} className="border-b border-line" data-testid={`response-row-${r.response}`}>
              <th scope="row" className="py-2 pr-3 text-left font-semibold">
                {r.label}
              </th>
              <td className="py-2 pr-3 text-right tabular-nums">
                <span data-testid="response-significant">{formatSig(r.significant, 3, true)}</span> {r.unit}
              </td>
              <td className="py-2 pr-3 text-right tabular-nums">
                <span data-testid="response-mpm">{formatSig(r.mpm3h, 3, true)}</span> {r.unit}
              </td>
              <td className="py-2 pr-3 text-right tabular-nums" data-testid="response-tz">
                {r.tz === null ? 'no motion' : `${formatSig(r.tz, 3, true)} s`}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
