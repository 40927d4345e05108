import { useId, useState } from 'react';
import { formatInstant, localTimeZone } from '../../../../shared/dates';
import type { z } from 'zod';
import { issuesInWords, problemSentence } from '../../../../shared/schemas/words';
import { IMPORT_MODES, ProjectSetupDocument, type ImportMode } from '../../../../shared/schemas/sites';
import type { ImportResultResponse } from '../../../../shared/api-types-sites';
import { Button, Card, ErrorNotice, Notice } from '../../../components/ui';
import { exportSetupUrl } from '../api/export-setup';
import { useImportSetup } from '../api/import-setup';
import { withUnit } from './format';

/** Largest setup file read in the browser, bytes (the document is small: names, numbers, tables). */
const MAX_FILE_BYTES = 5 * 1024 * 1024;

const MODE_TEXT: Record<ImportMode, { title: string; text: string }> = {
  merge: {
    title: 'Add to this project',
    text: 'The file’s worksites and operations are added next to the ones here. Nothing is added if a name is already used here.',
  },
  replace: {
    title: 'Replace this project’s setup',
    text: 'Every worksite and operation of this project is deleted first, then the file’s are added.',
  },
};

interface ReadFile {
  fileName: string;
  doc: ProjectSetupDocument | null;
  problems: string[];
}

async function readSetupFile(file: File): Promise<ReadFile> {
  if (file.size > MAX_FILE_BYTES) return { fileName: file.name, doc: null, problems: [`The file is larger than ${MAX_FILE_BYTES / 1024 / 1024} MB`] };
  let raw: unknown;
  try {
    raw = JSON.parse(await file.text());
  } catch (e) {
    return { fileName: file.name, doc: null, problems: [`Not a JSON document: ${(e as Error).message}`] };
  }
  const parsed = ProjectSetupDocument.safeParse(raw);
  if (parsed.success) return { fileName: file.name, doc: parsed.data, problems: [] };
  return {
    fileName: file.name,
    doc: null,
    problems: issuesInWords(parsed.error as z.ZodError, raw, 'The document').slice(0, 50).map(problemSentence),
  };
}

function alphaInFile(doc: ProjectSetupDocument): string {
  if (doc.alphaTable === undefined) return 'not in the file (this project’s table is kept)';
  if (doc.alphaTable === null) return 'the default table';
  return `its own table (${doc.alphaTable.tpopBoundsH.length} TPOP rows × ${doc.alphaTable.hsColumnsM.length} Hs columns)`;
}

function resultText(r: ImportResultResponse): string {
  const alpha = { set: 'the alpha table was set from the file', default: 'the alpha table went back to the default', kept: 'the alpha table was kept' }[
    r.alphaTable
  ];
  const deleted =
    r.mode === 'replace' ? ` Deleted first: ${r.worksites.deleted} worksites and ${r.operations.deleted} operations.` : '';
  return `Added ${r.worksites.created} worksites and ${r.operations.created} operations; ${alpha}.${deleted}`;
}

/** Download the project's setup as JSON; coordinators import one (merge or replace). */
export function ExchangePanel({ projectId, canEdit }: { projectId: string; canEdit: boolean }) {
  return (
    <div className="flex flex-col gap-4">
      <Card>
        <h2 className="text-lg font-bold">Export</h2>
        <p className="mt-1 max-w-3xl text-sm text-ink-soft">
          One JSON document with the worksites, the operations and their limits, and the alpha table, to keep with the contract
          papers or to start a new contract from this one. Datasets and people are not included.
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
  const [understood, setUnderstood] = useState(false);

  const onFile = async (f: File | undefined) => {
    run.reset();
    setFile(f ? await readSetupFile(f) : null);
  };
  const doc = file?.doc ?? null;
  const canRun = doc !== null && (mode === 'merge' || understood) && !run.isPending;

  return (
    <Card>
      <h2 className="text-lg font-bold">Import</h2>
      <p className="mt-1 max-w-3xl text-sm text-ink-soft">
        From a file exported here or by another project. It is checked in your browser first, then again by the server; nothing changes
        unless the whole file is accepted. Every added or deleted item is kept in the audit trail.
      </p>
      <div className="mt-3 flex flex-col gap-4">
        <div className="flex flex-wrap items-center gap-3">
          <label
            htmlFor={`${id}-file`}
            className="inline-flex min-h-11 cursor-pointer items-center rounded-lg border border-line bg-surface-2 px-4 text-sm font-semibold hover:border-accent"
          >
            Choose a setup file (.json)…
          </label>
          <input
            id={`${id}-file`}
            type="file"
            accept=".json,application/json"
            className="sr-only"
            onChange={(e) => {
              void onFile(e.target.files?.[0]);
              e.target.value = '';
            }}
          />
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
              <span className="font-semibold">“{doc.project.name}”</span>, exported {formatInstant(doc.exportedAt, localTimeZone(), 'dateTimeYear')}:
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
            </ul>
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

        {mode === 'replace' ? (
          <Notice tone="error">
            <p className="font-semibold">Replacing deletes this project’s worksites and operations.</p>
            <p className="mt-1">
              Skipper assignments and worksite hindcast choices go with them, and the watch board and statistics change at once. Download
              the current setup first if you may want it back.
            </p>
            <label className="mt-2 flex min-h-11 items-center gap-3 font-semibold">
              <input type="checkbox" className="size-5 accent-[var(--color-danger)]" checked={understood} onChange={(e) => setUnderstood(e.target.checked)} />
              I understand: replace the whole setup
            </label>
          </Notice>
        ) : null}

        {run.error ? <ErrorNotice error={run.error} /> : null}
        {run.data ? <Notice tone="success">{resultText(run.data)}</Notice> : null}

        <div>
          <Button variant={mode === 'replace' ? 'danger' : 'primary'} disabled={!canRun} onClick={() => doc && run.mutate({ doc, mode })}>
            {run.isPending ? 'Importing…' : mode === 'replace' ? 'Replace the setup' : 'Import and add'}
          </Button>
        </div>
      </div>
    </Card>
  );
}
