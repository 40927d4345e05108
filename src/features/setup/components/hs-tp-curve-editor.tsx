import { LIMIT_RANGES } from '../../../../shared/engine/schemas';
import { Button } from '../../../components/ui';
import { HeadingRow } from '../../../components/ui/table';
import { CellInput, GridErrors, rangeHint, RemoveButton, setPairAt, type PairListEditorProps, withoutAt } from './form-bits';
import { numberFromText } from './number-text';

const R = LIMIT_RANGES;

/** The two columns of a curve point: heading, the cell's label after "Curve point n", the error list's name. */
const POINT_COLUMNS = [
  { heading: 'Tp (s)', label: 'Tp, s', where: 'Tp' },
  { heading: 'Hs max (m)', label: 'Hs max, m', where: 'Hs' },
] as const;
const SIDES = [0, 1] as const;

/** The Hs–Tp limit curve as an editable point table. */
export function CurveEditor({ value: curve, onChange, errorOf }: PairListEditorProps) {
  const add = () => {
    const last = curve[curve.length - 1];
    const tp = last ? numberFromText(last[0]) : Number.NaN;
    onChange([...curve, [Number.isFinite(tp) ? String(tp + 2) : '', last?.[1] ?? '']]);
  };
  if (curve.length === 0) {
    return (
      <div className="flex flex-col gap-1">
        <span className="text-sm font-semibold">Hs–Tp limit curve</span>
        <p className="text-xs text-ink-soft">
          Hs max that changes with the peak period, e.g. from a vessel’s motion analysis. No-go outside its Tp range.
        </p>
        <div>
          <Button
            variant="secondary"
            onClick={() =>
              onChange([
                ['6', ''],
                ['10', ''],
              ])
            }
          >
            + Hs–Tp curve
          </Button>
        </div>
      </div>
    );
  }
  const messages: { where: string; message: string }[] = [];
  const root = errorOf('');
  if (root) messages.push({ where: 'Curve', message: root });
  curve.forEach((_, i) => {
    for (const k of SIDES) {
      const m = errorOf(`.${i}.${k}`);
      if (m) messages.push({ where: `Point ${i + 1} ${POINT_COLUMNS[k].where}`, message: m });
    }
  });
  return (
    <div className="flex flex-col gap-2">
      <span className="text-sm font-semibold">Hs–Tp limit curve</span>
      <p className="text-xs text-ink-soft">
        Points by ascending Tp, joined by straight lines; no-go outside the first and last Tp. Tp {rangeHint(R.tpS, 's')}, Hs{' '}
        {rangeHint(R.hsM, 'm')}. Where Hs max is also set, the lower of the two applies.
      </p>
      <table className="w-full max-w-sm text-sm">
        <thead>
          <HeadingRow
            className="text-left text-xs text-ink-soft"
            cellClassName="py-1 font-semibold"
            headings={[
              { label: '#', className: 'w-8 py-1 font-semibold' },
              ...POINT_COLUMNS.map((c) => c.heading),
              { label: <span className="sr-only">Remove</span>, className: '' },
            ]}
          />
        </thead>
        <tbody>
          {curve.map((p, i) => (
            <tr key={i}>
              <td className="py-1 text-ink-soft tabular-nums">{i + 1}</td>
              {SIDES.map((k) => (
                <td key={k} className="py-1 pr-2">
                  <CellInput
                    label={`Curve point ${i + 1} ${POINT_COLUMNS[k].label}`}
                    value={p[k]}
                    onValue={(t) => onChange(setPairAt(curve, i, k, t))}
                    error={errorOf(`.${i}.${k}`)}
                    className="!w-full"
                  />
                </td>
              ))}
              <td className="py-1">
                <RemoveButton label={`Remove curve point ${i + 1}`} what="point" onClick={() => onChange(withoutAt(curve, i))} />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <div className="flex flex-wrap gap-2">
        <Button variant="secondary" onClick={add}>
          + Point
        </Button>
        <Button variant="ghost" onClick={() => onChange([])}>
          Remove the curve
        </Button>
      </div>
      <GridErrors messages={messages} />
    </div>
  );
}
