import { orbitalAt, regularWave, seaState, waveTable } from '../../shared/waves';
import type { RegularWaveQuery, SeaStateQuery, WaveTableQuery } from '../../shared/schemas/wave';

/** One regular wave by linear theory, in SI units (see README for the fields). */
export function regularWaveAnswer(q: RegularWaveQuery) {
  const w = regularWave({ heightM: q.height, periodS: q.period, depthM: q.depth });
  const answer: Record<string, number | string> = {
    period: w.periodS,
    height: w.heightM,
    depth: w.depthM,
    wavelength: w.wavelengthM,
    celerity: w.celerityMps,
    groupCelerity: w.groupCelerityMps,
    n: w.n,
    waveNumber: w.waveNumberRadPerM,
    deepWaterWavelength: w.deepWaterWavelengthM,
    deepWaterCelerity: w.deepWaterCelerityMps,
    depthOverWavelength: w.depthOverWavelength,
    depthClass: w.depthClass,
    shoalingCoefficient: w.shoalingCoefficient,
    bedVelocity: w.bedVelocityMps,
    bedExcursion: w.bedExcursionM,
    energyDensity: w.energyDensityJPerM2,
    power: w.powerWPerM,
  };
  if (q.z !== undefined) {
    const o = orbitalAt(w, q.z);
    answer.z = q.z;
    answer.horizontalVelocity = o.horizontalVelocityMps;
    answer.verticalVelocity = o.verticalVelocityMps;
    answer.pressureFactor = o.pressureFactor;
  }
  return answer;
}

/** Profiles of u(z), w(z) and Kp(z) from the bed to the surface, for the calculator's plot. */
export function regularWaveProfile(q: RegularWaveQuery, points = 41) {
  const w = regularWave({ heightM: q.height, periodS: q.period, depthM: q.depth });
  // In water deeper than half a wavelength the motion has died out: plot down to L/2 at most.
  const bottom = -Math.min(q.depth, w.wavelengthM / 2);
  return Array.from({ length: points }, (_, i) => {
    // Exactly 0 at the top: bottom + (0 - bottom)*1 can round to a tiny positive z above SWL.
    const z = i === points - 1 ? 0 : bottom * (1 - i / (points - 1));
    const o = orbitalAt(w, z);
    return { z, u: o.horizontalVelocityMps, w: o.verticalVelocityMps, kp: o.pressureFactor };
  });
}

export function waveTableAnswer(q: WaveTableQuery) {
  return waveTable(q.from, q.to, q.step);
}

export function seaStateAnswer(q: SeaStateQuery) {
  const s = seaState({ hsM: q.hs, tpS: q.tp, tzS: q.tz, teS: q.te, gamma: q.gamma, depthM: q.depth });
  return {
    hs: s.hsM,
    depth: s.depthM,
    periods: s.periods,
    energy: s.energyJPerM2,
    power: s.powerWPerM,
    peakWavelength: s.peakWavelengthM,
    bedVelocityLinear: s.bedVelocityLinearMps,
    bedVelocitySoulsby: s.bedVelocitySoulsbyMps,
    bedVelocitySoulsbyRms: s.bedVelocityRmsSoulsbyMps,
  };
}
