import { useId } from 'react';
import { Link, useParams } from 'react-router-dom';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { formatInstant, zoneStatement } from '../../../../shared/dates';
import { responseLabel } from '../../../../shared/response/rao';
import { VesselInput } from '../../../../shared/schemas/vessel';
import { useProjectAccess } from '../../../api/projects';
import { useVessels } from '../../../api/vessels';
import { usePageZone } from '../../../components/page-zone';
import { Button, Card, ErrorNotice, FieldShell, Input, Notice, PageHeader, Spinner } from '../../../components/ui';
import { ApiError } from '../../../lib/api';
import { useCreateVessel } from '../api/create-vessel';
import { HeadingRow } from '../../../components/ui/table';

/** Import times are shown in UTC, the time base of the project's stored data. */
export const VESSEL_ZONE_STATEMENT = zoneStatement('UTC', 'the time base of the project’s stored data');

/**
 * `/projects/:projectId/vessels`: the project's vessels with their RAO tables
 * (docs/domain.md#vessel-response); coordinators add vessels, everyone reads.
 */
export function VesselsPage() {
  const { projectId = '' } = useParams();
  usePageZone(VESSEL_ZONE_STATEMENT);
  const project = useProjectAccess(projectId);
  const vessels = useVessels(projectId);
  return (
    <div className="flex flex-col gap-5">
      <PageHeader
        title="Vessels"
        subtitle="The vessels operations are done from, with their response amplitude operators (RAOs): what each vessel does per metre of wave, by period and heading."
      />
      <Notice>
        RAOs turn the sea into the vessel&rsquo;s roll, heave, pitch and point motions for response limits. They are decision support only:
        the master&rsquo;s authority, marine warranty approval and local codes decide.
      </Notice>
      {vessels.isPending ? <Spinner label="Loading vessels" /> : null}
      {vessels.error ? <ErrorNotice error={vessels.error} /> : null}
      {vessels.data ? (
        vessels.data.length === 0 ? (
          <p className="text-sm text-ink-soft">
            No vessels yet.{project.canEdit ? ' Add one below, then import its RAO table.' : ' A coordinator adds them.'}
          </p>
        ) : (
          <Card>
            <table className="w-full text-left text-sm" data-testid="vessels-table">
              <caption className="sr-only">The project’s vessels</caption>
              <thead>
                <HeadingRow
                  className="text-ink-soft"
                  cellClassName="py-1 pr-3"
                  headings={['Vessel', 'Responses in its RAO table', { label: 'Imported', className: 'py-1' }]}
                />
              </thead>
              <tbody>
                {vessels.data.map((v) => (
                  <tr key={v.id} className="border-t border-line align-top">
                    <th scope="row" className="py-2 pr-3">
                      <Link to={v.id} className="inline-flex min-h-11 items-center font-semibold text-accent underline">
                        {v.name}
                      </Link>
                    </th>
                    <td className="py-2 pr-3">{v.responses.length > 0 ? v.responses.map(responseLabel).join(', ') : 'no RAO table yet'}</td>
                    <td className="py-2">
                      {v.raoImportedAt ? `${v.raoFileName ?? 'file'}, ${formatInstant(v.raoImportedAt, 'UTC', 'dateTime')}` : '–'}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </Card>
        )
      ) : null}
      {project.canEdit ? <NewVesselForm projectId={projectId} /> : null}
    </div>
  );
}

function NewVesselForm({ projectId }: { projectId: string }) {
  const id = useId();
  const create = useCreateVessel(projectId);
  const form = useForm<VesselInput>({ resolver: zodResolver(VesselInput), defaultValues: { name: '' } });
  const submit = form.handleSubmit((input) =>
    create.mutate(input, {
      onSuccess: () => form.reset({ name: '' }),
      onError: (e) => {
        if (e instanceof ApiError && e.status === 409) form.setError('name', { message: e.message });
      },
    }),
  );
  const nameError = form.formState.errors.name?.message;
  return (
    <Card>
      <form onSubmit={submit} noValidate className="flex flex-col gap-3" aria-label="New vessel">
        <h2 className="text-lg font-bold">Add a vessel</h2>
        <div className="flex flex-wrap items-end gap-3">
          <div className="min-w-64 flex-1">
            <FieldShell label="Vessel name" htmlFor={`${id}-name`} error={nameError} hint="As the crew knows it, e.g. the ship's name.">
              <Input id={`${id}-name`} autoComplete="off" invalid={!!nameError} {...form.register('name')} />
            </FieldShell>
          </div>
          <Button type="submit" disabled={create.isPending} className={nameError ? 'mb-7' : 'mb-5'}>
            {create.isPending ? 'Adding…' : 'Add vessel'}
          </Button>
        </div>
        {create.error && !(create.error instanceof ApiError && create.error.status === 409) ? <ErrorNotice error={create.error} /> : null}
        {create.isSuccess ? (
          <Notice tone="success">
            Vessel “{create.data.name}” added.{' '}
            <Link to={create.data.id} className="font-semibold underline">
              Open it to import its RAOs
            </Link>
          </Notice>
        ) : null}
      </form>
    </Card>
  );
}
