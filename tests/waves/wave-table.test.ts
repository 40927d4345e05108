import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { waveTable, waveTableRow, WAVE_TABLE_MAX_ROWS } from '../../shared/waves';
import { bisectKd, matchesSigFigs, relClose } from './reference-dispersion';

/**
 * Rows of the Shore Protection Manual (1984), Appendix C, Table C-1 ("Functions of d/L for
 * even increments of d/L0"), columns d/L, 2 pi d/L, tanh, sinh, cosh, H/H0' (= Ks), K (= 1/cosh).
 * ALL VALUES FROM MEMORY: only the entries recalled with confidence are listed; each is checked to
 * 4 significant figures (half a unit of the last printed figure). The CEM EM 1110-2-1100 Part II-1
 * uses the same functions (its Table II-1-1 and figures), so these rows stand for both.
 */
const SPM_TABLE_C1_FROM_MEMORY: { dOverL0: number; expected: Partial<Record<string, number>> }[] = [
  {
    dOverL0: 0.01,
    expected: { dOverL: 0.04032, kd: 0.2533, tanhKd: 0.248, sinhKd: 0.256, coshKd: 1.032, shoalingCoefficient: 1.435 },
  },
  { dOverL0: 0.05, expected: { kd: 0.5916, tanhKd: 0.531 } },
  { dOverL0: 0.1, expected: { dOverL: 0.141, tanhKd: 0.7093, coshKd: 1.419, bedPressureFactor: 0.7049 } },
  { dOverL0: 0.5, expected: { dOverL: 0.5018, kd: 3.153, tanhKd: 0.9964 } },
];

describe('waveTableRow against SPM (1984) Appendix C Table C-1 (from memory), 4 significant figures', () => {
  for (const { dOverL0, expected } of SPM_TABLE_C1_FROM_MEMORY) {
    it(`d/L0 = ${dOverL0}`, () => {
      const row = waveTableRow(dOverL0) as unknown as Record<string, number>;
      for (const [column, value] of Object.entries(expected)) {
        expect({ column, actual: row[column], ok: matchesSigFigs(row[column], value as number, 4) }).toEqual({
          column,
          actual: row[column],
          ok: true,
        });
      }
    });
  }

  it('the minimum of Ks = H/H0 is 0.913 near d/L0 = 0.15 (SPM 1984 Table C-1, from memory; 3 significant figures)', () => {
    const rows = waveTable(0.1, 0.2, 0.001);
    const min = rows.reduce((a, b) => (b.shoalingCoefficient < a.shoalingCoefficient ? b : a));
    expect(matchesSigFigs(min.shoalingCoefficient, 0.913, 3)).toBe(true);
    expect(min.dOverL0).toBeGreaterThan(0.13);
    expect(min.dOverL0).toBeLessThan(0.17);
  });
});

describe('waveTableRow: identities and limits (common practice, no source)', () => {
  it('columns are consistent: kd tanh kd = 2 pi d/L0, cosh^2 - sinh^2 = 1, Ks = 1/sqrt(2 n tanh), Cg/C0 = n tanh, L/L0 = tanh', () => {
    fc.assert(
      fc.property(fc.double({ min: Math.log(1e-5), max: Math.log(100), noNaN: true }).map(Math.exp), (x) => {
        const dOverL0 = Math.min(100, x);
        const r = waveTableRow(dOverL0);
        const finite = Object.values(r).every((v) => Number.isFinite(v));
        const kdRef = bisectKd(2 * Math.PI * dOverL0);
        const nRef = r.kd > 300 ? 0.5 : 0.5 * (1 + (2 * r.kd) / Math.sinh(2 * r.kd));
        return (
          finite &&
          relClose(r.kd, kdRef, 1e-12) &&
          relClose(r.dOverL, kdRef / (2 * Math.PI), 1e-12) &&
          relClose(r.lOverL0, dOverL0 / r.dOverL, 1e-12) &&
          relClose(r.tanhKd, Math.tanh(kdRef), 1e-12) &&
          relClose(r.sinhKd, Math.sinh(kdRef), 1e-10) &&
          relClose(r.coshKd, Math.cosh(kdRef), 1e-10) &&
          // cosh^2 - sinh^2 loses digits to cancellation above kd ~ 5.
          (r.kd > 5 || relClose(r.coshKd * r.coshKd - r.sinhKd * r.sinhKd, 1, 1e-9)) &&
          relClose(r.n, nRef, 1e-12) &&
          relClose(r.cgOverC0, nRef * Math.tanh(kdRef), 1e-12) &&
          relClose(r.shoalingCoefficient, 1 / Math.sqrt(2 * nRef * Math.tanh(kdRef)), 1e-12) &&
          relClose(r.bedPressureFactor, 1 / r.coshKd, 1e-15)
        );
      }),
      { numRuns: 2000 },
    );
  });

  it('deep-water end: d/L0 = 100 gives finite sinh and cosh, tanh = 1, n = 1/2, Ks = 1', () => {
    const r = waveTableRow(100);
    expect(Number.isFinite(r.sinhKd) && Number.isFinite(r.coshKd)).toBe(true);
    expect(r.sinhKd).toBeGreaterThan(1e270);
    expect(r.tanhKd).toBe(1);
    expect(r.n).toBe(0.5);
    expect(r.shoalingCoefficient).toBe(1);
    expect(r.dOverL).toBe(100);
  });

  it('shallow-water end: d/L -> sqrt(d/L0 / (2 pi)), n -> 1', () => {
    const r = waveTableRow(1e-6);
    expect(r.dOverL).toBeRelClose(Math.sqrt(1e-6 / (2 * Math.PI)), 1e-5);
    expect(r.n).toBeGreaterThan(0.99999);
  });

  it('throws RangeError outside 0 < d/L0 <= 100 or for NaN', () => {
    expect(() => waveTableRow(0)).toThrow(RangeError);
    expect(() => waveTableRow(-0.1)).toThrow(RangeError);
    expect(() => waveTableRow(100.0001)).toThrow(RangeError);
    expect(() => waveTableRow(NaN)).toThrow(RangeError);
  });
});

describe('waveTable', () => {
  it('gives the rows from `from` to `to` inclusive, on a clean grid', () => {
    const rows = waveTable(0.1, 0.5, 0.1);
    expect(rows.map((r) => r.dOverL0)).toEqual([0.1, 0.2, 0.3, 0.4, 0.5]);
    expect(waveTable(0.25, 0.25, 0.01)).toHaveLength(1);
    expect(waveTable(0.001, 0.002, 0.0001).map((r) => r.dOverL0)[10]).toBe(0.002);
  });

  it(`allows ${WAVE_TABLE_MAX_ROWS} rows and throws RangeError beyond`, () => {
    expect(waveTable(0.0001, 0.2, 0.0001)).toHaveLength(2000);
    expect(() => waveTable(0.0001, 0.2001, 0.0001)).toThrow(RangeError);
    expect(() => waveTable(0.001, 10, 0.001)).toThrow(RangeError);
  });

  it('throws RangeError for a bad range or step', () => {
    expect(() => waveTable(0.5, 0.1, 0.1)).toThrow(RangeError);
    expect(() => waveTable(0, 0.1, 0.01)).toThrow(RangeError);
    expect(() => waveTable(0.1, 200, 1)).toThrow(RangeError);
    expect(() => waveTable(0.1, 0.2, 0)).toThrow(RangeError);
    expect(() => waveTable(0.1, 0.2, -0.01)).toThrow(RangeError);
    expect(() => waveTable(0.1, 0.2, NaN)).toThrow(RangeError);
    expect(() => waveTable(NaN, 0.2, 0.1)).toThrow(RangeError);
  });
});
