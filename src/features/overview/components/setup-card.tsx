import { Link } from 'react-router-dom';
import type { OverviewSetup } from '../../../../shared/api-types-overview';
import { Card } from '../../../components/ui';
import { setupSteps } from './setup-steps';

const link = 'font-semibold text-accent underline';

/** A new project's set-up steps, for coordinators, until every one is done. */
export function SetupCard({ projectId, setup }: { projectId: string; setup: OverviewSetup }) {
  const steps = setupSteps(setup);
  const done = steps.filter((s) => s.done).length;
  if (done === steps.length) return null;
  return (
    <Card aria-labelledby="overview-setup-title" data-testid="setup-steps">
      <h2 id="overview-setup-title" className="text-lg font-bold">
        Setting up this project
      </h2>
      <p className="mb-3 text-sm text-ink-soft">
        {done} of {steps.length} done. The watch board needs the worksites, the operations, the data point and forecasts; the Downtime page
        needs a hindcast. This list goes once every step is done.
      </p>
      <ol className="grid gap-2 text-sm">
        {steps.map((s, i) => (
          <li key={s.key} className="flex gap-3" data-testid={`setup-step-${s.key}`} data-done={s.done}>
            <span
              aria-hidden
              className={`inline-flex size-6 shrink-0 items-center justify-center rounded-full text-xs font-semibold ${
                s.done ? 'bg-accent text-white' : 'bg-surface-2'
              }`}
            >
              {s.done ? '✓' : i + 1}
            </span>
            <span className="min-w-0 break-words">
              <span className="font-semibold">{s.title}</span>
              <span className="sr-only">{s.done ? ' (done)' : ' (to do)'}</span>: {s.detail}.
              {s.done ? null : (
                <>
                  {' '}
                  <Link className={link} to={`/projects/${projectId}/${s.path}`}>
                    {s.action}
                  </Link>
                </>
              )}
            </span>
          </li>
        ))}
      </ol>
    </Card>
  );
}
