import { useState } from 'react';
import { useParams } from 'react-router-dom';
import type { CalibratedAlphaAnswer } from '../../../../shared/api-types-skill';
import { useDatasets } from '../../../api/datasets';
import { useProjectAccess } from '../../../api/projects';
import { Button, Card, Confirm, ErrorNotice, FieldShell, Notice, PageHeader, Select, Spinner } from '../../../components/ui';
import { trimmed } from '../../../lib/format';
import { useAdoptCalibrated } from '../api/adopt-calibrated';
import { useCalibratedAlpha } from '../api/get-calibrated-alpha';
import { useForecastSkill } from '../api/get-forecast-skill';
import { BiasByLead, SkillScatter } from './skill-charts';
import { BinsTable, CalibratedTable } from './skill-tables';

/**
 * `/projects/:projectId/forecast-skill`: the project's stored forecast issues against an
 * observation dataset (docs/domain.md#forecast-uncertainty), and the calibrated alpha table beside
 * the default, which a coordinator may adopt (docs/domain.md#calibrated-alpha).
 */
export function ForecastSkillPage() {
  const { projectId = '' } = useParams();
  const project = useProjectAccess(projectId);
  const datasets = useDatasets(projectId);
  const candidates = (datasets.data ?? []).filter((d) => d.kind === 'observation' || d.kind === 'hindcast');
  const [picked, setPicked] = useState<string | null>(null);
  const observationId = picked ?? candidates.find((d) => d.kind === 'observation')?.id ?? candidates[0]?.id ?? '';
  const skill = useForecastSkill(projectId, observationId);
  const calibrated = useCalibratedAlpha(projectId, observationId);

  return (
    <div className="flex flex-col gap-5">
      <PageHeader
        title="Forecast skill"
        subtitle="How the project's stored forecasts compared with what was later observed, and the alpha table that record would give."
      />
      <Notice>
        <span className="font-semibold">Before using a calibrated table:</span> it is only as good as the forecast archive behind it: a
        representative span of seasons and storms, from the forecast provider you use today. Marine warranty approval decides whether it may
        be used in place of the standard's table; the master's authority and local codes still decide every go.
      </Notice>

      {datasets.isPending ? <Spinner label="Loading the sea data" /> : null}
      {datasets.error ? <ErrorNotice error={datasets.error} /> : null}
      {datasets.data && candidates.length === 0 ? (
        <Notice>
          Import an observation record (or a hindcast covering the forecasts) on the Sea data page to compare the forecasts with.
        </Notice>
      ) : null}
      {candidates.length > 0 ? (
        <div className="max-w-xl">
          <FieldShell
            label="Compare the forecasts with"
            htmlFor="skill-observation"
            hint="An observation record, or a hindcast covering the forecasts' times."
          >
            <Select id="skill-observation" value={observationId} onChange={(e) => setPicked(e.target.value)}>
              {candidates.map((d) => (
                <option key={d.id} value={d.id}>
                  {d.name} ({d.kind})
                </option>
              ))}
            </Select>
          </FieldShell>
        </div>
      ) : null}

      {skill.isPending && observationId ? <Spinner label="Pairing the forecasts with the observations" /> : null}
      {skill.error ? <ErrorNotice error={skill.error} /> : null}
      {skill.data ? (
        <>
          <p className="text-sm" data-testid="skill-summary">
            {skill.data.issuesPaired} of {skill.data.issuesCompared} forecast issues paired, {skill.data.pairs} pairs (lead under 96 h,
            forecast Hs from 0.5 m).
          </p>
          {skill.data.pairs > 0 ? (
            <div className="grid gap-4 lg:grid-cols-2">
              <Card>
                <h2 className="mb-2 text-lg font-semibold">Forecast against observed Hs</h2>
                <SkillScatter points={skill.data.points} />
                <p className="mt-1 text-xs text-ink-soft">
                  Dashed: forecast = observed. Filled dots: lead under 24 h; rings: 24 h and more.
                  {skill.data.pairs > skill.data.points.length
                    ? ` ${skill.data.points.length} of ${skill.data.pairs} pairs, evenly sampled.`
                    : ''}
                </p>
              </Card>
              <Card>
                <h2 className="mb-2 text-lg font-semibold">Bias by lead time</h2>
                <BiasByLead byLead={skill.data.byLead} />
                <p className="mt-1 text-xs text-ink-soft">ln(observed / forecast Hs): above 0 the forecast read low, below 0 high.</p>
              </Card>
            </div>
          ) : null}
          <section className="flex flex-col gap-2">
            <h2 className="text-lg font-semibold">Log error by lead time and forecast Hs</h2>
            <BinsTable skill={skill.data} />
          </section>
        </>
      ) : null}

      {calibrated.error ? <ErrorNotice error={calibrated.error} /> : null}
      {calibrated.data ? (
        <CalibratedSection projectId={projectId} answer={calibrated.data} canAdopt={project.canEdit} observationId={observationId} />
      ) : null}
    </div>
  );
}

function CalibratedSection({
  projectId,
  answer,
  canAdopt,
  observationId,
}: {
  projectId: string;
  answer: CalibratedAlphaAnswer;
  canAdopt: boolean;
  observationId: string;
}) {
  const adopt = useAdoptCalibrated(projectId);
  const [asking, setAsking] = useState(false);
  const few = answer.cells.flat().filter((c) => !c.fallback && c.fewIssues).length;
  const fallbacks = answer.cells.flat().filter((c) => c.fallback).length;
  const nothing = fallbacks === answer.cells.flat().length;
  return (
    <section className="flex flex-col gap-3" aria-labelledby="calibrated-heading">
      <h2 id="calibrated-heading" className="text-lg font-semibold">
        Calibrated alpha beside the default
      </h2>
      <p className="max-w-3xl text-sm text-ink-soft">
        Per cell α = min(1, exp(−(μ + zσ))) with z = {trimmed(answer.z, 3)}, the standard normal quantile at 1 − p for p ={' '}
        {answer.p.toExponential(0)} (the project's setting), from the bin of the largest lead a go decision needs (TR, at least the row's
        TPOP) and the column's Hs limit. The project's table in force is {answer.current.isDefault ? 'the default' : 'its own'}.
      </p>
      <Notice tone={few > 0 ? 'error' : 'info'}>
        {few > 0 ? (
          <>
            <span className="font-semibold">
              {few} calibrated {few === 1 ? 'cell rests' : 'cells rest'} on fewer than {answer.fewIssues} distinct forecast issues.
            </span>{' '}
          </>
        ) : null}
        A normal tail fitted at {trimmed(answer.z, 1)} σ to a few hundred correlated pairs is fragile: one unusual storm can move it.
        {fallbacks > 0 ? ` ${fallbacks} ${fallbacks === 1 ? 'cell has' : 'cells have'} no data and keep the default value.` : ''}
      </Notice>
      <CalibratedTable answer={answer} />
      {adopt.isSuccess ? (
        <Notice tone="success">The calibrated table is now the project's alpha table (recorded in the audit trail).</Notice>
      ) : null}
      {adopt.error ? <ErrorNotice error={adopt.error} /> : null}
      {canAdopt ? (
        asking ? (
          <Confirm
            title="Adopt the calibrated table as this project's alpha table?"
            confirmLabel="Adopt calibrated table"
            tone="primary"
            busy={adopt.isPending}
            onConfirm={() =>
              adopt.mutate(
                { p: answer.p, observation: observationId },
                {
                  onSettled: () => setAsking(false),
                },
              )
            }
            onCancel={() => setAsking(false)}
          >
            Every plan, alert and statistic with alpha then uses it. The audit trail keeps p, the observation dataset and the figures behind
            each cell. The default can be restored on the Sites &amp; limits page.
          </Confirm>
        ) : (
          <div>
            <Button onClick={() => setAsking(true)} disabled={nothing}>
              Adopt calibrated table…
            </Button>
            {nothing ? <p className="mt-1 text-xs text-ink-soft">Nothing to adopt: no bin has data.</p> : null}
          </div>
        )
      ) : null}
    </section>
  );
}
