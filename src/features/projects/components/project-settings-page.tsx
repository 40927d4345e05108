import { useParams } from 'react-router-dom';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { ProjectSettingsInput } from '../../../../shared/schemas/projects';
import type { ProjectDetail } from '../../../../shared/api-types';
import { Button, Card, ErrorNotice, FieldShell, Input, Notice, Select, Spinner, TextArea, TextField } from '../../../components/ui';
import { useProject } from '../../../api/projects';
import { useUpdateProjectSettings } from '../api/mutations';

// Form values are text; they are turned into the shared schema's numbers on submit.
const SettingsForm = z.object({
  name: z.string(),
  description: z.string(),
  dataPointName: z.string(),
  dataPointLatitude: z.string(),
  dataPointLongitude: z.string(),
  dataPointDepthM: z.string(),
  forecastSource: z.enum(['service', 'uploads']),
  alphaCalibrationP: z.string(),
});
type SettingsForm = z.infer<typeof SettingsForm>;

/** The settings typed as numbers, in the form's order. */
const NUMBER_FIELDS = [
  { name: 'dataPointDepthM', label: 'Water depth at the data point', unit: 'm', hint: 'Leave empty for deep water.' },
  { name: 'dataPointLatitude', label: 'Latitude', unit: '° north, negative south' },
  { name: 'dataPointLongitude', label: 'Longitude', unit: '° east, negative west' },
  {
    name: 'alphaCalibrationP',
    label: 'p of the calibrated alpha table',
    hint: 'The accepted chance that the observed Hs exceeds the limit when the forecast is at α·OPLIM (1e-4 by default). Used by the Forecast skill page; never adopted by itself.',
  },
] as const;

const numOrNull = (s: string) => (s.trim() === '' ? null : Number(s));

export function ProjectSettingsPage() {
  const { projectId = '' } = useParams();
  const project = useProject(projectId);
  if (project.isPending) return <Spinner />;
  if (project.error) return <ErrorNotice error={project.error} />;
  return <SettingsEditor project={project.data} />;
}

function SettingsEditor({ project }: { project: ProjectDetail }) {
  const update = useUpdateProjectSettings(project.id);
  const form = useForm<SettingsForm>({
    resolver: zodResolver(SettingsForm),
    defaultValues: {
      name: project.name,
      description: project.description,
      dataPointName: project.dataPointName,
      dataPointLatitude: project.dataPointLatitude?.toString() ?? '',
      dataPointLongitude: project.dataPointLongitude?.toString() ?? '',
      dataPointDepthM: project.dataPointDepthM?.toString() ?? '',
      forecastSource: project.forecastSource,
      alphaCalibrationP: project.alphaCalibrationP.toString(),
    },
  });
  const errors = form.formState.errors;

  const onSubmit = form.handleSubmit((v) => {
    const parsed = ProjectSettingsInput.safeParse({
      ...v,
      dataPointLatitude: numOrNull(v.dataPointLatitude),
      dataPointLongitude: numOrNull(v.dataPointLongitude),
      dataPointDepthM: numOrNull(v.dataPointDepthM),
      alphaCalibrationP: numOrNull(v.alphaCalibrationP) ?? undefined,
    });
    if (!parsed.success) {
      for (const issue of parsed.error.issues) {
        form.setError(String(issue.path[0]) as keyof SettingsForm, { message: issue.message });
      }
      return;
    }
    update.mutate(parsed.data, { onSuccess: () => form.reset(v) });
  });

  return (
    <Card>
      <form className="grid gap-4 md:grid-cols-2" onSubmit={onSubmit} noValidate>
        <TextField label="Project name" id="name" error={errors.name?.message} {...form.register('name')} />
        <FieldShell
          label="Forecast source"
          htmlFor="forecastSource"
          hint="The service is polled by the planning job; uploads are files you bring."
        >
          <Select id="forecastSource" {...form.register('forecastSource')}>
            <option value="service">Forecast service</option>
            <option value="uploads">Uploaded files only</option>
          </Select>
        </FieldShell>
        <div className="md:col-span-2">
          <FieldShell label="Description" htmlFor="description" error={errors.description?.message}>
            <TextArea id="description" rows={3} {...form.register('description')} />
          </FieldShell>
        </div>
        <FieldShell label="Data point name" htmlFor="dataPointName" error={errors.dataPointName?.message}>
          <Input id="dataPointName" {...form.register('dataPointName')} />
        </FieldShell>
        {NUMBER_FIELDS.map(({ name, ...field }) => (
          <TextField key={name} id={name} {...field} inputMode="decimal" error={errors[name]?.message} {...form.register(name)} />
        ))}
        <div className="flex flex-col gap-3 md:col-span-2">
          {update.error ? <ErrorNotice error={update.error} /> : null}
          {update.isSuccess && !form.formState.isDirty ? <Notice tone="success">Settings saved.</Notice> : null}
          <div>
            <Button type="submit" disabled={update.isPending}>
              Save settings
            </Button>
          </div>
        </div>
      </form>
    </Card>
  );
}
