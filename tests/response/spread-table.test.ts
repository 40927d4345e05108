/**
 * The tabulated response (the moment tables over the spread tables) against the direct
 * integration it stands in for: the tabulation must keep the interpolation error below 0.5 % of m0 (docs/domain.md#vessel-response
 * allows a tabulation only on that condition). Checked on the demo's invented vessels, whose roll
 * peaks sharply, and on a table with a zero at head seas, over random partitions of both kinds,
 * every spreading, periods inside and outside the tables, and any relative direction.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  DEFAULT_RESPONSE_SEA,
  prepareRao,
  responseMoments,
  tabulatedResponseMoments,
  type ResponseSeaSettings,
  type SeaPartition,
} from '../../shared/response';
import { DEMO_VESSELS } from '../../seed/demo-vessels';
import { tableOf } from './raos';

/** Coarse on purpose: 2-25 s every 1 s, headings every 30 deg from 0 to 180 (mirrored). */
const COARSE = tableOf(
  'roll_deg_per_m',
  [0, 30, 60, 90, 120, 150, 180],
  Array.from({ length: 24 }, (_, i) => 2 + i),
  (t, h) => (3 * Math.sin((h * Math.PI) / 180)) / (1 + ((t - 9) / 1.5) ** 2),
);

const SPREADINGS: ResponseSeaSettings[] = [
  DEFAULT_RESPONSE_SEA,
  { ...DEFAULT_RESPONSE_SEA, windSeaSpreading: 'long-crested', swellSpreading: 'long-crested' },
  { ...DEFAULT_RESPONSE_SEA, windSeaGamma: 3.3, windSeaSpreading: 4, swellSpreading: 12 },
];

const partition = fc.record({
  kind: fc.constantFrom<'windSea' | 'swell'>('windSea', 'swell'),
  hsM: fc.double({ min: 0.2, max: 6, noNaN: true }),
  tpS: fc.double({ min: 2, max: 22, noNaN: true }),
  dirDeg: fc.double({ min: 0, max: 359.999, noNaN: true }),
});

describe('tabulated response', () => {
  const tables = [...DEMO_VESSELS.map((v) => v.raos), COARSE];
  it('stays within 0.5 % of the direct integration (m0 and m2), whatever the sea', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...tables),
        fc.constantFrom(...SPREADINGS),
        fc.array(partition, { minLength: 1, maxLength: 3 }),
        fc.double({ min: 0, max: 359.999, noNaN: true }),
        (table, settings, parts: SeaPartition[], heading) => {
          const rao = prepareRao(table);
          for (const name of rao.names) {
            const direct = responseMoments(rao, name, heading, parts, settings);
            const tab = tabulatedResponseMoments(rao, name, heading, parts, settings);
            // Judged on the response's own size, floored at 0.01 % of the largest m0 (m2) this sea can
            // give through this RAO (Hs^2/16 times max |RAO|^2; the frequency grid reaches 6 omega_p):
            // near a zero of the RAO (roll in head seas) the response itself is negligible.
            const maxAmp2 = Math.max(...rao.amplitudes[name]) ** 2;
            const m0Max = parts.reduce((e, p) => e + (p.hsM * p.hsM) / 16, 0) * maxAmp2;
            const m2Max = parts.reduce((e, p) => e + ((p.hsM * p.hsM) / 16) * ((12 * Math.PI) / p.tpS) ** 2, 0) * maxAmp2;
            const scale0 = Math.max(direct.m0, 1e-4 * m0Max);
            const scale2 = Math.max(direct.m2, 1e-4 * m2Max);
            expect(Math.abs(tab.m0 - direct.m0) / scale0, `${name} m0`).toBeLessThan(0.005);
            expect(Math.abs(tab.m2 - direct.m2) / scale2, `${name} m2`).toBeLessThan(0.005);
            expect(Math.abs(tab.m0Outside - direct.m0Outside)).toBeLessThanOrEqual(0.005 * scale0);
          }
        },
      ),
      { numRuns: 300, seed: 20261204 },
    );
  });

  it('gives no data where the direct integration does', () => {
    const rao = prepareRao(COARSE);
    const parts: SeaPartition[] = [{ kind: 'windSea', hsM: 1, tpS: NaN, dirDeg: 90 }];
    expect(tabulatedResponseMoments(rao, 'roll_deg_per_m', 0, parts, DEFAULT_RESPONSE_SEA).m0).toBeNaN();
  });
});
