import { useState } from 'react';
import { TZDate } from '@date-fns/tz';
import type { CampaignResponse, CampaignSimulation } from '../../../../shared/api-types-downtime';
import type { OperationResponse, SiteResponse } from '../../../../shared/api-types-sites';
import { CAMPAIGN_MAX_STEPS, CampaignInput } from '../../../../shared/schemas/downtime';
import { Button, Card, Confirm, ErrorNotice, FieldShell, Input, Notice, SectionHeading, Select, Spinner } from '../../../components/ui';
import { NamedOptions, PlainOptions } from '../../../components/ui/field';
import { Term } from '../../../components/ui/term';
import { DateEcho } from '../../../components/ui/date-echo';
import { ApiError } from '../../../lib/api';
import { useCampaigns } from '../api/get-campaigns';
import { useCreateCampaign } from '../api/create-campaign';
import { useUpdateCampaign } from '../api/update-campaign';
import { useDeleteCampaign } from '../api/delete-campaign';
import { useSimulation } from '../api/simulate-campaign';
import { downloadCsv, slug, toCsv } from '../../../lib/csv';
import { dateIn, days, hours, MONTH_LONG } from './format';
import { HeadingRow } from '../../../components/ui/table';

const th = 'sticky top-0 bg-surface-2 px-2 py-2 text-xs font-semibold text-ink-soft';
const td = 'px-2 py-1 text-right tabular-nums whitespace-nowrap';

interface Props {
  projectId: string;
  canEdit: boolean;
  datasetId: string;
  alpha: boolean;
  operations: OperationResponse[];
  sites: SiteResponse[];
  selectedId: string;
  onSelect: (id: string) => void;
}

/**
 * Campaigns: pick one to see its simulated duration by start month (P50/P90 of duration and
 * waiting on weather, finish dates, censored years); coordinators create, edit (add, move, remove
 * steps) and delete campaigns.
 */
export function CampaignSection({ projectId, canEdit, datasetId, alpha, operations, sites, selectedId, onSelect }: Props) {
  const campaigns = useCampaigns(projectId);
  const [editing, setEditing] = useState<'new' | 'edit' | null>(null);
  const remove = useDeleteCampaign(projectId);
  const [askingDelete, setAskingDelete] = useState(false);
  const list = campaigns.data ?? [];
  const selected = list.find((c) => c.id === selectedId) ?? list[0];
  const simulation = useSimulation(projectId, selected && datasetId ? { campaignId: selected.id, datasetId, alpha } : null);
  const opName = new Map(operations.map((o) => [o.id, o.name]));
  const siteName = new Map(sites.map((s) => [s.id, s.name]));

  return (
    <Card className="flex flex-col gap-4" aria-labelledby="campaigns-title">
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <SectionHeading id="campaigns-title" title="Campaign duration" narrow>
            The steps run in order; each waits for its first go-start (TR wholly workable) and then takes its TPOP. Simulated from the 1st
            of each month in every hindcast year.
          </SectionHeading>
        </div>
        {canEdit && editing === null ? (
          <Button className="no-print" onClick={() => setEditing('new')}>
            New campaign
          </Button>
        ) : null}
      </div>
      {campaigns.error ? <ErrorNotice error={campaigns.error} /> : null}
      {campaigns.isPending ? <Spinner label="Loading campaigns" /> : null}

      {editing !== null && canEdit ? (
        <CampaignEditor
          key={editing === 'edit' ? selected?.id : 'new'}
          projectId={projectId}
          campaign={editing === 'edit' ? selected : undefined}
          operations={operations}
          sites={sites}
          onDone={(id) => {
            setEditing(null);
            if (id) onSelect(id);
          }}
        />
      ) : null}

      {!campaigns.isPending && list.length === 0 && editing === null ? (
        <Notice>
          {canEdit
            ? 'No campaign yet: create one from the operations and worksites of this project.'
            : 'No campaign has been planned for this project yet.'}
        </Notice>
      ) : null}

      {selected && editing === null ? (
        <div className="flex flex-col gap-3">
          <div className="flex flex-wrap items-end gap-2">
            <div className="min-w-60 flex-1 sm:max-w-md">
              <FieldShell label="Campaign" htmlFor="campaign-pick">
                <Select id="campaign-pick" value={selected.id} onChange={(e) => onSelect(e.target.value)}>
                  <NamedOptions items={list} />
                </Select>
              </FieldShell>
            </div>
            {canEdit ? (
              <div className="no-print flex gap-2">
                <Button variant="secondary" onClick={() => setEditing('edit')}>
                  Edit campaign
                </Button>
                <Button variant="ghost" disabled={remove.isPending || askingDelete} onClick={() => setAskingDelete(true)}>
                  Delete campaign
                </Button>
              </div>
            ) : null}
          </div>
          {askingDelete ? (
            <Confirm
              title={`Delete the campaign “${selected.name}”?`}
              confirmLabel="Delete campaign"
              busy={remove.isPending}
              onConfirm={() => {
                setAskingDelete(false);
                remove.mutate(selected.id, { onSuccess: () => onSelect('') });
              }}
              onCancel={() => setAskingDelete(false)}
            >
              Its steps, progress and stored outlooks go with it.
            </Confirm>
          ) : null}
          {remove.error ? <ErrorNotice error={remove.error} /> : null}
          <ol className="flex flex-col gap-1 text-sm" aria-label="Steps">
            {selected.steps.map((s, i) => (
              <li key={i} className="flex gap-2">
                <span className="inline-flex size-6 shrink-0 items-center justify-center rounded-full bg-surface-2 text-xs font-semibold">
                  {i + 1}
                </span>
                <span>
                  {opName.get(s.operationId) ?? 'Operation removed'}{' '}
                  <span className="text-ink-soft">at {siteName.get(s.siteId) ?? 'worksite removed'}</span>
                </span>
              </li>
            ))}
          </ol>
          <p className="text-xs text-ink-soft">
            Start dates: the 1st at 00:00
            {selected.plannedStart
              ? `, from the month of the planned start (${dateIn(selected.plannedStart, selected.timeZone)}) on, in that order`
              : ', the next ones from today, in that order'}
            .
          </p>
          {!datasetId ? <Notice>Simulations need a hindcast: a coordinator imports one under Sea data.</Notice> : null}
          {simulation.error ? <ErrorNotice error={simulation.error} /> : null}
          {datasetId && simulation.isPending ? <Spinner label="Running the campaign through every hindcast year" /> : null}
          {simulation.data ? <SimulationTable sim={simulation.data} campaign={selected} stale={simulation.isFetching} /> : null}
        </div>
      ) : null}
    </Card>
  );
}

/** P50/P90 of duration and waiting on weather, and finish dates, per start month. */
function SimulationTable({ sim, campaign, stale }: { sim: CampaignSimulation; campaign: CampaignResponse; stale: boolean }) {
  const zone = sim.timeZone;
  // In the order the starts come, from the planned start's month (the server answers by calendar month).
  const months = [...sim.months].sort((a, b) => Date.parse(a.startDate) - Date.parse(b.startDate));
  function download() {
    downloadCsv(
      `campaign-${slug(campaign.name)}.csv`,
      toCsv(
        [
          'campaign',
          'start_month',
          'start_date',
          'p50_duration_h',
          'p90_duration_h',
          'wow_p50_h',
          'wow_p90_h',
          'p50_finish',
          'p90_finish',
          'years',
          'censored_years',
          'alpha',
          'hindcast',
        ],
        months.map((m) => [
          campaign.name,
          m.startMonth,
          dateIn(m.startDate, zone, 'yyyy-MM-dd'),
          m.p50Hours,
          m.p90Hours,
          m.wowP50Hours,
          m.wowP90Hours,
          m.p50Finish ? dateIn(m.p50Finish, zone, 'yyyy-MM-dd') : null,
          m.p90Finish ? dateIn(m.p90Finish, zone, 'yyyy-MM-dd') : null,
          m.years,
          m.censoredYears.join(' '),
          sim.alpha ? 'on' : 'off',
          sim.dataset.name,
        ]),
      ),
    );
  }
  return (
    <div className={`flex flex-col gap-2 ${stale ? 'opacity-60' : ''}`}>
      <div className="flex flex-wrap items-end justify-between gap-2">
        <p className="text-sm text-ink-soft">
          Without waiting the campaign takes {hours(sim.sumTpopHours, 0)} ({days(sim.sumTpopHours)}). Durations in days (24 h).
        </p>
        <Button variant="secondary" className="no-print" onClick={download}>
          Download CSV
        </Button>
      </div>
      {sim.neverStarts ? (
        <Notice tone="error">
          <span data-testid="campaign-never-starts">{sim.neverStarts}</span>
        </Notice>
      ) : null}
      <div className="overflow-x-auto rounded-lg border border-line">
        <table className="w-full min-w-[52rem] text-sm" data-testid="campaign-table">
          <caption className="sr-only">Campaign duration and finish dates by start month, P50 and P90 over the hindcast years</caption>
          <thead>
            <HeadingRow
              cellClassName={th}
              right={[1, 2, 3, 4, 5, 6]}
              headings={[
                'Start',
                <Term k="p50p90">P50 duration</Term>,
                'P90 duration',
                <Term k="wow">WoW P50</Term>,
                <Term k="wow">WoW P90</Term>,
                'P50 finish',
                'P90 finish',
                <Term k="censoredYears" />,
              ]}
            />
          </thead>
          <tbody>
            {months.map((m) => (
              <tr key={m.startMonth} className="border-t border-line/60">
                <th scope="row" className="px-2 py-1 text-left font-normal whitespace-nowrap">
                  <span className="font-semibold">{MONTH_LONG[m.startMonth - 1]}</span>{' '}
                  <span className="text-ink-soft">{dateIn(m.startDate, zone)}</span>
                </th>
                <td className={`${td} font-semibold`}>
                  {days(m.p50Hours)}
                  {m.p50Hours !== null ? (
                    <span
                      className={`block text-xs font-normal ${m.years - m.censoredYears.length < 3 ? 'font-semibold text-danger' : 'text-ink-soft'}`}
                    >
                      from {m.years - m.censoredYears.length} yr
                      {m.years - m.censoredYears.length === 1 ? ': P50 = P90' : m.years - m.censoredYears.length < 3 ? ': thin' : ''}
                    </span>
                  ) : null}
                </td>
                <td className={td}>{days(m.p90Hours)}</td>
                <td className={td}>{days(m.wowP50Hours)}</td>
                <td className={td}>{days(m.wowP90Hours)}</td>
                <td className={td}>{dateIn(m.p50Finish, zone)}</td>
                <td className={td}>{dateIn(m.p90Finish, zone)}</td>
                <td className="px-2 py-1 text-left text-xs">
                  {m.censoredYears.length === 0 ? (
                    <span className="text-ink-soft">none of {m.years}</span>
                  ) : (
                    <span>
                      {m.censoredYears.length} of {m.years}: {m.censoredYears.join(', ')}
                      {m.stuckSteps.map((st) => (
                        <span key={st.step} className="block text-ink-soft">
                          {st.years === m.censoredYears.length ? 'all' : st.years} stopped at step {st.step + 1} (
                          {sim.steps[st.step]?.operationName} at {sim.steps[st.step]?.siteName}): no window before the data end
                        </span>
                      ))}
                    </span>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <p className="text-xs text-ink-soft">
        A censored year reached the end of the hindcast before the last step could start; it is left out of the percentiles. Percentiles by
        linear interpolation between order statistics (Hyndman &amp; Fan type 7).
      </p>
    </div>
  );
}

interface StepDraft {
  key: number;
  operationId: string;
  siteId: string;
}

let nextKey = 1;

/** The worksites an operation happens at (empty list = every worksite). */
const sitesFor = (op: OperationResponse | undefined, sites: SiteResponse[]) =>
  !op ? [] : op.siteIds.length === 0 ? sites : sites.filter((s) => op.siteIds.includes(s.id));

/** Day 'YYYY-MM-DD' of an instant in a zone, for a date input. */
const dayIn = (iso: string | null, zone: string) => (iso ? dateIn(iso, zone, 'yyyy-MM-dd') : '');

/** Create or edit a campaign: name, start-date zone, planned start, ordered steps (add, move, remove). */
function CampaignEditor({
  projectId,
  campaign,
  operations,
  sites,
  onDone,
}: {
  projectId: string;
  campaign?: CampaignResponse;
  operations: OperationResponse[];
  sites: SiteResponse[];
  onDone: (id?: string) => void;
}) {
  const create = useCreateCampaign(projectId);
  const update = useUpdateCampaign(projectId);
  const [name, setName] = useState(campaign?.name ?? '');
  const [timeZone, setTimeZone] = useState(campaign?.timeZone ?? 'UTC');
  const [plannedDay, setPlannedDay] = useState(dayIn(campaign?.plannedStart ?? null, campaign?.timeZone ?? 'UTC'));
  const [steps, setSteps] = useState<StepDraft[]>(() =>
    (campaign?.steps ?? []).map((s) => ({ key: nextKey++, operationId: s.operationId, siteId: s.siteId })),
  );
  const [errors, setErrors] = useState<Record<string, string>>({});
  const zones = [...new Set(['UTC', ...sites.map((s) => s.timeZone), timeZone])];
  const saving = create.isPending || update.isPending;
  const serverError = create.error ?? update.error;

  function addStep() {
    const op = operations[0];
    setSteps((s) => [...s, { key: nextKey++, operationId: op?.id ?? '', siteId: sitesFor(op, sites)[0]?.id ?? '' }]);
  }
  function move(i: number, by: -1 | 1) {
    setSteps((s) => {
      const out = [...s];
      [out[i], out[i + by]] = [out[i + by], out[i]];
      return out;
    });
  }
  function setStep(i: number, patch: Partial<StepDraft>) {
    setSteps((s) =>
      s.map((x, k) => {
        if (k !== i) return x;
        const next = { ...x, ...patch };
        if (patch.operationId !== undefined) {
          const allowed = sitesFor(
            operations.find((o) => o.id === patch.operationId),
            sites,
          );
          if (!allowed.some((a) => a.id === next.siteId)) next.siteId = allowed[0]?.id ?? '';
        }
        return next;
      }),
    );
  }

  function save() {
    let plannedStart: string | null = null;
    if (plannedDay) {
      const [y, m, d] = plannedDay.split('-').map(Number);
      plannedStart = new Date(new TZDate(y, m - 1, d, timeZone).getTime()).toISOString();
    }
    const parsed = CampaignInput.safeParse({
      name,
      timeZone,
      plannedStart,
      steps: steps.map((s) => ({ operationId: s.operationId, siteId: s.siteId })),
    });
    if (!parsed.success) {
      const found: Record<string, string> = {};
      for (const issue of parsed.error.issues) found[issue.path.join('.')] ??= issue.message;
      setErrors(found);
      return;
    }
    setErrors({});
    const onSuccess = (c: CampaignResponse) => onDone(c.id);
    if (campaign) update.mutate({ id: campaign.id, patch: parsed.data }, { onSuccess });
    else create.mutate(parsed.data, { onSuccess });
  }

  const fieldErrors: Record<string, string> = { ...errors };
  if (serverError instanceof ApiError)
    for (const d of serverError.details ?? []) if (d.field && d.message) fieldErrors[d.field] ??= d.message;

  return (
    <form
      className="no-print flex flex-col gap-4 rounded-lg border border-accent/50 bg-surface-2/40 p-3 sm:p-4"
      aria-label={campaign ? `Edit ${campaign.name}` : 'New campaign'}
      onSubmit={(e) => {
        e.preventDefault();
        save();
      }}
    >
      <h3 className="text-base font-bold">{campaign ? `Edit “${campaign.name}”` : 'New campaign'}</h3>
      <div className="grid gap-3 sm:grid-cols-3">
        <FieldShell label="Name" htmlFor="campaign-name" error={fieldErrors.name}>
          <Input id="campaign-name" value={name} invalid={!!fieldErrors.name} onChange={(e) => setName(e.target.value)} maxLength={120} />
        </FieldShell>
        <FieldShell
          label="Start dates in"
          htmlFor="campaign-zone"
          hint="Runs start on the 1st at 00:00 in this time zone."
          error={fieldErrors.timeZone}
        >
          <Select id="campaign-zone" value={timeZone} onChange={(e) => setTimeZone(e.target.value)}>
            <PlainOptions values={zones} />
          </Select>
        </FieldShell>
        <FieldShell
          label="Planned start"
          htmlFor="campaign-start"
          hint="Optional: finish dates count from its month."
          error={fieldErrors.plannedStart}
        >
          <Input id="campaign-start" type="date" value={plannedDay} onChange={(e) => setPlannedDay(e.target.value)} />
          <DateEcho value={plannedDay} />
        </FieldShell>
      </div>
      <fieldset className="flex flex-col gap-2">
        <legend className="mb-1 text-sm font-semibold">Steps, in order</legend>
        {steps.length === 0 ? <p className="text-sm text-ink-soft">No step yet.</p> : null}
        {steps.map((s, i) => {
          const op = operations.find((o) => o.id === s.operationId);
          const allowed = sitesFor(op, sites);
          const opErr = fieldErrors[`steps.${i}.operationId`];
          const siteErr = fieldErrors[`steps.${i}.siteId`];
          return (
            <div key={s.key} className="flex flex-col gap-2 rounded-lg border border-line bg-surface p-2 sm:flex-row sm:items-end">
              <span
                className="inline-flex size-7 shrink-0 items-center justify-center self-start rounded-full bg-surface-2 text-sm font-semibold sm:self-center"
                aria-hidden
              >
                {i + 1}
              </span>
              <div className="min-w-0 flex-1">
                <FieldShell label={`Step ${i + 1} operation`} htmlFor={`step-${s.key}-op`} error={opErr}>
                  <Select
                    id={`step-${s.key}-op`}
                    value={s.operationId}
                    invalid={!!opErr}
                    onChange={(e) => setStep(i, { operationId: e.target.value })}
                  >
                    {operations.map((o) => (
                      <option key={o.id} value={o.id}>
                        {o.name} (TPOP {o.tpop} h)
                      </option>
                    ))}
                  </Select>
                </FieldShell>
              </div>
              <div className="min-w-0 flex-1">
                <FieldShell label={`Step ${i + 1} worksite`} htmlFor={`step-${s.key}-site`} error={siteErr}>
                  <Select
                    id={`step-${s.key}-site`}
                    value={s.siteId}
                    invalid={!!siteErr}
                    onChange={(e) => setStep(i, { siteId: e.target.value })}
                  >
                    <NamedOptions items={allowed} />
                  </Select>
                </FieldShell>
              </div>
              <div className="flex gap-1">
                <Button variant="ghost" disabled={i === 0} onClick={() => move(i, -1)} aria-label={`Move step ${i + 1} up`} title="Move up">
                  ↑
                </Button>
                <Button
                  variant="ghost"
                  disabled={i === steps.length - 1}
                  onClick={() => move(i, 1)}
                  aria-label={`Move step ${i + 1} down`}
                  title="Move down"
                >
                  ↓
                </Button>
                <Button variant="ghost" onClick={() => setSteps((x) => x.filter((_, k) => k !== i))} aria-label={`Remove step ${i + 1}`}>
                  Remove
                </Button>
              </div>
            </div>
          );
        })}
        {fieldErrors.steps ? (
          <p role="alert" className="text-sm text-danger">
            {fieldErrors.steps}
          </p>
        ) : null}
        <div>
          <Button variant="secondary" onClick={addStep} disabled={operations.length === 0 || steps.length >= CAMPAIGN_MAX_STEPS}>
            Add step
          </Button>
        </div>
      </fieldset>
      {serverError && !(serverError instanceof ApiError && serverError.details?.length) ? <ErrorNotice error={serverError} /> : null}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" disabled={saving}>
          {saving ? 'Saving…' : campaign ? 'Save campaign' : 'Create campaign'}
        </Button>
        <Button variant="ghost" onClick={() => onDone()}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
