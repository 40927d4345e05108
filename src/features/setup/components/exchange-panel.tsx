import { useId, useState } from 'react';
import { formatInstant, localTimeZone } from '../../../../shared/dates';
import type { z } from 'zod';
import { issuesInWords, problemSentence } from '../../../../shared/schemas/words';
import { IMPORT_MODES, ProjectSetupDocument, type ImportMode } from '../../../../shared/schemas/sites';
import type { ImportPreviewResponse, ImportResultResponse } from '../../../../shared/api-types-sites';
import { Button, Card, ErrorNotice, Notice, Spinner } from '../../../components/ui';
import { exportSetupUrl } from '../api/export-setup';
import { useImportPreview, useImportSetup } from '../api/import-setup';
import { withUnit } from './format';
import { FilePicker } from './form-bits';
import { plural } from '../../../lib/format';

/** Largest setup file read in the browser, bytes (the document is small: names, numbers, tables). */
const MAX_FILE_BYTES = 5 * 1024 * 1024;

const MODE_TEXT: Record<ImportMode, { title: string; text: string }> = {
  merge: {
    title: 'Add to this project',
    text: 'The file’s worksites and operations are added next to the ones here. Nothing is added if a name is already used here.',
  },
  replace: {
    title: 'Replace this project’s setup',
    text: 'Every worksite and operation of this project is deleted first, with everything hanging on them, then the file’s are added. Refused while the downtime ledger has confirmed days.',
  },
};

interface ReadFile {
  /** changes with every file read, so the preview is asked again */
  key: string;
  fileName: string;
  doc: ProjectSetupDocument | null;
  problems: string[];
}

let readCount = 0;

async function readSetupFile(file: File): Promise<ReadFile> {
  const key = `${++readCount}`;
  if (file.size > MAX_FILE_BYTES)
    return { key, fileName: file.name, doc: null, problems: [`The file is larger than ${MAX_FILE_BYTES / 1024 / 1024} MB`] };
  let raw: unknown;
  try {
    raw = JSON.parse(await file.text());
  } catch (e) {
    return { key, fileName: file.name, doc: null, problems: [`Not a JSON document: ${(e as Error).message}`] };
  }
  const parsed = ProjectSetupDocument.safeParse(raw);
  if (parsed.success) return { key, fileName: file.name, doc: parsed.data, problems: [] };
  return {
    key,
    fileName: file.name,
    doc: null,
    problems: issuesInWords(parsed.error as z.ZodError, raw, 'The document')
      .slice(0, 50)
      .map(problemSentence),
  };
}

function alphaInFile(doc: ProjectSetupDocument): string {
  if (doc.alphaTable === undefined) return 'not in the file (this project’s table is kept)';
  if (doc.alphaTable === null) return 'the default table';
  return `its own table (${doc.alphaTable.tpopBoundsH.length} TPOP rows × ${doc.alphaTable.hsColumnsM.length} Hs columns)`;
}

function resultText(r: ImportResultResponse): string {
  const deleted = r.mode === 'replace' ? ` Deleted first: ${r.worksites.deleted} worksites and ${r.operations.deleted} operations.` : '';
  return `Added ${r.worksites.created} worksites and ${r.operations.created} operations.${deleted} ${r.messages.join(' ')}`;
}

const names = (list: string[], max = 8) =>
  list.length === 0 ? '' : `: ${list.slice(0, max).join(', ')}${list.length > max ? `, and ${list.length - max} more` : ''}`;

/** Everything replace removes, item by item (only what there is). */
function removedItems(r: ImportPreviewResponse['removes']): string[] {
  const out: string[] = [];
  if (r.worksites.length > 0) out.push(`${plural(r.worksites.length, 'worksite')}${names(r.worksites)}`);
  if (r.operations.length > 0) out.push(`${plural(r.operations.length, 'operation')} with their limits${names(r.operations)}`);
  if (r.campaigns.length > 0) out.push(`${plural(r.campaigns.length, 'campaign')}${names(r.campaigns)}`);
  if (r.recurrences.length > 0)
    out.push(`the repeat rules of ${plural(r.recurrences.length, 'operation')} (not in setup files)${names(r.recurrences)}`);
  if (r.skipperAssignments > 0) out.push(`${plural(r.skipperAssignments, 'skipper assignment')}`);
  if (r.hindcastChoices.length > 0)
    out.push(`the hindcast chosen for ${plural(r.hindcastChoices.length, 'worksite')}${names(r.hindcastChoices)}`);
  if (r.proposedLedgerDays > 0)
    out.push(`${plural(r.proposedLedgerDays, 'proposed downtime-ledger day')} (they can be proposed again from the data)`);
  if (r.confirmedLedgerDays > 0)
    out.push(`${plural(r.confirmedLedgerDays, 'confirmed downtime-ledger day')}: replace is refused while these exist`);
  if (r.narrowedSubscriptions > 0)
    out.push(
      `${plural(r.narrowedSubscriptions, 'alert subscription')} limited to some operations or worksites would hear of none of the new ones`,
    );
  return out;
}

/** What the server says the import would do, before it runs. */
function PreviewList({ preview }: { preview: ImportPreviewResponse }) {
  const removed = removedItems(preview.removes);
  return (
    <div className="flex flex-col gap-2 text-sm" data-testid="import-preview">
      <p className="font-semibold">What this import changes here:</p>
      <ul className="list-disc pl-5">
        <li>
          Adds {plural(preview.adds.worksites.length, 'worksite')}
          {names(preview.adds.worksites, 6)}
        </li>
        <li>
          Adds {plural(preview.adds.operations.length, 'operation')}
          {names(preview.adds.operations, 6)}
        </li>
        <li>
          Adds {plural(preview.adds.campaigns.length, 'campaign')}
          {names(preview.adds.campaigns, 6)}
        </li>
        <li>Alpha table: {preview.alphaTable.message}</li>
        <li>Data point: {preview.dataPoint.message}</li>
      </ul>
      {preview.mode === 'replace' ? (
        removed.length > 0 ? (
          <>
            <p className="font-semibold">Replace deletes:</p>
            <ul className="list-disc pl-5" data-testid="import-removes">
              {removed.map((r) => (
                <li key={r}>{r}</li>
              ))}
            </ul>
          </>
        ) : (
          <p>Replace deletes nothing: this project has no worksites or operations yet.</p>
        )
      ) : null}
      {preview.refusal ? <Notice tone="error">{preview.refusal}</Notice> : null}
    </div>
  );
}

/** Download the project's setup as JSON; coordinators import one (merge or replace). */
export function ExchangePanel({ projectId, canEdit }: { projectId: string; canEdit: boolean }) {
  return (
    <div className="flex flex-col gap-4">
      <Card>
        <h2 className="text-lg font-bold">Export</h2>
        <p className="mt-1 max-w-3xl text-sm text-ink-soft">
          One JSON document with the worksites, the operations and their limits, and the alpha table, to keep with the contract papers or to
          start a new contract from this one. Datasets, people and the downtime ledger are not included.
        </p>
        <a
          href={exportSetupUrl(projectId)}
          download
          className="mt-3 inline-flex min-h-11 items-center justify-center gap-2 rounded-lg bg-accent px-4 text-sm font-semibold text-accent-ink hover:brightness-110"
        >
          Download setup (.json)
        </a>
      </Card>
      {canEdit ? <ImportCard projectId={projectId} /> : null}
    </div>
  );
}

function ImportCard({ projectId }: { projectId: string }) {
  const id = useId();
  const run = useImportSetup(projectId);
  const [file, setFile] = useState<ReadFile | null>(null);
  const [mode, setMode] = useState<ImportMode>('merge');
  const [takeAlpha, setTakeAlpha] = useState(false);
  const [takeDataPoint, setTakeDataPoint] = useState(false);
  const [understood, setUnderstood] = useState(false);

  const onFile = async (f: File | undefined) => {
    run.reset();
    setFile(f ? await readSetupFile(f) : null);
  };
  const doc = file?.doc ?? null;
  const request = { mode, alphaTable: takeAlpha ? 'take' : 'keep', dataPoint: takeDataPoint ? 'take' : 'keep' } as const;
  const preview = useImportPreview(projectId, run.isSuccess ? null : doc, file?.key ?? '', request);
  const refused = preview.data?.refusal != null;
  const canRun = doc !== null && preview.isSuccess && !refused && (mode === 'merge' || understood) && !run.isPending;
  const fileHasDataPoint =
    doc !== null &&
    (doc.project.dataPointName.trim() !== '' || (doc.project.dataPointLatitude != null && doc.project.dataPointLongitude != null));

  return (
    <Card>
      <h2 className="text-lg font-bold">Import</h2>
      <p className="mt-1 max-w-3xl text-sm text-ink-soft">
        From a file exported here or by another project. It is checked in your browser first, then again by the server; nothing changes
        unless the whole file is accepted. Every added or deleted item is kept in the audit trail.
      </p>
      <div className="mt-3 flex flex-col gap-4">
        <div className="flex flex-wrap items-center gap-3">
          <FilePicker id={`${id}-file`} accept=".json,application/json" onFile={(f) => void onFile(f)}>
            Choose a setup file (.json)…
          </FilePicker>
          {file ? <span className="text-sm break-all">{file.fileName}</span> : null}
        </div>

        {file && file.problems.length > 0 ? (
          <Notice tone="error">
            <p className="font-semibold">{file.fileName} cannot be imported:</p>
            <ul className="mt-1 list-disc pl-5">
              {file.problems.map((p, i) => (
                <li key={i}>{p}</li>
              ))}
            </ul>
          </Notice>
        ) : null}

        {doc ? (
          <div className="rounded-lg border border-line bg-surface-2 p-3 text-sm">
            <p>
              <span className="font-semibold">“{doc.project.name}”</span>, exported{' '}
              {formatInstant(doc.exportedAt, localTimeZone(), 'dateTimeYear')}:
            </p>
            <ul className="mt-1 list-disc pl-5">
              <li>
                {doc.worksites.length} worksites
                {doc.worksites.length > 0
                  ? `: ${doc.worksites
                      .slice(0, 6)
                      .map((w) => `${w.name} (${withUnit(w.depth, 'm')})`)
                      .join(', ')}${doc.worksites.length > 6 ? ', …' : ''}`
                  : ''}
              </li>
              <li>
                {doc.operations.length} operations
                {doc.operations.length > 0
                  ? `: ${doc.operations
                      .slice(0, 6)
                      .map((o) => o.name)
                      .join(', ')}${doc.operations.length > 6 ? ', …' : ''}`
                  : ''}
              </li>
              <li>Alpha table: {alphaInFile(doc)}</li>
              <li>Data point: {fileHasDataPoint ? doc.project.dataPointName.trim() || 'a position without a name' : 'none'}</li>
            </ul>
          </div>
        ) : null}

        {doc ? (
          <div className="flex flex-col gap-1">
            <label className={`flex min-h-11 items-center gap-3 text-sm ${doc.alphaTable === undefined ? 'text-ink-soft' : ''}`}>
              <input
                type="checkbox"
                className="size-5 accent-[var(--color-accent)]"
                checked={takeAlpha}
                disabled={doc.alphaTable === undefined}
                onChange={(e) => {
                  setTakeAlpha(e.target.checked);
                  run.reset();
                }}
              />
              Take the file’s alpha table{doc.alphaTable === undefined ? ' (the file has none)' : ''}
            </label>
            <label className={`flex min-h-11 items-center gap-3 text-sm ${fileHasDataPoint ? '' : 'text-ink-soft'}`}>
              <input
                type="checkbox"
                className="size-5 accent-[var(--color-accent)]"
                checked={takeDataPoint}
                disabled={!fileHasDataPoint}
                onChange={(e) => {
                  setTakeDataPoint(e.target.checked);
                  run.reset();
                }}
              />
              Take the file’s data point{fileHasDataPoint ? '' : ' (the file has none)'}
            </label>
          </div>
        ) : null}

        <div role="radiogroup" aria-label="Import mode" className="flex flex-col gap-2">
          {IMPORT_MODES.map((m) => (
            <label
              key={m}
              className={`flex min-h-11 cursor-pointer items-start gap-3 rounded-lg border p-3 text-sm ${mode === m ? (m === 'replace' ? 'border-danger bg-danger-soft' : 'border-accent bg-ok-soft') : 'border-line'}`}
            >
              <input
                type="radio"
                name={`${id}-mode`}
                value={m}
                checked={mode === m}
                onChange={() => {
                  setMode(m);
                  setTakeAlpha(m === 'replace');
                  setUnderstood(false);
                  run.reset();
                }}
                className="mt-0.5 size-5 accent-[var(--color-accent)]"
              />
              <span>
                <span className="font-semibold">{MODE_TEXT[m].title}</span>
                {m === 'merge' ? <span className="text-ink-soft"> (default)</span> : null}
                <span className="block text-ink-soft">{MODE_TEXT[m].text}</span>
              </span>
            </label>
          ))}
        </div>

        {doc && !run.isSuccess ? (
          <div className="rounded-lg border border-line p-3">
            {preview.isPending ? <Spinner label="Working out what the import changes" /> : null}
            {preview.error ? <ErrorNotice error={preview.error} /> : null}
            {preview.data ? <PreviewList preview={preview.data} /> : null}
          </div>
        ) : null}

        {mode === 'replace' && !refused ? (
          <Notice tone="error">
            <p className="font-semibold">
              Replacing deletes this project’s worksites and operations, and everything listed above with them.
            </p>
            <p className="mt-1">The watch board and statistics change at once. Download the current setup first if you may want it back.</p>
            <label className="mt-2 flex min-h-11 items-center gap-3 font-semibold">
              <input
                type="checkbox"
                className="size-5 accent-[var(--color-danger)]"
                checked={understood}
                onChange={(e) => setUnderstood(e.target.checked)}
              />
              I understand: replace the whole setup
            </label>
          </Notice>
        ) : null}

        {run.error ? <ErrorNotice error={run.error} /> : null}
        {run.data ? <Notice tone="success">{resultText(run.data)}</Notice> : null}

        <div>
          <Button
            variant={mode === 'replace' ? 'danger' : 'primary'}
            disabled={!canRun}
            onClick={() => doc && run.mutate({ doc, request })}
          >
            {run.isPending ? 'Importing…' : mode === 'replace' ? 'Replace the setup' : 'Import and add'}
          </Button>
        </div>
      </div>
    </Card>
  );
}
