import { lazy, Suspense, useState } from 'react';
import { Link } from 'react-router-dom';
import { Button, Card, ErrorNotice, PageHeader, Spinner } from '../../../components/ui';
import { useMe } from '../../../api/me';
import { useProjects } from '../../../api/projects';
import { RoleBadge } from './role-badge';

// The form (with its schema library) is loaded when "New project" is pressed: the projects list
// is part of the first page, whose script size has a budget.
const CreateProjectCard = lazy(() => import('./create-project-card'));

export function ProjectsPage() {
  const me = useMe();
  const projects = useProjects();
  const [creating, setCreating] = useState(false);
  const canCreate = me.data?.globalRole === 'admin' || me.data?.projects.some((p) => p.role === 'coordinator');

  return (
    <div>
      <PageHeader
        title="Projects"
        subtitle="Each project is one marine campaign or contract."
        actions={canCreate && !creating ? <Button onClick={() => setCreating(true)}>New project</Button> : null}
      />
      {creating ? (
        <Suspense fallback={<Spinner />}>
          <CreateProjectCard onDone={() => setCreating(false)} />
        </Suspense>
      ) : null}
      {projects.isPending ? <Spinner /> : null}
      {projects.error ? <ErrorNotice error={projects.error} /> : null}
      {projects.data && projects.data.length === 0 ? (
        <Card>
          <p className="text-ink-soft">You are not a member of any project yet. Ask your administrator to add you.</p>
        </Card>
      ) : null}
      <ul className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
        {projects.data?.map((p) => (
          <li key={p.id}>
            <Link
              to={`/projects/${p.id}`}
              className="flex min-h-24 flex-col justify-between gap-3 rounded-[var(--radius-card)] border border-line bg-surface p-4 hover:border-accent"
            >
              <span className="text-lg font-bold leading-snug">{p.name}</span>
              <RoleBadge role={p.role} />
            </Link>
          </li>
        ))}
      </ul>
    </div>
  );
}
