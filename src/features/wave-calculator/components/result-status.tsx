import { ErrorNotice, Spinner } from '../../../components/ui';

/** The line above a result: what it was computed for, and whether it is being updated or is from earlier inputs. */
export function ResultStatus({ updating, lastValid, caption }: { updating: boolean; lastValid: boolean; caption: string }) {
  return (
    <p className="flex flex-wrap items-center gap-2 text-sm text-ink-soft" aria-live="polite">
      <span className="tabular-nums" data-testid="result-caption">
        {caption}
      </span>
      {updating ? (
        <span className="inline-flex items-center gap-1.5 text-xs">
          <span className="size-3 animate-spin rounded-full border-2 border-line border-t-accent" aria-hidden />
          Updating
        </span>
      ) : lastValid ? (
        <span className="rounded bg-surface-2 px-2 py-0.5 text-xs font-semibold text-ink">For the last valid inputs</span>
      ) : null}
    </p>
  );
}

/** The caution beside every result of linear theory. */
export function LinearTheoryCaution() {
  return (
    <p className="mt-4 border-l-4 border-st-marginal pl-3 text-sm text-ink" data-testid="linear-caution">
      Linear theory holds for waves of small amplitude. Steep waves, waves near breaking and waves in very shallow water need a higher-order
      theory (Stokes, cnoidal, stream function).
    </p>
  );
}

/** Before the first answer: the error that no field shows, or a spinner while the first answer is computed. */
export function FirstAnswerStatus({ error, computing, label }: { error: unknown; computing: boolean; label: string }) {
  return (
    <>
      <ErrorNotice error={error} />
      {computing ? <Spinner label={label} /> : null}
    </>
  );
}
