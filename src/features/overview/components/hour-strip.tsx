import type { HourStatus } from '../../../../shared/api-types-plan';
import { formatInstant } from '../../../../shared/dates';

/** Status colours and letters of the hour strip (the board's code: colour, letter and pattern). */
const STRIP: Record<HourStatus, { word: string; letter: string; cell: string }> = {
  workable: { word: 'workable', letter: 'W', cell: 'bg-st-workable' },
  marginal: { word: 'marginal', letter: 'M', cell: 'bg-st-marginal pattern-marginal' },
  not_workable: { word: 'not workable', letter: 'X', cell: 'bg-st-notworkable pattern-notworkable' },
  no_data: { word: 'no data', letter: '?', cell: 'bg-st-nodata pattern-nodata' },
};

export const statusWord = (s: HourStatus | undefined) => (s ? STRIP[s].word : 'no data');

/** The next hours as a thin strip of coloured cells, with the first and last hour named below. */
export function HourStrip({ times, status, timeZone }: { times: string[]; status: HourStatus[]; timeZone: string }) {
  if (times.length === 0) return <p className="text-xs text-ink-soft">No forecast hours ahead.</p>;
  const counts = status.reduce<Record<string, number>>((c, s) => ({ ...c, [s]: (c[s] ?? 0) + 1 }), {});
  const summary = (Object.keys(STRIP) as HourStatus[])
    .filter((s) => counts[s])
    .map((s) => `${counts[s]} h ${STRIP[s].word}`)
    .join(', ');
  return (
    <figure className="min-w-0">
      <div
        role="img"
        aria-label={`Next ${times.length} hours: ${summary}`}
        className="flex h-5 w-full overflow-hidden rounded"
        data-testid="hour-strip"
      >
        {status.map((s, i) => (
          <span
            key={times[i]}
            className={`h-full min-w-0 flex-1 ${STRIP[s].cell}`}
            title={`${formatInstant(times[i], timeZone, 'dateTime')}: ${STRIP[s].word}`}
          />
        ))}
      </div>
      <figcaption className="mt-1 flex justify-between text-xs text-ink-soft">
        <span>{formatInstant(times[0], timeZone, 'dateTime')}</span>
        <span>{formatInstant(Date.parse(times[times.length - 1]) + 3_600_000, timeZone, 'dateTime')}</span>
      </figcaption>
    </figure>
  );
}
