// Import of a vessel's RAO table from CSV (docs/domain.md#vessel-response): the heading convention
// in words and as a picture, a preview read in the browser with the same reader the server uses,
// then the upload; the server's refusal is shown line by line.
import { useId, useState, type FormEvent } from 'react';
import { readRaoCsv, type RaoCsvResult } from '../../../../shared/schemas/vessel';
import { Button, ErrorNotice, Notice } from '../../../components/ui';
import { useImportRaos } from '../api/import-raos';
import { HeadingConvention } from './heading-convention';
import { problemsOfError, RaoProblems } from './rao-problems';
import { raoViewOf, RaoTableView } from './rao-table-view';

/** The server's limit (server/routes/vessels.ts), checked before reading the file. */
const MAX_RAO_FILE_BYTES = 2 * 1024 * 1024;

export function RaoImportForm({ projectId, vesselId, hasTable }: { projectId: string; vesselId: string; hasTable: boolean }) {
  const id = useId();
  const mutation = useImportRaos(projectId, vesselId);
  const [file, setFile] = useState<File | null>(null);
  const [read, setRead] = useState<RaoCsvResult | null>(null);
  const [tooLarge, setTooLarge] = useState(false);
  const [inputKey, setInputKey] = useState(0);

  const choose = async (f: File | null) => {
    mutation.reset();
    setFile(f);
    setRead(null);
    setTooLarge(false);
    if (!f) return;
    if (f.size > MAX_RAO_FILE_BYTES) {
      setTooLarge(true);
      return;
    }
    setRead(readRaoCsv(await f.text()));
  };

  const submit = (e: FormEvent) => {
    e.preventDefault();
    if (!file || !read?.ok) return;
    mutation.mutate(file, {
      onSuccess: () => {
        setFile(null);
        setRead(null);
        setInputKey((k) => k + 1);
      },
    });
  };

  const serverProblems = problemsOfError(mutation.error);
  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4" aria-label="Import an RAO table" data-testid="rao-import-form">
      <HeadingConvention />
      <div className="flex flex-col gap-1">
        <label htmlFor={`${id}-file`} className="text-sm font-semibold">
          RAO table (CSV)
        </label>
        <input
          key={inputKey}
          id={`${id}-file`}
          type="file"
          accept=".csv,text/csv,text/plain"
          aria-describedby={`${id}-hint`}
          className="min-h-11 text-sm file:mr-3 file:min-h-11 file:rounded-lg file:border file:border-line file:bg-surface-2 file:px-3 file:font-semibold"
          onChange={(e) => void choose(e.target.files?.[0] ?? null)}
        />
        <p id={`${id}-hint`} className="text-xs text-ink-soft">
          Columns: <code>period_s</code> (or <code>frequency_rad_s</code>), <code>heading_deg</code>, and one per response:{' '}
          <code>heave_m_per_m</code>, <code>roll_deg_per_m</code>, <code>pitch_deg_per_m</code>, <code>vel_z_m_s_per_m@point</code>,{' '}
          <code>acc_z_m_s2_per_m@point</code> (a point named after @). One row per period and heading; amplitudes per metre of wave
          amplitude, at zero speed. At most 2 MB.
        </p>
      </div>
      {tooLarge ? (
        <Notice tone="error">The file is larger than 2 MB: RAO tables are far smaller; check that this is the right file.</Notice>
      ) : null}
      {read && !read.ok ? <RaoProblems problems={read.problems} heading={`${file?.name ?? 'The file'} cannot be imported`} /> : null}
      {read?.ok ? (
        <>
          <RaoTableView view={raoViewOf(read.table)} title={`Preview of ${file?.name ?? 'the file'}`} />
          <p className="text-sm">
            {hasTable ? 'Importing replaces the vessel’s current RAO table as a whole.' : 'The vessel has no RAO table yet.'}
          </p>
        </>
      ) : null}
      {serverProblems ? (
        <RaoProblems problems={serverProblems} heading="The server refused the table" />
      ) : mutation.error ? (
        <ErrorNotice error={mutation.error} />
      ) : null}
      {mutation.isSuccess ? (
        <Notice tone="success">
          Imported: {mutation.data.responses.length} response{mutation.data.responses.length === 1 ? '' : 's'},{' '}
          {mutation.data.periods.length} periods, {mutation.data.headings.length} headings.
        </Notice>
      ) : null}
      <div>
        <Button type="submit" disabled={!read?.ok || mutation.isPending}>
          {mutation.isPending ? 'Importing…' : 'Import this table'}
        </Button>
      </div>
    </form>
  );
}
