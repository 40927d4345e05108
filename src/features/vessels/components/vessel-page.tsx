import { Link, useParams } from 'react-router-dom';
import { formatInstant } from '../../../../shared/dates';
import { useProjectAccess } from '../../../api/projects';
import { useVessels } from '../../../api/vessels';
import { usePageZone } from '../../../components/page-zone';
import { Card, ErrorNotice, PageHeader, Spinner } from '../../../components/ui';
import { useVesselRaos } from '../api/get-vessel-raos';
import { RaoImportForm } from './rao-import-form';
import { RaoTableView } from './rao-table-view';
import { VESSEL_ZONE_STATEMENT } from './vessels-page';

/** `/projects/:projectId/vessels/:vesselId`: one vessel's RAO table, and its import for coordinators. */
export function VesselPage() {
  const { projectId = '', vesselId = '' } = useParams();
  usePageZone(VESSEL_ZONE_STATEMENT);
  const project = useProjectAccess(projectId);
  const vessel = useVessels(projectId).data?.find((v) => v.id === vesselId);
  const raos = useVesselRaos(projectId, vesselId);
  const hasTable = (raos.data?.responses.length ?? 0) > 0;
  return (
    <div className="flex flex-col gap-5">
      <p className="text-sm">
        <Link to=".." relative="path" className="inline-flex min-h-11 items-center font-semibold text-accent underline">
          ← All vessels
        </Link>
      </p>
      <PageHeader
        title={vessel?.name ?? 'Vessel'}
        subtitle={
          raos.data?.importedAt
            ? `RAO table from ${raos.data.fileName ?? 'a file'}, imported ${formatInstant(raos.data.importedAt, 'UTC', 'dateTime')}.`
            : 'No RAO table yet.'
        }
      />
      {raos.isPending ? <Spinner label="Loading the RAO table" /> : null}
      {raos.error ? <ErrorNotice error={raos.error} /> : null}
      {raos.data && hasTable ? (
        <Card>
          <h2 className="mb-3 text-lg font-bold">RAO table</h2>
          <RaoTableView view={raos.data} title="The vessel’s RAO table" />
        </Card>
      ) : null}
      {raos.data && !hasTable ? (
        <p className="text-sm text-ink-soft">
          {project.canEdit ? 'Import the vessel’s RAO table below.' : 'A coordinator imports the vessel’s RAO table.'}
        </p>
      ) : null}
      {project.canEdit && raos.data ? (
        <Card>
          <h2 className="mb-3 text-lg font-bold">{hasTable ? 'Replace the RAO table' : 'Import the RAO table'}</h2>
          <RaoImportForm projectId={projectId} vesselId={vesselId} hasTable={hasTable} />
        </Card>
      ) : null}
    </div>
  );
}
