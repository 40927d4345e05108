import type { RaoCsvProblem } from '../../../../shared/schemas/vessel';
import { ApiError } from '../../../lib/api';
import { HeadingRow } from '../../../components/ui/table';

/** The server's 400 details as problems (its messages repeat "line N, column C: " before the words). */
export function problemsOfError(error: unknown): RaoCsvProblem[] | null {
  if (!(error instanceof ApiError) || error.status !== 400 || !error.details) return null;
  return error.details.map((d) => ({
    line: typeof d.line === 'number' ? d.line : null,
    column: d.column ?? null,
    message: (d.message ?? '').replace(/^line \d+(, column [^:]+)?: /, ''),
  }));
}

/** Every problem of an RAO file: line, column and what is wrong, in a table. */
export function RaoProblems({ problems, heading }: { problems: RaoCsvProblem[]; heading: string }) {
  return (
    <div role="alert" className="rounded-lg border border-danger bg-danger-soft px-4 py-3 text-sm text-ink" data-testid="rao-problems">
      <p className="font-semibold">
        {heading} ({problems.length} problem{problems.length === 1 ? '' : 's'}; nothing was stored)
      </p>
      <table className="mt-2 w-full text-left">
        <thead>
          <HeadingRow headings={[{ label: 'Line', className: 'pr-3' }, { label: 'Column', className: 'pr-3' }, 'Problem']} />
        </thead>
        <tbody>
          {problems.map((p, i) => (
            <tr key={i} className="align-top">
              <td className="pr-3 tabular-nums">{p.line ?? 'whole file'}</td>
              <td className="pr-3">{p.column ?? '–'}</td>
              <td>{p.message}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
