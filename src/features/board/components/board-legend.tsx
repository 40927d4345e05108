import { useState } from 'react';
import { CHANCE_WORDS, statusLabel } from '../../../../shared/status-words';
import { OCCURRENCE_META, STATUS_META, STATUS_ORDER } from './board-format';
import { isWideScreen } from './board-controls';

/** What the colours, letters, patterns and boxes of the board mean (open at first on wide screens). */
export function BoardLegend({ alpha }: { alpha: boolean }) {
  const [openAtFirst] = useState(isWideScreen);
  return (
    <details className="group rounded-[var(--radius-card)] border border-line bg-surface" open={openAtFirst}>
      <summary className="flex min-h-11 cursor-pointer list-none items-center gap-2 px-4 text-sm font-semibold select-none">
        <span aria-hidden className="transition group-open:rotate-90">
          ›
        </span>
        Key to the board
      </summary>
      <ul className="grid gap-x-6 gap-y-2 px-4 pb-3 text-sm sm:grid-cols-2 xl:grid-cols-3" data-testid="board-legend">
        {STATUS_ORDER.map((s) => (
          <li key={s} className="flex items-start gap-2">
            <span
              className={`mt-0.5 inline-flex size-6 shrink-0 items-center justify-center rounded text-xs font-bold ${STATUS_META[s].cell}`}
              aria-hidden
            >
              {STATUS_META[s].letter}
            </span>
            <span>
              <strong>{statusLabel(s)}</strong>:{' '}
              {s === 'workable' && !alpha ? 'every limit met at the operation limits OPLIM' : STATUS_META[s].explain}
              {s === 'marginal' && !alpha ? ' (cannot occur while forecast limits are off)' : ''}.
            </span>
          </li>
        ))}
        <li className="flex items-start gap-2">
          <span className="mt-0.5 inline-block h-6 w-10 shrink-0 rounded-md border-[3px] border-ink bg-st-workable" aria-hidden />
          <span>
            <strong>Outlined</strong>: a usable window, workable for at least TR = TPOP + TC.
          </span>
        </li>
        <li className="flex items-start gap-2" data-testid="legend-occurrence">
          <span className="mt-0.5 inline-flex h-3.5 w-10 shrink-0 overflow-hidden rounded-b-sm border border-t-0 border-ink/70" aria-hidden>
            <span className={`flex items-center px-0.5 text-[9px] leading-none font-bold ${OCCURRENCE_META.go.mark}`}>
              ↻{OCCURRENCE_META.go.letter}
            </span>
            <span className={`flex-1 opacity-60 ${OCCURRENCE_META.go.mark}`} />
          </span>
          <span>
            <strong>Tab along the top</strong>: an occurrence of a recurring operation (set on the Alerts page), over its TR hours from its
            start, judged{' '}
            {(['go', 'marginal', 'no_go', 'no_data'] as const)
              .map((k, i) => `${i ? ', ' : ''}${OCCURRENCE_META[k].letter} ${OCCURRENCE_META[k].word}`)
              .join('')}
            .
          </span>
        </li>
        <li className="flex items-start gap-2" data-testid="legend-chance">
          <span className="mt-2 inline-block h-1 w-10 shrink-0 rounded-sm bg-surface-2" aria-hidden>
            <span className="block h-full w-2/3 rounded-sm bg-ink" />
          </span>
          <span>
            <strong>Bar along an hour&rsquo;s foot</strong> (with an ensemble forecast): the {CHANCE_WORDS.hour}, the share of the
            forecast&rsquo;s runs workable on OPLIM; the figure on a window is its {CHANCE_WORDS.window}. The status letter still decides.
          </span>
        </li>
        <li className="flex items-start gap-2">
          <span className="mt-0.5 inline-block h-6 w-1 shrink-0 bg-lamp" aria-hidden />
          <span>
            <strong>Yellow line</strong>: now. A thick line between hours starts a new day at the worksite.
          </span>
        </li>
      </ul>
    </details>
  );
}
