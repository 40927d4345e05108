import { useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { CreateProjectInput } from '../../../../shared/schemas/projects';
import { Button, Card, ErrorNotice, FieldShell, Input, PageHeader, Spinner } from '../../../components/ui';
import { useMe } from '../../../api/me';
import { useProjects } from '../../../api/projects';
import { useCreateProject } from '../api/mutations';
import { RoleBadge } from './role-badge';

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
      {creating ? <CreateProjectCard onDone={() => setCreating(false)} /> : null}
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

function CreateProjectCard({ onDone }: { onDone: () => void }) {
  const create = useCreateProject();
  const navigate = useNavigate();
  const form = useForm({ resolver: zodResolver(CreateProjectInput), defaultValues: { name: '', description: '' } });
  return (
    <Card className="mb-5">
      <form
        className="grid gap-4"
        onSubmit={form.handleSubmit((v) => create.mutate(v, { onSuccess: (p) => void navigate(`/projects/${p.id}/settings`) }))}
      >
        <FieldShell label="Project name" htmlFor="project-name" error={form.formState.errors.name?.message}>
          <Input id="project-name" {...form.register('name')} invalid={!!form.formState.errors.name} />
        </FieldShell>
        <FieldShell label="Description" htmlFor="project-description" error={form.formState.errors.description?.message}>
          <Input id="project-description" {...form.register('description')} />
        </FieldShell>
        {create.error ? <ErrorNotice error={create.error} /> : null}
        <div className="flex gap-2">
          <Button type="submit" disabled={create.isPending}>Create project</Button>
          <Button variant="ghost" onClick={onDone}>Cancel</Button>
        </div>
      </form>
    </Card>
  );
}
