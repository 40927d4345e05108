import { LIMIT_RANGES } from '../../../../shared/engine/schemas';
import { Button } from '../../../components/ui';
import { CellInput, GridErrors } from './form-bits';
import { numberFromText } from './number-text';

const R = LIMIT_RANGES;
const rangeHint = (r: { min: number; max: number }, unit: string) => `${r.min}–${r.max} ${unit}`;

/** The Hs–Tp limit curve as an editable point table. */
export function CurveEditor({
  curve,
  onChange,
  errorOf,
}: {
  curve: [string, string][];
  onChange: (next: [string, string][]) => void;
  errorOf: (suffix: string) => string | undefined;
}) {
  const set = (i: number, k: 0 | 1, text: string) => onChange(curve.map((p, r) => (r === i ? (k === 0 ? [text, p[1]] : [p[0], text]) : p)));
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
    const a = errorOf(`.${i}.0`);
    const b = errorOf(`.${i}.1`);
    if (a) messages.push({ where: `Point ${i + 1} Tp`, message: a });
    if (b) messages.push({ where: `Point ${i + 1} Hs`, message: b });
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
          <tr className="text-left text-xs text-ink-soft">
            <th className="w-8 py-1 font-semibold">#</th>
            <th className="py-1 font-semibold">Tp (s)</th>
            <th className="py-1 font-semibold">Hs max (m)</th>
            <th>
              <span className="sr-only">Remove</span>
            </th>
          </tr>
        </thead>
        <tbody>
          {curve.map((p, i) => (
            <tr key={i}>
              <td className="py-1 text-ink-soft tabular-nums">{i + 1}</td>
              <td className="py-1 pr-2">
                <CellInput
                  label={`Curve point ${i + 1} Tp, s`}
                  value={p[0]}
                  onValue={(t) => set(i, 0, t)}
                  error={errorOf(`.${i}.0`)}
                  className="!w-full"
                />
              </td>
              <td className="py-1 pr-2">
                <CellInput
                  label={`Curve point ${i + 1} Hs max, m`}
                  value={p[1]}
                  onValue={(t) => set(i, 1, t)}
                  error={errorOf(`.${i}.1`)}
                  className="!w-full"
                />
              </td>
              <td className="py-1">
                <Button
                  variant="ghost"
                  className="!px-2 text-xs text-ink-soft"
                  onClick={() => onChange(curve.filter((_, r) => r !== i))}
                  aria-label={`Remove curve point ${i + 1}`}
                  title="Remove this point"
                >
                  Remove
                </Button>
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
