import type { CalibratedAlphaAnswer, ForecastSkillAnswer } from '../../../../shared/api-types-skill';
import { trimmed } from '../../../lib/format';
import { Card } from '../../../components/ui';

const th = 'px-3 py-2 text-left text-xs font-semibold text-ink-soft';
const hsLabel = (from: number, to: number | null) =>
  to === null ? `Hs ≥ ${trimmed(from, 1)} m` : `Hs ${trimmed(from, 1)}–${trimmed(to, 1)} m`;
/** A statistic with three fixed decimals (aligned in the columns) and a true minus sign; never "−0.000". */
const num = (v: number | null, d = 3) => {
  if (v === null || !Number.isFinite(v)) return '–';
  const text = v.toFixed(d);
  return Number(text) === 0 ? (0).toFixed(d) : text.replace('-', '−');
};

/** Few distinct issues: the honest sample size is small (docs/domain.md#forecast-uncertainty). */
function FewMark({ issues, few }: { issues: number; few: number }) {
  if (issues >= few) return null;
  return (
    <span
      className="ml-1 rounded border border-danger px-1 text-[0.7rem] font-semibold text-danger"
      title={`Fewer than ${few} distinct forecast issues`}
    >
      ⚠ few issues
    </span>
  );
}

/** The skill bins: rows by lead time, columns by forecast Hs; mean and sd of ln(Hs_obs/Hs_fc) with the counts. */
export function BinsTable({ skill }: { skill: ForecastSkillAnswer }) {
  const hsBins = skill.bins.filter((b) => b.fromH === 0);
  const leads = skill.byLead;
  return (
    <Card className="overflow-x-auto !p-0 print-landscape">
      <table className="w-full min-w-[44rem] text-sm tabular-nums" data-testid="skill-bins">
        <caption className="sr-only">
          Log error ln(observed/forecast Hs) by lead time and forecast Hs: mean, standard deviation, pairs and issues
        </caption>
        <thead className="border-b border-line bg-surface-2">
          <tr>
            <th className={th}>Lead time</th>
            {hsBins.map((b) => (
              <th key={b.hsFrom} className={th}>
                {hsLabel(b.hsFrom, b.hsTo)}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {leads.map((l) => (
            <tr key={l.fromH} className="border-b border-line last:border-0 align-top">
              <th scope="row" className="px-3 py-2 text-left font-semibold">
                {l.fromH}–{l.toH} h
              </th>
              {skill.bins
                .filter((b) => b.fromH === l.fromH)
                .map((b) => (
                  <td key={b.hsFrom} className="px-3 py-2">
                    {b.pairs === 0 ? (
                      <span className="text-ink-soft">no pairs</span>
                    ) : (
                      <>
                        <div>
                          mean {num(b.mean)} · sd {num(b.sd)}
                        </div>
                        <div className="text-xs text-ink-soft">
                          {b.pairs} pairs · {b.issues} issues
                          <FewMark issues={b.issues} few={skill.fewIssues} />
                        </div>
                      </>
                    )}
                  </td>
                ))}
            </tr>
          ))}
        </tbody>
      </table>
    </Card>
  );
}

/** The calibrated table beside the default, cell by cell, with the bin and counts behind each value. */
export function CalibratedTable({ answer }: { answer: CalibratedAlphaAnswer }) {
  const t = answer.table;
  return (
    <Card className="overflow-x-auto !p-0 print-landscape">
      <table className="w-full min-w-[44rem] text-sm tabular-nums" data-testid="calibrated-alpha-table">
        <caption className="sr-only">
          Calibrated alpha beside the default alpha, by TPOP and Hs limit, with the counts behind each value
        </caption>
        <thead className="border-b border-line bg-surface-2">
          <tr>
            <th className={th}>TPOP up to</th>
            {t.hsColumnsM.map((hs) => (
              <th key={hs} className={th}>
                Hs {trimmed(hs, 2)} m: calibrated / default
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {t.tpopBoundsH.map((tpop, r) => (
            <tr key={tpop} className="border-b border-line last:border-0 align-top">
              <th scope="row" className="px-3 py-2 text-left font-semibold">
                {trimmed(tpop, 1)} h
                <div className="text-xs font-normal text-ink-soft">lead {trimmed(answer.cells[r][0].leadNeededH, 1)} h</div>
              </th>
              {answer.cells[r].map((c, j) => (
                <td key={j} className="px-3 py-2" data-testid={`alpha-cell-${r}-${j}`}>
                  <div>
                    <span className="text-base font-semibold">{trimmed(c.alpha, 3)}</span>
                    <span className="text-ink-soft"> / {trimmed(c.defaultAlpha, 3)}</span>
                  </div>
                  <div className="text-xs text-ink-soft">
                    {c.fallback ? (
                      <span className="font-semibold">no data: default kept</span>
                    ) : (
                      <>
                        μ {num(c.mean)} · σ {num(c.sd)}
                        <br />
                        {c.pairs} pairs · {c.issues} issues
                        <FewMark issues={c.issues} few={answer.fewIssues} />
                      </>
                    )}
                    <br />
                    bin {c.fromH}–{c.toH} h, {hsLabel(c.hsFrom, c.hsTo)}
                  </div>
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </Card>
  );
}
