import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { celerities, orbitalAt, regularWave } from '../../shared/waves';
import { refC, refCg, refK, relClose } from './reference-dispersion';

const G = 9.81;
const RHO = 1025;

const logUniform = (min: number, max: number) =>
  fc.double({ min: Math.log(min), max: Math.log(max), noNaN: true }).map((x) => Math.min(max, Math.max(min, Math.exp(x))));

describe('regularWave: worked example, Shore Protection Manual (1984) Ch. 2 (from memory)', () => {
  // SPM (1984) Chapter 2 example problem (from memory): a T = 10 s wave travels from d = 200 m to
  // d = 3 m. At 200 m d/L0 = 200/156 > 0.5: deep water, L = L0 = 156 m, C = 15.6 m/s.
  // At 3 m, from Table C-1, L = 53.2 m and C = 5.32 m/s (three significant figures as printed).
  it('T = 10 s, d = 200 m: deep water, L = 156 m, C = 15.6 m/s', () => {
    const w = regularWave({ heightM: 1, periodS: 10, depthM: 200 });
    expect(w.depthClass).toBe('deep');
    expect(Math.abs(w.wavelengthM - 156)).toBeLessThan(0.5);
    expect(Math.abs(w.celerityMps - 15.6)).toBeLessThan(0.05);
  });

  it('T = 10 s, d = 3 m: L = 53.2 m, C = 5.32 m/s (shallow water, d/L < 1/20 is not met: intermediate by a hair)', () => {
    const w = regularWave({ heightM: 1, periodS: 10, depthM: 3 });
    expect(Math.abs(w.wavelengthM - 53.2)).toBeLessThan(0.05);
    expect(Math.abs(w.celerityMps - 5.32)).toBeLessThan(0.005);
    // d/L = 3/53.2 = 0.0564: just above the 1/20 shallow-water bound (common practice).
    expect(w.depthClass).toBe('intermediate');
  });

  it('T = 10 s, d = 1 m: shallow water by d/L < 1/20, C within 2 % of sqrt(g d) (common practice, no source)', () => {
    const w = regularWave({ heightM: 0.5, periodS: 10, depthM: 1 });
    expect(w.depthClass).toBe('shallow');
    expect(w.celerityMps).toBeRelClose(Math.sqrt(G * 1), 0.02);
  });
});

describe('regularWave: facts of the trade (common practice, no source)', () => {
  it('C0 = gT/(2 pi), L0 = gT^2/(2 pi) ~ 1.56 T^2, Cg0 = C0/2', () => {
    for (const periodS of [2, 6.5, 10, 17]) {
      const w = regularWave({ heightM: 1, periodS, depthM: 30 });
      expect(w.deepWaterCelerityMps).toBeCloseTo((G * periodS) / (2 * Math.PI), 12);
      expect(w.deepWaterWavelengthM).toBeCloseTo((G * periodS * periodS) / (2 * Math.PI), 10);
      expect(w.deepWaterWavelengthM).toBeRelClose(1.56 * periodS * periodS, 0.002);
      expect(w.deepWaterGroupCelerityMps).toBeCloseTo(w.deepWaterCelerityMps / 2, 12);
    }
  });

  it('C -> sqrt(g d) and n -> 1 in shallow water; C -> C0, n -> 1/2, Ks -> 1 in deep water', () => {
    const shallow = regularWave({ heightM: 0.1, periodS: 30, depthM: 0.2 });
    // kd ~ 0.03 here: C/sqrt(gd) ~ 1 - (kd)^2/6 and n ~ 1 - (kd)^2/3 (series of tanh and sinh).
    expect(shallow.celerityMps).toBeRelClose(Math.sqrt(G * 0.2), 3e-4);
    expect(shallow.n).toBeGreaterThan(0.999);
    const deep = regularWave({ heightM: 1, periodS: 8, depthM: Infinity });
    expect(deep.celerityMps).toBe(deep.deepWaterCelerityMps);
    expect(deep.n).toBe(0.5);
    expect(deep.shoalingCoefficient).toBe(1);
    expect(deep.groupCelerityMps).toBe(deep.deepWaterCelerityMps / 2);
  });

  it('depth class by d/L: deep above 1/2, shallow below 1/20, intermediate between', () => {
    expect(regularWave({ heightM: 1, periodS: 4, depthM: 50 }).depthClass).toBe('deep');
    expect(regularWave({ heightM: 1, periodS: 8, depthM: 20 }).depthClass).toBe('intermediate');
    expect(regularWave({ heightM: 1, periodS: 14, depthM: 2 }).depthClass).toBe('shallow');
    expect(regularWave({ heightM: 1, periodS: 14, depthM: Infinity }).depthClass).toBe('deep');
  });

  it('energy density E = rho g H^2 / 8 and power P = E Cg (Airy theory, SPM 1984 Ch. 2)', () => {
    const w = regularWave({ heightM: 2, periodS: 9, depthM: 15 });
    expect(w.energyDensityJPerM2).toBeCloseTo((RHO * G * 4) / 8, 9);
    expect(w.powerWPerM).toBeRelClose(((RHO * G * 4) / 8) * refCg(9, 15), 1e-12);
    const fresh = regularWave({ heightM: 2, periodS: 9, depthM: 15, rhoKgM3: 1000, g: 9.80665 });
    expect(fresh.energyDensityJPerM2).toBeCloseTo((1000 * 9.80665 * 4) / 8, 9);
  });

  it('agrees with the written-out formulas for L, C, Cg, Ks, u_b, A_b (independent bisection oracle)', () => {
    fc.assert(
      fc.property(logUniform(0.5, 30), logUniform(0.05, 6000), fc.double({ min: 0, max: 20, noNaN: true }), (periodS, depthM, heightM) => {
        const w = regularWave({ heightM, periodS, depthM });
        const k = refK(periodS, depthM);
        const kd = k * depthM;
        const ub = kd > 700 ? 0 : (Math.PI * heightM) / (periodS * Math.sinh(kd));
        const ab = kd > 700 ? 0 : heightM / (2 * Math.sinh(kd));
        const c0 = (G * periodS) / (2 * Math.PI);
        return (
          relClose(w.wavelengthM, (2 * Math.PI) / k, 1e-11) &&
          relClose(w.celerityMps, refC(periodS, depthM), 1e-11) &&
          relClose(w.groupCelerityMps, refCg(periodS, depthM), 1e-11) &&
          relClose(w.shoalingCoefficient, Math.sqrt(c0 / 2 / refCg(periodS, depthM)), 1e-11) &&
          Math.abs(w.bedVelocityMps - ub) <= 1e-11 * ub + 1e-300 &&
          Math.abs(w.bedExcursionM - ab) <= 1e-11 * ab + 1e-300
        );
      }),
      { numRuns: 2000 },
    );
  });

  it('Ks >= 0.913 everywhere (minimum near d/L0 = 0.15) and grows without bound in very shallow water', () => {
    // The minimum of Ks = H/H0' is about 0.913 (SPM 1984 Table C-1, from memory).
    let minKs = Infinity;
    for (let i = 0; i < 2000; i++) {
      const depthM = 0.05 * Math.pow(6000 / 0.05, i / 1999);
      minKs = Math.min(minKs, regularWave({ heightM: 1, periodS: 10, depthM }).shoalingCoefficient);
    }
    expect(minKs).toBeGreaterThan(0.9125);
    expect(minKs).toBeLessThan(0.9135);
    expect(regularWave({ heightM: 1, periodS: 20, depthM: 0.1 }).shoalingCoefficient).toBeGreaterThan(3);
  });
});

describe('orbitalAt: u(z), w(z), Kp(z) (docs/domain.md#dispersion; SPM 1984 Ch. 2; CEM Part II-1)', () => {
  it('matches the cosh/sinh formulas where they do not overflow', () => {
    const w = regularWave({ heightM: 1.5, periodS: 7, depthM: 12 });
    const k = refK(7, 12);
    const amp = (Math.PI * 1.5) / 7;
    for (const z of [0, -1, -3.3, -6, -11.9, -12]) {
      const o = orbitalAt(w, z);
      expect(o.horizontalVelocityMps).toBeRelClose((amp * Math.cosh(k * (z + 12))) / Math.sinh(k * 12), 1e-12);
      expect(Math.abs(o.verticalVelocityMps - (amp * Math.sinh(k * (z + 12))) / Math.sinh(k * 12))).toBeLessThan(1e-13);
      expect(o.pressureFactor).toBeRelClose(Math.cosh(k * (z + 12)) / Math.cosh(k * 12), 1e-12);
    }
  });

  it('at the surface w = pi H/T and Kp = 1; at the bed w = 0, u = u_b and Kp = 1/cosh(kd)', () => {
    const w = regularWave({ heightM: 2, periodS: 11, depthM: 18 });
    const top = orbitalAt(w, 0);
    expect(top.pressureFactor).toBeCloseTo(1, 14);
    expect(top.verticalVelocityMps).toBeCloseTo((Math.PI * 2) / 11, 13);
    expect(top.verticalExcursionM).toBeCloseTo(1, 13); // H/2
    const bed = orbitalAt(w, -18);
    expect(bed.verticalVelocityMps).toBe(0);
    expect(bed.horizontalVelocityMps).toBeCloseTo(w.bedVelocityMps, 14);
    expect(bed.horizontalExcursionM).toBeCloseTo(w.bedExcursionM, 14);
    expect(bed.pressureFactor).toBeCloseTo(1 / Math.cosh(refK(11, 18) * 18), 13);
  });

  it('deep water: u = w = (pi H/T) exp(kz) and Kp = exp(kz), finite where cosh(kd) overflows', () => {
    const w = regularWave({ heightM: 1, periodS: 0.5, depthM: 6000 }); // kd ~ 9.7e4
    const k = refK(0.5, Infinity);
    const o = orbitalAt(w, -0.1);
    expect(o.horizontalVelocityMps).toBeRelClose(((Math.PI * 1) / 0.5) * Math.exp(-0.1 * k), 1e-12);
    expect(o.verticalVelocityMps).toBeRelClose(o.horizontalVelocityMps, 1e-12);
    expect(o.pressureFactor).toBeRelClose(Math.exp(-0.1 * k), 1e-12);
    const bed = orbitalAt(w, -6000);
    expect(bed.horizontalVelocityMps).toBe(0);
    expect(bed.pressureFactor).toBe(0);
    const infinite = orbitalAt({ heightM: 1, periodS: 10, depthM: Infinity }, -20);
    expect(infinite.pressureFactor).toBeRelClose(Math.exp(-20 * refK(10, Infinity)), 1e-13);
  });

  it('no NaN, u >= w >= 0, and u, w, Kp decrease with depth below the surface (fast-check sweep)', () => {
    fc.assert(
      fc.property(
        logUniform(0.5, 30),
        logUniform(0.05, 6000),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (periodS, depthM, f1, f2) => {
          const w = regularWave({ heightM: 1, periodS, depthM });
          const [upper, lower] = [-Math.min(f1, f2) * depthM, -Math.max(f1, f2) * depthM];
          const a = orbitalAt(w, upper);
          const b = orbitalAt(w, lower);
          const all = [a, b].flatMap((o) => [o.horizontalVelocityMps, o.verticalVelocityMps, o.pressureFactor]);
          return (
            all.every(Number.isFinite) &&
            a.horizontalVelocityMps >= a.verticalVelocityMps - 1e-15 &&
            b.verticalVelocityMps >= 0 &&
            b.horizontalVelocityMps <= a.horizontalVelocityMps * (1 + 1e-14) &&
            b.verticalVelocityMps <= a.verticalVelocityMps * (1 + 1e-14) + 1e-300 &&
            b.pressureFactor <= a.pressureFactor * (1 + 1e-14) &&
            a.pressureFactor <= 1 + 1e-15
          );
        },
      ),
      { numRuns: 3000 },
    );
  });

  it('u_b -> 0 in deep water and -> (H/2) sqrt(g/d) in shallow water (docs/domain.md#dispersion)', () => {
    const deep = regularWave({ heightM: 2, periodS: 6, depthM: 200 });
    expect(deep.bedVelocityMps).toBeLessThan(1e-8);
    expect(regularWave({ heightM: 2, periodS: 6, depthM: Infinity }).bedVelocityMps).toBe(0);
    const shallow = regularWave({ heightM: 0.2, periodS: 20, depthM: 0.5 });
    expect(shallow.bedVelocityMps).toBeRelClose(0.1 * Math.sqrt(G / 0.5), 0.003);
  });

  it('accepts the parameters instead of a wave and throws RangeError outside -d <= z <= 0', () => {
    const params = { heightM: 1, periodS: 10, depthM: 10 };
    expect(orbitalAt(params, -5).horizontalVelocityMps).toBe(orbitalAt(regularWave(params), -5).horizontalVelocityMps);
    expect(() => orbitalAt(params, 0.01)).toThrow(RangeError);
    expect(() => orbitalAt(params, -10.01)).toThrow(RangeError);
    expect(() => orbitalAt(params, NaN)).toThrow(RangeError);
    expect(() => orbitalAt({ ...params, depthM: Infinity }, 1)).toThrow(RangeError);
  });
});

describe('regularWave and celerities: input checks', () => {
  it('throws RangeError for bad inputs', () => {
    expect(() => regularWave({ heightM: -1, periodS: 10, depthM: 10 })).toThrow(RangeError);
    expect(() => regularWave({ heightM: NaN, periodS: 10, depthM: 10 })).toThrow(RangeError);
    expect(() => regularWave({ heightM: 1, periodS: 0, depthM: 10 })).toThrow(RangeError);
    expect(() => regularWave({ heightM: 1, periodS: 10, depthM: 0 })).toThrow(RangeError);
    expect(() => regularWave({ heightM: 1, periodS: 10, depthM: 10, rhoKgM3: 0 })).toThrow(RangeError);
    expect(() => celerities(10, NaN)).toThrow(RangeError);
  });

  it('a zero height is allowed and gives zero velocities and energy', () => {
    const w = regularWave({ heightM: 0, periodS: 10, depthM: 10 });
    expect(w.bedVelocityMps).toBe(0);
    expect(w.energyDensityJPerM2).toBe(0);
    expect(w.powerWPerM).toBe(0);
  });
});
