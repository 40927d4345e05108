import fs from 'node:fs';
import { createRequire } from 'node:module';
import { feature } from 'topojson-client';
import { describe, expect, it } from 'vitest';
import { DEMO_SITES } from '../../seed/scenario-sites';
import { DEMO_PROJECT } from '../../seed/scenario';
import { snapToGrid } from '../../server/forecast';

// Issue 17: the demo's worksites must sit where a coast is, with depths that fit. Checked against
// Natural Earth's 1:10m land polygons (public domain, from the world-atlas package through
// topojson-client), independently of the product's code. Natural Earth 1:10m draws the coastline
// to within about a kilometre (its scale; from memory), so the distances allow for that.

const require = createRequire(import.meta.url);
const topology = JSON.parse(fs.readFileSync(require.resolve('world-atlas/land-10m.json'), 'utf8')) as Parameters<typeof feature>[0];
const landFeature = feature(topology, 'land') as unknown as { features: { geometry: { type: string; coordinates: unknown } }[] };
type Ring = number[][];
const allPolygons: Ring[][] = landFeature.features.flatMap((f) =>
  f.geometry.type === 'Polygon'
    ? [f.geometry.coordinates as Ring[]]
    : f.geometry.type === 'MultiPolygon'
      ? (f.geometry.coordinates as Ring[][])
      : [],
);

const EARTH_KM = 6371.0088; // mean Earth radius (IUGG), km
const RAD = Math.PI / 180;

/** Local flat projection around `o`, km east and north (fine over tens of km). */
const toKm = (p: number[], o: number[]) => [(p[0] - o[0]) * RAD * EARTH_KM * Math.cos(o[1] * RAD), (p[1] - o[1]) * RAD * EARTH_KM];

/** Polygons with a vertex within about 100 km of a point (lon, lat). */
function polygonsNear(p: number[]): Ring[][] {
  return allPolygons.filter((poly) => poly[0].some((v) => Math.abs(v[1] - p[1]) < 1 && Math.abs(v[0] - p[0]) < 1.5));
}

/** Even-odd ray test of a point in a ring (lon/lat). */
function inRing(p: number[], ring: Ring): boolean {
  let inside = false;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const [xi, yi] = ring[i];
    const [xj, yj] = ring[j];
    if (yi > p[1] !== yj > p[1] && p[0] < ((xj - xi) * (p[1] - yi)) / (yj - yi) + xi) inside = !inside;
  }
  return inside;
}

const onLand = (p: number[]) => polygonsNear(p).some((poly) => inRing(p, poly[0]) && !poly.slice(1).some((hole) => inRing(p, hole)));

/** Distance to the nearest coastline, km, and the bearing to it, deg from north. */
function nearestCoast(p: number[]): { km: number; bearing: number } {
  let best = Infinity;
  let at = [0, 0];
  for (const poly of polygonsNear(p)) {
    for (const ring of poly) {
      for (let i = 0; i + 1 < ring.length; i++) {
        const a = toKm(ring[i], p);
        const b = toKm(ring[i + 1], p);
        const dx = b[0] - a[0];
        const dy = b[1] - a[1];
        const t = Math.max(0, Math.min(1, -(a[0] * dx + a[1] * dy) / (dx * dx + dy * dy || 1)));
        const x = a[0] + t * dx;
        const y = a[1] + t * dy;
        const d = Math.hypot(x, y);
        if (d < best) {
          best = d;
          at = [x, y];
        }
      }
    }
  }
  return { km: best, bearing: (Math.atan2(at[0], at[1]) / RAD + 360) % 360 };
}

/** Smallest angle between two bearings, deg. */
const angleBetween = (a: number, b: number) => Math.abs(((((a - b) % 360) + 540) % 360) - 180);

const site = (key: (typeof DEMO_SITES)[number]['key']) => DEMO_SITES.find((s) => s.key === key)!;
const lonLat = (s: { latitude: number; longitude: number }) => [s.longitude, s.latitude];
const dataPoint = [DEMO_PROJECT.dataPointLongitude, DEMO_PROJECT.dataPointLatitude];

describe('demo positions against Natural Earth land (issue 17)', () => {
  it('the land test can fail: a point inland is on land, one far offshore is not', () => {
    // Dartmoor (about 50.57 N, 3.92 W) is inland in south-west England; 49.5 N 8 W is open
    // Atlantic south-west of Ireland (atlas, from memory).
    expect(onLand([-3.92, 50.57])).toBe(true);
    expect(onLand([-8, 49.5])).toBe(false);
  });

  it('puts the landfall within about 1 km of the coastline, on the sea side', () => {
    const p = lonLat(site('cofferdam'));
    expect(onLand(p)).toBe(false);
    expect(nearestCoast(p).km).toBeLessThan(1.2);
  });

  it('puts the nearshore worksite a kilometre or two off, the route a few km off, all in water', () => {
    const trench = nearestCoast(lonLat(site('trench')));
    const route = nearestCoast(lonLat(site('route')));
    expect(onLand(lonLat(site('trench')))).toBe(false);
    expect(onLand(lonLat(site('route')))).toBe(false);
    expect(trench.km).toBeGreaterThan(nearestCoast(lonLat(site('cofferdam'))).km);
    expect(trench.km).toBeLessThan(3);
    expect(route.km).toBeGreaterThan(3);
    expect(route.km).toBeLessThan(8);
  });

  it('puts the substation and the data point further offshore, in water (and the forecast grid node too)', () => {
    const sub = lonLat(site('substation'));
    expect(onLand(sub)).toBe(false);
    expect(onLand(dataPoint)).toBe(false);
    expect(nearestCoast(dataPoint).km).toBeGreaterThan(nearestCoast(lonLat(site('route'))).km);
    expect(nearestCoast(dataPoint).km).toBeGreaterThan(10);
    // The fake forecast answers for the nearest node of its grid; that node is at sea too.
    expect(onLand([snapToGrid(dataPoint[0]), snapToGrid(dataPoint[1])])).toBe(false);
  });

  it('points each shore-normal away from the coast: the nearest coast lies behind it, within 30 deg', () => {
    // The shore-normal bearing is the coming-from direction of waves crossing the depth contours
    // square on (docs/domain.md#transformation): seaward, so the coast lies at bearing + 180.
    for (const s of DEMO_SITES) {
      if (s.shoreNormalDeg === null) continue;
      const c = nearestCoast(lonLat(s));
      expect(angleBetween(c.bearing, (s.shoreNormalDeg + 180) % 360), s.key).toBeLessThan(30);
    }
  });

  it('has depths that grow offshore with a believable slope', () => {
    const byDistance = [
      ...DEMO_SITES.map((s) => ({ key: s.key, depth: s.depthM, km: nearestCoast(lonLat(s)).km })),
      { key: 'data point', depth: DEMO_PROJECT.dataPointDepthM, km: nearestCoast(dataPoint).km },
    ].sort((a, b) => a.km - b.km);
    for (let i = 1; i < byDistance.length; i++) expect(byDistance[i].depth, byDistance[i].key).toBeGreaterThan(byDistance[i - 1].depth);
    for (const s of byDistance) {
      // Mean slope from the shoreline: between 1:20 (a steep beach) and 1:1000 (a flat shelf);
      // common practice, no source.
      const slope = s.depth / (s.km * 1000);
      expect(slope, s.key).toBeLessThan(1 / 20);
      expect(slope, s.key).toBeGreaterThan(1 / 1000);
    }
    // Nearshore, an equilibrium beach profile h = A x^(2/3) with A between 0.04 and 0.2 m^(1/3)
    // (sand from fine to coarse; Dean's profile as in the Coastal Engineering Manual Part III-3,
    // from memory) holds the landfall, the trench and the route.
    for (const key of ['cofferdam', 'trench', 'route'] as const) {
      const s = byDistance.find((b) => b.key === key)!;
      const a = s.depth / (s.km * 1000) ** (2 / 3);
      expect(a, key).toBeGreaterThan(0.04);
      expect(a, key).toBeLessThan(0.2);
    }
  });
});
