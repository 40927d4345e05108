// An RAO table in words and plots: its responses with units and points, its periods and headings,
// and each response against period (one line per heading). Used for the stored table and for the
// preview of a file before it is imported.
import { parseResponseColumn, responseLabel, responseUnit, type RaoTable } from '../../../../shared/response/rao';
import type { VesselRaosResponse } from '../../../../shared/api-types-vessels';
import { RaoPlot } from './rao-plot';

export type RaoView = Pick<VesselRaosResponse, 'periods' | 'headings' | 'responses'>;

/** A table as the client's reader gives it (shared/schemas/vessel.ts), in the API's shape. */
export function raoViewOf(table: RaoTable): RaoView {
  return {
    periods: table.periodsS,
    headings: table.headingsDeg,
    responses: Object.entries(table.responses).map(([response, values]) => ({
      response,
      label: responseLabel(response),
      unit: responseUnit(response),
      values,
    })),
  };
}

const round = (x: number) => Math.round(x * 1000) / 1000;

export function RaoTableView({ view, title }: { view: RaoView; title: string }) {
  const points = [...new Set(view.responses.map((r) => parseResponseColumn(r.response)?.point).filter((p): p is string => !!p))];
  const { periods, headings } = view;
  const mirrored = headings.length > 0 && headings[headings.length - 1] <= 180;
  return (
    <section className="flex flex-col gap-4" aria-label={title} data-testid="rao-table-view">
      <div className="grid gap-3 text-sm sm:grid-cols-2">
        <div>
          <h3 className="font-semibold">Responses</h3>
          <ul className="mt-1 list-disc pl-5" data-testid="rao-responses">
            {view.responses.map((r) => (
              <li key={r.response}>
                {r.label}{' '}
                <span className="text-ink-soft">
                  ({r.unit} per m of wave amplitude; column {r.response})
                </span>
              </li>
            ))}
          </ul>
          <p className="mt-2">
            <span className="font-semibold">Points:</span>{' '}
            <span data-testid="rao-points">{points.length > 0 ? points.join(', ') : 'none (motions of the vessel only)'}</span>
          </p>
        </div>
        <div>
          <h3 className="font-semibold">Grid</h3>
          <p className="mt-1">
            {periods.length} periods from {round(periods[0])} s to {round(periods[periods.length - 1])} s; {headings.length} relative
            headings: {headings.map((h) => `${h}°`).join(', ')}.
          </p>
          {mirrored ? (
            <p className="mt-1 text-ink-soft">Headings stop at 180°: the port side is taken as the mirror of the starboard side.</p>
          ) : null}
        </div>
      </div>
      {view.responses.map((r) => (
        <RaoPlot key={r.response} label={r.label} unit={r.unit} periods={periods} headings={headings} values={r.values} />
      ))}
    </section>
  );
}
