import { useNavigate } from 'react-router-dom';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { CreateProjectInput } from '../../../../shared/schemas/projects';
import { Card, FieldShell, Input } from '../../../components/ui';
import { useCreateProject } from '../api/mutations';
import { SubmitOrCancel } from '../../../components/ui/form-actions';

/** The "New project" form of the projects page. */
export default function CreateProjectCard({ onDone }: { onDone: () => void }) {
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
        <SubmitOrCancel mutation={create} label="Create project" onCancel={onDone} className="flex gap-2" />
      </form>
    </Card>
  );
}
