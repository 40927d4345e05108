import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, signIn, type Agent, type TestApp } from '../support/app';

let t: TestApp;
let client: Agent;

beforeAll(async () => {
  t = await createTestApp();
  client = await signIn(t.app, 'client@example.com');
});
afterAll(async () => {
  await t.close();
});

describe('wave calculator API', () => {
  it('answers one regular wave in SI units', async () => {
    const res = await client.get('/api/wave/regular').query({ period: 10, height: 2, depth: 3, z: -1.5 });
    expect(res.status, res.text).toBe(200);
    // SPM 1984 Chapter 2 worked problem, T = 10 s in d = 3 m: L ≈ 53.2 m, C ≈ 5.32 m/s (from memory).
    expect(res.body.wavelength).toBeCloseTo(53.2, 0);
    expect(res.body.celerity).toBeCloseTo(5.32, 1);
    // Common practice, no source: L0 = g T^2 / (2 pi) ≈ 1.56 T^2 m.
    expect(res.body.deepWaterWavelength).toBeCloseTo((9.81 * 100) / (2 * Math.PI), 6);
    expect(res.body.depthClass).toBe('intermediate');
    for (const key of [
      'groupCelerity',
      'n',
      'shoalingCoefficient',
      'bedVelocity',
      'bedExcursion',
      'energyDensity',
      'power',
      'horizontalVelocity',
      'verticalVelocity',
      'pressureFactor',
    ]) {
      expect(Number.isFinite(res.body[key]), key).toBe(true);
    }
    // Energy density E = rho g H^2 / 8 with rho = 1025 kg/m3, g = 9.81 m/s2 (docs/domain.md#units defaults).
    expect(res.body.energyDensity).toBeCloseTo((1025 * 9.81 * 4) / 8, 6);
  });

  it('names the field that is out of range or missing', async () => {
    const missing = await client.get('/api/wave/regular').query({ period: 10, height: 2 });
    expect(missing.status).toBe(400);
    expect(missing.body.error.details[0].field).toBe('depth');
    const below = await client.get('/api/wave/regular').query({ period: 10, height: 2, depth: 5, z: -6 });
    expect(below.status).toBe(400);
    expect(below.body.error.details[0].field).toBe('z');
    const tooLong = await client.get('/api/wave/table').query({ from: 0.001, to: 1, step: 0.0001 });
    expect(tooLong.status).toBe(400);
    expect(tooLong.body.error.message).toMatch(/2000 rows/);
  });

  it('draws profiles to the surface in deep water too (regression, 2026-12-01: the top point rounded above SWL)', async () => {
    for (const period of [3, 6, 8, 12]) {
      const res = await client.get('/api/wave/profile').query({ period, height: 2, depth: 200 });
      expect(res.status, `T = ${period} s`).toBe(200);
      expect(res.body.at(-1).z).toBe(0);
    }
  });

  it('answers the wave table and sea states', async () => {
    const table = await client.get('/api/wave/table').query({ from: 0.05, to: 0.5, step: 0.05 });
    expect(table.body).toHaveLength(10);
    const sea = await client.get('/api/wave/sea-state').query({ hs: 2, tp: 10, depth: 20 });
    expect(sea.status).toBe(200);
    expect(sea.body.periods.teS).toBeCloseTo(9, 6); // docs/domain.md#convention-8: Te = 0.90 Tp
    expect(sea.body.bedVelocityLinear).toBeGreaterThan(0);
    expect(sea.body.bedVelocitySoulsby).toBeGreaterThan(0);
  });

  it('Soulsby (2006): Hs 1 m, Tp 10 s, d 10 m gives U_s = 2 U_rms, about 0.40 m/s (by hand in tests/waves/sea-state.test.ts)', async () => {
    const sea = await client.get('/api/wave/sea-state').query({ hs: 1, tp: 10, depth: 10 });
    expect(sea.status).toBe(200);
    expect(Math.abs(sea.body.bedVelocitySoulsby - 0.4005)).toBeLessThan(1e-3);
    expect(Math.abs(sea.body.bedVelocitySoulsbyRms - 0.2003)).toBeLessThan(1e-3);
  });

  it('is for signed-in users only', async () => {
    expect((await request(t.app).get('/api/wave/regular').query({ period: 10, height: 2, depth: 3 })).status).toBe(401);
  });
});
