import { Button } from '../../../components/ui';
import { GridErrors, PairCells, RemoveButton, setPairAt, type PairListEditorProps, withoutAt } from './form-bits';

/** Excluded Tp bands (closed: both edges excluded), e.g. a vessel's roll resonance. */
export function BandsEditor({ value: bands, onChange, errorOf }: PairListEditorProps) {
  const messages: { where: string; message: string }[] = [];
  bands.forEach((_, i) => {
    for (const [suffix, where] of [
      [`.${i}`, `Band ${i + 1}`],
      [`.${i}.0`, `Band ${i + 1} from`],
      [`.${i}.1`, `Band ${i + 1} to`],
    ] as const) {
      const m = errorOf(suffix);
      if (m) messages.push({ where, message: m });
    }
  });
  return (
    <div className="flex flex-col gap-2">
      <span className="text-sm font-semibold">Excluded Tp bands</span>
      <p className="text-xs text-ink-soft">No-go when Tp is inside a band, both edges included, e.g. a vessel’s roll resonance.</p>
      {bands.length > 0 ? (
        <ul className="flex flex-col gap-2">
          {bands.map((b, i) => (
            <li key={i} className="flex flex-wrap items-center gap-2 text-sm">
              <span className="w-14 text-ink-soft">Band {i + 1}</span>
              <PairCells
                pair={b}
                labels={[`Excluded band ${i + 1} from, s`, `Excluded band ${i + 1} to, s`]}
                errors={[errorOf(`.${i}.0`) ?? errorOf(`.${i}`), errorOf(`.${i}.1`) ?? errorOf(`.${i}`)]}
                onValue={(k, t) => onChange(setPairAt(bands, i, k, t))}
                className="!w-20"
              />
              <span className="text-ink-soft">s</span>
              <RemoveButton label={`Remove excluded band ${i + 1}`} what="band" onClick={() => onChange(withoutAt(bands, i))} />
            </li>
          ))}
        </ul>
      ) : null}
      <div>
        <Button variant="secondary" onClick={() => onChange([...bands, ['', '']])}>
          + Excluded band
        </Button>
      </div>
      <GridErrors messages={messages} />
    </div>
  );
}
