import type { ReactNode } from 'react';
import { SeaStateForm } from '../../../../shared/schemas/wave';
import { Card } from '../../../components/ui';
import { useSeaState, type SeaStateAnswer } from '../api/get-sea-state';
import { formatSig } from '../utils/format-number';
import type { RawFields } from '../utils/validate-fields';
import { useCalculator } from '../utils/use-calculator';
import { CalculatorPanel, type NumberFieldSpec } from './number-field';
import { withSub } from './symbol';
import { QuantityList } from './quantity-list';
import { LinearTheoryCaution, ResultStatus } from './result-status';

export type SeaStateFields = RawFields<'hs' | 'tp' | 'tz' | 'te' | 'gamma' | 'depth'>;

export const DEFAULT_SEA_STATE_FIELDS: SeaStateFields = { hs: '2', tp: '10', tz: '', te: '', gamma: '', depth: '20' };

/** The inputs' card: its heading (for screen readers), its grid and its fields. */
const SEA_STATE_INPUTS = {
  titleId: 'sea-inputs-title',
  title: 'Sea state inputs',
  className: 'grid gap-3 sm:grid-cols-2 lg:grid-cols-3',
  fields: [
    { name: 'hs', id: 'ss-hs', label: 'Significant wave height Hs', unit: 'm', hint: 'Spectral Hm0, 0 to 25 m' },
    { name: 'tp', id: 'ss-tp', label: 'Peak period Tp', unit: 's', hint: 'Give at least one of Tp, Tz, Te' },
    { name: 'depth', id: 'ss-depth', label: 'Water depth d', unit: 'm', hint: '0.05 to 6000 m' },
    { name: 'tz', id: 'ss-tz', label: 'Zero-crossing period Tz', unit: 's', placeholder: 'optional', hint: 'Derived from Tp when blank' },
    { name: 'te', id: 'ss-te', label: 'Energy period Te', unit: 's', placeholder: 'optional', hint: 'Tm−1,0; derived from Tp when blank' },
    { name: 'gamma', id: 'ss-gamma', label: 'Peak enhancement γ', placeholder: '3.3', hint: 'JONSWAP, 1 to 7; blank means 3.3' },
  ] satisfies NumberFieldSpec<keyof SeaStateFields>[],
};

/** Sea-state mode: Hs and any of Tp, Tz, Te; derived periods, energy, power and bed velocity by both methods. */
export function SeaStatePanel({ fields, onChange }: { fields: SeaStateFields; onChange: (fields: SeaStateFields) => void }) {
  const calculation = useCalculator(SeaStateForm, fields, onChange, useSeaState);
  const { check, answer: sea, stale } = calculation;
  const typing = check.typing;

  return (
    <CalculatorPanel
      inputs={SEA_STATE_INPUTS}
      calculation={calculation}
      results={(a) => (
        <div className={`grid grid-cols-1 gap-4 lg:grid-cols-2 ${stale && !typing ? 'opacity-80' : ''}`}>
          <Card aria-labelledby="periods-title" className="self-start">
            <div className="mb-3 flex flex-wrap items-baseline justify-between gap-2">
              <h2 id="periods-title" className="text-lg font-bold">
                Periods
              </h2>
              <ResultStatus
                updating={typing || sea.isFetching}
                lastValid={!check.data}
                caption={`Hs = ${formatSig(a.hs)} m · d = ${formatSig(a.depth)} m · γ = ${formatSig(a.periods.gamma, 3)}`}
              />
            </div>
            <PeriodTable answer={a} />
            <p className="mt-3 text-xs text-ink-soft">
              Ratios between the periods of a JONSWAP spectrum with peak enhancement γ (DNV-RP-C205). Te = 0.90 Tp at γ = 3.3 is the
              product's convention (the integrated spectrum gives 0.903); at any other γ, Te/Tp comes from the integrated spectrum. Periods
              you give are used as given, even where they disagree with the ratios.
            </p>
          </Card>
          <Card aria-labelledby="sea-results-title">
            <h2 id="sea-results-title" className="mb-3 text-lg font-bold">
              Energy, power and bed velocity
            </h2>
            <div className="grid gap-5">
              <QuantityList
                title="Energy"
                items={[
                  { id: 'energy', label: 'Energy density', symbol: withSub('E = ρgH', 's', '²/16'), value: a.energy, unit: 'J/m²' },
                  {
                    id: 'power',
                    label: 'Wave power per metre of crest',
                    symbol: 'P',
                    value: a.power / 1000,
                    unit: 'kW/m',
                    note: (
                      <>
                        E · C<sub>g</sub> at the energy period T<sub>e</sub> and depth d
                      </>
                    ),
                  },
                ]}
              />
              <QuantityList
                title="Wavelength at the peak period"
                items={[
                  {
                    id: 'peak-wavelength',
                    label: 'Peak wavelength',
                    symbol: withSub('L', 'p'),
                    value: a.peakWavelength,
                    unit: 'm',
                    note: 'Linear theory at Tp and depth d',
                  },
                  {
                    id: 'depth-over-peak-wavelength',
                    label: 'Relative depth',
                    symbol: withSub('d/L', 'p'),
                    value: a.depth / a.peakWavelength,
                    unit: '–',
                  },
                ]}
              />
              <QuantityList
                title="Near-bed orbital velocity, significant"
                items={[
                  {
                    id: 'bed-velocity-linear',
                    label: 'Linear significant',
                    symbol: withSub('u', 'bs'),
                    value: a.bedVelocityLinear,
                    unit: 'm/s',
                    note: (
                      <>
                        πH<sub>s</sub> / (T<sub>p</sub> sinh k<sub>p</sub>d): one wave of height Hs at Tp
                      </>
                    ),
                  },
                  {
                    id: 'bed-velocity-soulsby',
                    label: 'Soulsby (2006)',
                    symbol: withSub('U', 's'),
                    value: a.bedVelocitySoulsby,
                    unit: 'm/s',
                    note: withSub('2 · U', 'rms', ': the significant value, from Tz (HR Wallingford TR 155)'),
                  },
                ]}
              />
              <QuantityList
                title="Near-bed orbital velocity, root-mean-square"
                items={[
                  {
                    id: 'bed-velocity-soulsby-rms',
                    label: 'RMS of the near-bed velocity, Soulsby (2006)',
                    symbol: withSub('U', 'rms'),
                    value: a.bedVelocitySoulsbyRms,
                    unit: 'm/s',
                    note: 'The standard deviation of the velocity over time; not an amplitude, not for a limit stated as significant',
                  },
                ]}
              />
              <BedVelocityNote answer={a} />
            </div>
            <LinearTheoryCaution />
          </Card>
        </div>
      )}
    />
  );
}

function SourceBadge({ given, children }: { given: boolean; children: ReactNode }) {
  return (
    <span
      className={`inline-block rounded px-1.5 py-0.5 text-xs font-semibold ${given ? 'bg-ok-soft text-ink' : 'border border-dashed border-line text-ink-soft'}`}
    >
      {children}
    </span>
  );
}

function PeriodTable({ answer: a }: { answer: SeaStateAnswer }) {
  const p = a.periods;
  const ratio = (x: number) => formatSig(x, 4, true);
  const rows: { id: string; name: string; symbol: ReactNode; value: number; given: boolean; how: ReactNode }[] = [
    {
      id: 'tp',
      name: 'Peak period',
      symbol: withSub('T', 'p'),
      value: p.tpS,
      given: p.sources.tp === 'given',
      how:
        p.sources.tp === 'tz' ? (
          <>from Tz: Tp = Tz / {ratio(p.tzS / p.tpS)}</>
        ) : p.sources.tp === 'te' ? (
          <>from Te: Tp = Te / {ratio(p.teS / p.tpS)}</>
        ) : null,
    },
    {
      id: 'tz',
      name: 'Mean zero-crossing period',
      symbol: withSub('T', 'z'),
      value: p.tzS,
      given: p.sources.tz === 'given',
      how: p.sources.tz === 'tp' ? <>Tz = {ratio(p.tzS / p.tpS)} × Tp</> : null,
    },
    {
      id: 'te',
      name: 'Energy period',
      symbol: withSub('T', 'e'),
      value: p.teS,
      given: p.sources.te === 'given',
      how: p.sources.te === 'tp' ? <>Te = {ratio(p.teS / p.tpS)} × Tp</> : null,
    },
  ];
  return (
    <dl className="divide-y divide-line">
      {rows.map((r) => (
        <div key={r.id} className="flex items-baseline justify-between gap-3 py-2" data-testid={`period-${r.id}`}>
          <dt className="min-w-0 text-sm">
            {r.name} <span className="font-serif italic">{r.symbol}</span>
            <span className="mt-0.5 flex flex-wrap items-center gap-2 text-xs text-ink-soft">
              <SourceBadge given={r.given}>{r.given ? 'given' : 'derived'}</SourceBadge>
              {r.how}
            </span>
          </dt>
          <dd className="shrink-0 text-right tabular-nums">
            <span className="font-semibold">{formatSig(r.value, 4, true)}</span>
            <span className="ml-1 inline-block min-w-10 text-left text-sm text-ink-soft">s</span>
          </dd>
        </div>
      ))}
    </dl>
  );
}

function BedVelocityNote({ answer: a }: { answer: SeaStateAnswer }) {
  const { bedVelocityLinear: lin, bedVelocitySoulsby: sou } = a;
  // Below a millimetre per second both are "no motion at the bed"; a percentage would be noise.
  const negligible = lin < 1e-3 && sou < 1e-3;
  const diff = lin > 0 ? ((sou - lin) / lin) * 100 : NaN;
  return (
    <p className="rounded-lg border border-line bg-surface-2 px-3 py-2 text-sm" data-testid="bed-velocity-note">
      {negligible ? (
        'Both methods give practically no motion at the bed: the water is deep for these periods.'
      ) : (
        <>
          The two methods differ
          {Number.isFinite(diff) ? (
            <>
              {' '}
              (here Soulsby is <span className="tabular-nums">{formatSig(Math.abs(diff), 2)} %</span> {diff < 0 ? 'lower' : 'higher'})
            </>
          ) : null}
          . An operation&apos;s bed-velocity limit names the method it is checked with.
        </>
      )}
    </p>
  );
}
