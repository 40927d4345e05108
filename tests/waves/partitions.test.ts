// Partitions through the worksite transformation (docs/domain.md#partitions), checked against hand
// calculations written here: shoaling Ks = sqrt(Cg_src/Cg_site) from an independent dispersion
// solver (reference-dispersion.ts, bisection), energies adding as sqrt(sum Hs_i^2) (common
// practice, no source), the linear bed velocity pi*Hs/(Tp*sinh(k*d)) (docs/domain.md#sea-states,
// common practice) combined as the root of the sum of squares.
import { describe, expect, it } from 'vitest';
import {
  PARTITIONED_FLAG,
  TRANSFORM_FLAG,
  totalFromPartitions,
  transformPartitionedToSite,
  transformToSite,
  type PartitionInput,
  type SeaSeriesInput,
  type SiteGeometry,
} from '../../shared/waves';
import { refCg, refK } from './reference-dispersion';

const DEEP = { depthM: Infinity };
const G = 9.81;

/** Deep-water group celerity, g*T/(4*pi) (linear theory, common practice). */
const cg0 = (t: number) => (G * t) / (4 * Math.PI);
/** Shoaling coefficient from deep water, by hand. */
const ksHand = (t: number, d: number) => Math.sqrt(cg0(t) / refCg(t, d, G));
/** Linear significant bed velocity by hand. */
const uHand = (hs: number, t: number, d: number) => (Math.PI * hs) / (t * Math.sinh(refK(t, d, G) * d));

const f = (xs: number[]) => Float64Array.from(xs);

function total(hs: number[], tp: number[], dir: number[]): SeaSeriesInput {
  return { hsM: f(hs), tpS: f(tp), tzS: new Float64Array(hs.length).fill(NaN), dirDeg: f(dir) };
}

describe('energy sum of partitions (common practice, no source)', () => {
  it('total Hs is the root of the sum of squares', () => {
    expect(totalFromPartitions([1.2, 1.6])).toBeCloseTo(2.0, 12); // 1.44 + 2.56 = 4
    expect(totalFromPartitions([3, 4, 0])).toBeCloseTo(5, 12);
    expect(totalFromPartitions([0.8])).toBe(0.8);
  });
});

describe('transformPartitionedToSite', () => {
  const site: SiteGeometry = { depthM: 15, shoreNormalDeg: null, breakerIndex: 0.6 };

  it('without partitions equals transformToSite exactly', () => {
    const input = total([1.5, NaN, 2], [8, 9, 11], [250, 260, 270]);
    const a = transformPartitionedToSite(input, undefined, DEEP, site);
    const b = transformToSite(input, DEEP, site);
    expect(Array.from(a.hsM)).toEqual(Array.from(b.hsM));
    expect(Array.from(a.bedVelocityLinearMps)).toEqual(Array.from(b.bedVelocityLinearMps));
    expect(Array.from(a.tpS)).toEqual([8, 9, 11]);
    expect(Number.isNaN(a.partitions.swell1.hsM[0])).toBe(true);
  });

  it('combines a wind sea and a swell at the worksite as a hand calculation does', () => {
    // Wind sea 1.0 m, 5 s and swell 1.2 m, 14 s, both from deep water to 15 m, no refraction.
    const parts: PartitionInput = {
      windSea: { hsM: f([1.0]), tpS: f([5]), dirDeg: f([240]) },
      swell1: { hsM: f([1.2]), tpS: f([14]), dirDeg: f([250]) },
    };
    const input = total([Math.hypot(1.0, 1.2)], [14], [250]);
    const out = transformPartitionedToSite(input, parts, DEEP, site);
    const hsW = 1.0 * ksHand(5, 15);
    const hsS = 1.2 * ksHand(14, 15);
    expect(out.partitions.windSea.hsM[0]).toBeCloseTo(hsW, 9);
    expect(out.partitions.swell1.hsM[0]).toBeCloseTo(hsS, 9);
    expect(out.partitions.swell2.hsM[0]).toBe(0); // not in the dataset: absent
    expect(out.hsM[0]).toBeCloseTo(Math.sqrt(hsW ** 2 + hsS ** 2), 9);
    // The swell shoals more (long period feels the bottom) and is the larger: it gives Tp and direction.
    expect(out.tpS[0]).toBe(14);
    expect(out.dirDeg[0]).toBe(250);
    expect(out.partitions.windSea.tpS[0]).toBe(5);
    expect(out.bedVelocityLinearMps[0]).toBeCloseTo(Math.hypot(uHand(hsW, 5, 15), uHand(hsS, 14, 15)), 9);
    expect(out.flags[0] & PARTITIONED_FLAG).toBe(PARTITIONED_FLAG);
    expect(out.flags[0] & TRANSFORM_FLAG.DEPTH_LIMITED).toBe(0);
  });

  it('refracts each partition with its own period and direction (Snell, straight contours)', () => {
    const bearing: SiteGeometry = { depthM: 10, shoreNormalDeg: 270, breakerIndex: 0.78 };
    const parts: PartitionInput = {
      windSea: { hsM: f([0.6]), tpS: f([4]), dirDeg: f([300]) },
      swell1: { hsM: f([0.9]), tpS: f([13]), dirDeg: f([240]) },
    };
    const out = transformPartitionedToSite(total([Math.hypot(0.6, 0.9)], [13], [240]), parts, DEEP, bearing);
    // Swell: theta_src = -30 deg; sin(theta_site) = C_site/C0 sin(theta_src) (Snell's law).
    const c0 = (G * 13) / (2 * Math.PI);
    const cSite = (2 * Math.PI) / 13 / refK(13, 10, G);
    const sinSite = (cSite / c0) * Math.sin((-30 * Math.PI) / 180);
    const kr = Math.sqrt(Math.cos((-30 * Math.PI) / 180) / Math.sqrt(1 - sinSite ** 2));
    expect(out.partitions.swell1.hsM[0]).toBeCloseTo(0.9 * ksHand(13, 10) * kr, 9);
    expect(out.partitions.swell1.dirDeg[0]).toBeCloseTo(270 + (Math.asin(sinSite) * 180) / Math.PI, 9);
    // The 4 s wind sea is deep at 10 m (k*d about 2.5): small Ks, and its own smaller turn.
    expect(Math.abs(out.partitions.windSea.dirDeg[0] - 300)).toBeLessThan(Math.abs(out.partitions.swell1.dirDeg[0] - 240));
  });

  it('caps the total at gamma_b*d and scales every partition in proportion', () => {
    const shallow: SiteGeometry = { depthM: 3, shoreNormalDeg: null, breakerIndex: 0.6 };
    const parts: PartitionInput = {
      windSea: { hsM: f([1.5]), tpS: f([6]), dirDeg: f([200]) },
      swell1: { hsM: f([2.0]), tpS: f([15]), dirDeg: f([240]) },
    };
    const out = transformPartitionedToSite(total([2.5], [15], [240]), parts, DEEP, shallow);
    const hsW = 1.5 * ksHand(6, 3);
    const hsS = 2.0 * ksHand(15, 3);
    const scale = (0.6 * 3) / Math.hypot(hsW, hsS);
    expect(scale).toBeLessThan(1);
    expect(out.hsM[0]).toBeCloseTo(1.8, 12);
    expect(out.partitions.windSea.hsM[0]).toBeCloseTo(hsW * scale, 9);
    expect(out.partitions.swell1.hsM[0]).toBeCloseTo(hsS * scale, 9);
    expect(out.flags[0] & TRANSFORM_FLAG.DEPTH_LIMITED).toBe(TRANSFORM_FLAG.DEPTH_LIMITED);
  });

  it('takes Tp from the most energetic partition at the worksite, not at the data point', () => {
    // At the data point the 6 s wind sea is larger; at 4 m the 16 s swell shoals past it.
    const parts: PartitionInput = {
      windSea: { hsM: f([0.5]), tpS: f([6]), dirDeg: f([200]) },
      swell1: { hsM: f([0.46]), tpS: f([16]), dirDeg: f([240]) },
    };
    const shallow: SiteGeometry = { depthM: 4, shoreNormalDeg: null, breakerIndex: 0.6 };
    expect(0.46 * ksHand(16, 4)).toBeGreaterThan(0.5 * ksHand(6, 4)); // hand check of the premise
    const out = transformPartitionedToSite(total([Math.hypot(0.5, 0.46)], [6], [200]), parts, DEEP, shallow);
    expect(out.tpS[0]).toBe(16);
  });

  it('keeps the total chain for a record whose partitions are missing, and a zero partition is absent', () => {
    const parts: PartitionInput = {
      windSea: { hsM: f([NaN, 0]), tpS: f([5, NaN]), dirDeg: f([200, NaN]) },
      swell1: { hsM: f([1, 1]), tpS: f([12, 12]), dirDeg: f([250, 250]) },
    };
    const input = total([1.2, 1], [12, 12], [250, 250]);
    const out = transformPartitionedToSite(input, parts, DEEP, site);
    const plain = transformToSite(input, DEEP, site);
    expect(out.hsM[0]).toBe(plain.hsM[0]);
    expect(Number.isNaN(out.partitions.swell1.hsM[0])).toBe(true);
    expect(out.flags[0] & PARTITIONED_FLAG).toBe(0);
    expect(out.partitions.windSea.hsM[1]).toBe(0);
    expect(out.hsM[1]).toBeCloseTo(1 * ksHand(12, 15), 9);
  });
});
