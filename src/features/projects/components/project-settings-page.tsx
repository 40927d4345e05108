import { useParams } from 'react-router-dom';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { ProjectSettingsInput } from '../../../../shared/schemas/projects';
import type { ProjectDetail } from '../../../../shared/api-types';
import { Button, Card, ErrorNotice, FieldShell, Input, Notice, Select, Spinner, TextArea } from '../../../components/ui';
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
        <FieldShell label="Project name" htmlFor="name" error={errors.name?.message}>
          <Input id="name" {...form.register('name')} invalid={!!errors.name} />
        </FieldShell>
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
        <FieldShell
          label="Water depth at the data point"
          unit="m"
          htmlFor="dataPointDepthM"
          hint="Leave empty for deep water."
          error={errors.dataPointDepthM?.message}
        >
          <Input id="dataPointDepthM" inputMode="decimal" {...form.register('dataPointDepthM')} invalid={!!errors.dataPointDepthM} />
        </FieldShell>
        <FieldShell label="Latitude" unit="° north, negative south" htmlFor="dataPointLatitude" error={errors.dataPointLatitude?.message}>
          <Input id="dataPointLatitude" inputMode="decimal" {...form.register('dataPointLatitude')} invalid={!!errors.dataPointLatitude} />
        </FieldShell>
        <FieldShell label="Longitude" unit="° east, negative west" htmlFor="dataPointLongitude" error={errors.dataPointLongitude?.message}>
          <Input
            id="dataPointLongitude"
            inputMode="decimal"
            {...form.register('dataPointLongitude')}
            invalid={!!errors.dataPointLongitude}
          />
        </FieldShell>
        <FieldShell
          label="p of the calibrated alpha table"
          htmlFor="alphaCalibrationP"
          hint="The accepted chance that the observed Hs exceeds the limit when the forecast is at α·OPLIM (1e-4 by default). Used by the Forecast skill page; never adopted by itself."
          error={errors.alphaCalibrationP?.message}
        >
          <Input id="alphaCalibrationP" inputMode="decimal" {...form.register('alphaCalibrationP')} invalid={!!errors.alphaCalibrationP} />
        </FieldShell>
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
