import { lazy, Suspense } from 'react';
import { RegularWaveForm } from '../../../../shared/schemas/wave';
import type { DepthClass } from '../../../../shared/waves/regular-wave';
import { Card, ErrorNotice, Notice, Spinner } from '../../../components/ui';
import { useRegularWave, type RegularWaveAnswer } from '../api/get-regular-wave';
import { useWaveProfile } from '../api/get-wave-profile';
import { breakingCheck } from '../utils/breaking-check';
import { formatSig } from '../utils/format-number';
import type { RawFields } from '../utils/validate-fields';
import { useCalculator } from '../utils/use-calculator';
import { LinearTheoryCaution, ResultStatus } from './result-status';
import { CalculatorPanel, type NumberFieldSpec } from './number-field';
import { withSub } from './symbol';
import { QuantityList } from './quantity-list';

// The chart library is large: it arrives in its own chunk when the first result is drawn.
const ProfileChart = lazy(() => import('./profile-chart'));

export type RegularFields = RawFields<'period' | 'height' | 'depth' | 'z'>;

/** A 10 s swell, 2 m high, in 10 m of water: the example the handbooks like. */
export const DEFAULT_REGULAR_FIELDS: RegularFields = { period: '10', height: '2', depth: '10', z: '' };

/** The inputs' card: its heading (for screen readers), its grid and its fields. */
const REGULAR_INPUTS = {
  titleId: 'regular-inputs-title',
  title: 'Regular wave inputs',
  className: 'grid gap-3 sm:grid-cols-2 lg:grid-cols-4',
  fields: [
    { name: 'period', id: 'rw-period', label: 'Wave period T', unit: 's', hint: '0.5 to 30 s' },
    { name: 'height', id: 'rw-height', label: 'Wave height H', unit: 'm', hint: 'Crest to trough, 0 to 40 m' },
    { name: 'depth', id: 'rw-depth', label: 'Water depth d', unit: 'm', hint: 'Still-water depth, 0.05 to 6000 m' },
    {
      name: 'z',
      id: 'rw-z',
      label: 'Elevation z',
      unit: 'm',
      placeholder: 'optional',
      hint: 'Up from still water: 0 at the surface, −d at the bed',
    },
  ] satisfies NumberFieldSpec<keyof RegularFields>[],
};

const DEPTH_CLASS_WORDS: Record<DepthClass, string> = {
  deep: 'Deep water',
  intermediate: 'Intermediate depth',
  shallow: 'Shallow water',
};

/** Regular-wave mode: inputs, every linear-theory quantity with its unit, and u, w, Kp over depth. */
export function RegularWavePanel({ fields, onChange }: { fields: RegularFields; onChange: (fields: RegularFields) => void }) {
  const calculation = useCalculator(RegularWaveForm, fields, onChange, useRegularWave);
  const { check, answer: wave, stale } = calculation;
  const profile = useWaveProfile(check.data ? { period: check.data.period, height: check.data.height, depth: check.data.depth } : null);
  const typing = check.typing;

  return (
    <CalculatorPanel
      inputs={REGULAR_INPUTS}
      calculation={calculation}
      after={<TheoryNote />}
      results={(a) => (
        <div className="grid grid-cols-1 gap-4 lg:grid-cols-2">
          <Card aria-labelledby="regular-results-title" className={stale && !typing ? 'opacity-80' : ''}>
            <div className="mb-3 flex flex-wrap items-baseline justify-between gap-2">
              <h2 id="regular-results-title" className="text-lg font-bold">
                Results
              </h2>
              <ResultStatus
                updating={typing || wave.isFetching}
                lastValid={!check.data}
                caption={`T = ${formatSig(a.period)} s · H = ${formatSig(a.height)} m · d = ${formatSig(a.depth)} m`}
              />
            </div>
            <DepthClassBanner answer={a} />
            <div className="mt-4 grid gap-5">
              <WaveResults answer={a} />
            </div>
            <SteepnessNote answer={a} />
            <LinearTheoryCaution />
          </Card>

          <Card aria-labelledby="profile-title" className={`self-start lg:sticky lg:top-4 ${stale && !typing ? 'opacity-80' : ''}`}>
            <h2 id="profile-title" className="text-lg font-bold">
              Orbital motion over depth
            </h2>
            <p className="mb-3 text-sm text-ink-soft">
              Amplitudes of the horizontal and vertical orbital velocity, u(z) and w(z), and the pressure response factor Kp(z), from the
              bed up to still water level.
            </p>
            {profile.data ? (
              <Suspense fallback={<div className="h-80 animate-pulse rounded-lg bg-surface-2" aria-hidden />}>
                <ProfileChart points={profile.data} depthM={a.depth} wavelengthM={a.wavelength} zM={a.z} />
              </Suspense>
            ) : profile.error ? (
              <ErrorNotice error={profile.error} />
            ) : (
              <Spinner label="Drawing the profile" />
            )}
          </Card>
        </div>
      )}
    />
  );
}

function DepthClassBanner({ answer: a }: { answer: RegularWaveAnswer }) {
  return (
    <div className="rounded-lg border border-line bg-surface-2 px-4 py-3" data-testid="depth-class">
      <p className="text-base font-bold">{DEPTH_CLASS_WORDS[a.depthClass]}</p>
      <p className="text-sm text-ink-soft">
        <span className="tabular-nums">
          <i className="font-serif">d/L</i> = {formatSig(a.depthOverWavelength)}
        </span>
        {' · '}deep water above 0.5, shallow water below 0.05 (common practice)
      </p>
    </div>
  );
}

function WaveResults({ answer: a }: { answer: RegularWaveAnswer }) {
  const hasZ = a.z !== undefined && a.horizontalVelocity !== undefined;
  return (
    <>
      <QuantityList
        title="The wave at this depth"
        items={[
          { id: 'wavelength', label: 'Wavelength', symbol: 'L', value: a.wavelength, unit: 'm' },
          { id: 'celerity', label: 'Celerity (phase speed)', symbol: 'C', value: a.celerity, unit: 'm/s' },
          { id: 'group-celerity', label: 'Group celerity', symbol: withSub('C', 'g'), value: a.groupCelerity, unit: 'm/s' },
          { id: 'n', label: 'Group to phase speed', symbol: withSub('n = C', 'g', '/C'), value: a.n, unit: '–' },
          { id: 'wave-number', label: 'Wavenumber', symbol: 'k', value: a.waveNumber, unit: 'rad/m' },
        ]}
      />
      <QuantityList
        title="Deep water, same period"
        items={[
          {
            id: 'deep-water-wavelength',
            label: 'Deep-water wavelength',
            symbol: withSub('L', '0'),
            value: a.deepWaterWavelength,
            unit: 'm',
          },
          { id: 'deep-water-celerity', label: 'Deep-water celerity', symbol: withSub('C', '0'), value: a.deepWaterCelerity, unit: 'm/s' },
          {
            id: 'shoaling-coefficient',
            label: 'Shoaling coefficient',
            symbol: withSub('K', 's'),
            value: a.shoalingCoefficient,
            unit: '–',
            note: (
              <>
                From deep water: H/H<sub>0</sub> = √(C<sub>g0</sub>/C<sub>g</sub>)
              </>
            ),
          },
        ]}
      />
      <QuantityList
        title="At the seabed"
        items={[
          { id: 'bed-velocity', label: 'Orbital velocity amplitude', symbol: withSub('u', 'b'), value: a.bedVelocity, unit: 'm/s' },
          { id: 'bed-excursion', label: 'Orbital excursion amplitude', symbol: withSub('A', 'b'), value: a.bedExcursion, unit: 'm' },
        ]}
      />
      <QuantityList
        title="Energy"
        items={[
          { id: 'energy-density', label: 'Energy density', symbol: <>E = ρgH²/8</>, value: a.energyDensity, unit: 'J/m²' },
          { id: 'power', label: 'Power per metre of crest', symbol: withSub('P = E C', 'g'), value: a.power / 1000, unit: 'kW/m' },
        ]}
      />
      {hasZ ? (
        <QuantityList
          title={<>At elevation z = {formatSig(a.z)} m</>}
          items={[
            { id: 'horizontal-velocity', label: 'Horizontal velocity amplitude', symbol: 'u(z)', value: a.horizontalVelocity, unit: 'm/s' },
            { id: 'vertical-velocity', label: 'Vertical velocity amplitude', symbol: 'w(z)', value: a.verticalVelocity, unit: 'm/s' },
            {
              id: 'pressure-factor',
              label: 'Pressure response factor',
              symbol: withSub('K', 'p', '(z)'),
              value: a.pressureFactor,
              unit: '–',
            },
          ]}
        />
      ) : (
        <p className="text-sm text-ink-soft">Give an elevation z to see u(z), w(z) and Kp(z) at that level.</p>
      )}
    </>
  );
}

function SteepnessNote({ answer: a }: { answer: RegularWaveAnswer }) {
  if (a.height === 0) return null;
  const { steepness, limit, breaking } = breakingCheck(a.height, a.wavelength, a.waveNumber, a.depth);
  const text = (
    <>
      Steepness H/L = {formatSig(steepness, 3, true)}; a wave breaks above H/L = 0.142 tanh(kd) = {formatSig(limit, 3, true)} (Miche).
    </>
  );
  return (
    <div className="mt-4" data-testid="steepness">
      {breaking ? (
        <Notice tone="error">{text} This wave is too steep to exist: the figures above are not meaningful for it.</Notice>
      ) : (
        <p className="text-sm text-ink-soft">{text}</p>
      )}
    </div>
  );
}

function TheoryNote() {
  return (
    <p className="text-xs text-ink-soft" data-testid="theory-note">
      Linear (Airy) wave theory as in the Shore Protection Manual (1984) and the Coastal Engineering Manual (EM 1110-2-1100, Part II-1); the
      wavenumber solves ω² = gk tanh(kd), started from the explicit formula of Fenton &amp; McKee (1990) and refined by Newton steps. g =
      9.81 m/s², seawater ρ = 1025 kg/m³.
    </p>
  );
}
