import { useParams } from 'react-router-dom';
import { Card, ErrorNotice, Spinner } from '../../../components/ui';
import { useProject } from '../../../api/projects';

export function ProjectOverviewPage() {
  const { projectId = '' } = useParams();
  const project = useProject(projectId);
  if (project.isPending) return <Spinner />;
  if (project.error) return <ErrorNotice error={project.error} />;
  const p = project.data;
  return (
    <div className="grid gap-4 lg:grid-cols-2">
      <Card>
        <h2 className="mb-2 text-lg font-bold">About this project</h2>
        <p className="whitespace-pre-line text-sm text-ink-soft">{p.description || 'No description.'}</p>
      </Card>
      <Card>
        <h2 className="mb-2 text-lg font-bold">Offshore data point</h2>
        <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
          <dt className="text-ink-soft">Name</dt>
          <dd>{p.dataPointName || 'Not set'}</dd>
          <dt className="text-ink-soft">Position</dt>
          <dd>
            {p.dataPointLatitude !== null && p.dataPointLongitude !== null
              ? `${p.dataPointLatitude.toFixed(3)}°, ${p.dataPointLongitude.toFixed(3)}°`
              : 'Not set'}
          </dd>
          <dt className="text-ink-soft">Water depth</dt>
          <dd>{p.dataPointDepthM === null ? 'Deep water' : `${p.dataPointDepthM} m`}</dd>
          <dt className="text-ink-soft">Forecasts</dt>
          <dd>{p.forecastSource === 'service' ? 'Fetched from the forecast service' : 'Uploaded files only'}</dd>
        </dl>
      </Card>
    </div>
  );
}
