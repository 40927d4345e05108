// NetCDF (CF conventions) reading, checked against an independent writer: every fixture in
// tests/fixtures/netcdf/ was written by Python's netCDF4 package (make_fixtures.py), which also
// wrote, beside each file, the values as that package reads them back (masked = empty), in SI
// units, directions coming-from. Those CSVs are the expected values here; our code never wrote
// them. Rules checked: CF conventions 1.x sections 2.5.1, 4.4, 8.1 (named beside each check).
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import {
  ImportError,
  listGridPoints,
  nearestSeaPoint,
  greatCircleM,
  normaliseLongitude,
  parseTimeUnits,
  planCfImport,
  readCfPoint,
  scanMissingShares,
  unpack,
  type NcFile,
  type SeaRecords,
} from '../../shared/seadata';
import { openNetcdf, type OpenNcFile } from '../../server/services/netcdf-file';

const DIR = path.resolve(import.meta.dirname, '../fixtures/netcdf');
const KEYS = ['hs', 'tp', 'tz', 'te', 'dir', 'wind', 'windDir'] as const;

function expected(name: string) {
  const lines = readFileSync(path.join(DIR, name), 'utf8').trim().split('\n');
  const header = lines[0].split(',');
  return lines.slice(1).map((l) => {
    const cells = l.split(',');
    const row: Record<string, number | null | string> = {};
    header.forEach((h, k) => (row[h] = h === 'time' ? cells[k] : cells[k] === '' ? null : Number(cells[k])));
    return row;
  });
}

/**
 * Compares our records to the script's CSV: same times, same values within 1e-6 plus float32's
 * relative precision (2^-23 ≈ 1.2e-7): netCDF4 unpacks float32 attributes in float32 arithmetic,
 * we unpack in float64 (a direction's error is that of the value before the turn, up to 360).
 */
function expectSameAsCsv(records: SeaRecords, csv: string, keys: readonly (typeof KEYS)[number][] = KEYS) {
  const rows = expected(csv);
  expect(records.timeMs.length).toBe(rows.length);
  rows.forEach((row, i) => {
    expect(new Date(records.timeMs[i]).toISOString().replace('.000Z', 'Z'), `time index ${i}`).toBe(row.time);
    for (const k of keys) {
      const want = row[k] as number | null;
      const got = records[k][i];
      if (want === null) expect(got, `${csv} ${k} at time index ${i}`).toBeNaN();
      else
        expect(Math.abs(got - want), `${csv} ${k} at time index ${i}: ${got} vs ${want}`).toBeLessThan(
          1e-6 + 2e-7 * (k === 'dir' || k === 'windDir' ? 360 : Math.abs(want)),
        );
    }
  });
}

const open: OpenNcFile[] = [];
async function openFixture(name: string) {
  const f = await openNetcdf(path.join(DIR, name));
  open.push(f);
  return f;
}
afterEach(() => {
  while (open.length) open.pop()!.close();
});

/** Opens a gridded fixture, plans its import and lists its points. */
async function openGrid(name: string) {
  const f = await openFixture(name);
  const plan = planCfImport(f);
  return { f, plan, points: listGridPoints(f, plan) };
}

/** Every [lat, lon] of a regular grid, latitude outermost (the order of the file's dimensions). */
const everyLatLon = (lats: number[], lons: number[]) => lats.flatMap((lat) => lons.map((lon) => [lat, lon]));

describe('NetCDF point files, values as the independent writer read them back', () => {
  it('classic file (CDF-1, unlimited time, wind as speed and direction, proleptic_gregorian)', async () => {
    const f = await openFixture('classic.nc');
    expect(f.format).toBe('classic');
    const plan = planCfImport(f);
    const r = readCfPoint(f, plan, { index: [] });
    expectSameAsCsv(r.records, 'classic.csv');
  });

  it('packed int16 file: _FillValue, a missing_value list and valid_range compared raw, then scale and offset (CF 2.5.1, 8.1); going-to direction turned', async () => {
    const f = await openFixture('packed.nc');
    const plan = planCfImport(f);
    expect(plan.choices.find((c) => c.role === 'dir')).toMatchObject({ variable: 'dirto', goingTo: true });
    const r = readCfPoint(f, plan, { index: [] });
    expectSameAsCsv(r.records, 'packed.csv', ['hs', 'tp', 'dir']);
    // Indices 5-8 hold the fill, both missing values and a raw 25000 above valid_range (script comments).
    for (const i of [5, 6, 7, 8]) expect(r.records.hs[i]).toBeNaN();
  });

  it('partitions without a total: Hs as the root-sum-square, wind from u/v, model depth; water level refused without a datum offset', async () => {
    const f = await openFixture('point-partitions.nc');
    const plan = planCfImport(f);
    expect(() => readCfPoint(f, plan, { index: [] })).toThrow(/variable zeta: water level is given above mean sea level/);
    const r = readCfPoint(f, plan, { index: [], waterLevelOffsetM: 1.2 });
    expectSameAsCsv(r.records, 'point-partitions.csv', ['hs', 'tp', 'dir', 'wind', 'windDir']);
    expect(Object.keys(r.partitions).sort()).toEqual(['swell1', 'swell2', 'windSea']);
    expect(r.depthM).toBe(42); // the script writes depth 42.0 m
    const levels = expected('point-partitions-water-level.csv');
    levels.forEach((row, i) => expect(r.waterLevel![i]).toBeCloseTo((row.level_above_msl as number) + 1.2, 6));
  });

  it('a file without standard names is read through the CSV column names', async () => {
    const f = await openFixture('no-standard-names.nc');
    const plan = planCfImport(f);
    expect(plan.choices.map((c) => `${c.role}=${c.variable}`).sort()).toEqual([
      'dir=MWD',
      'hs=Hm0',
      'tp=Tp',
      'wind=wind_speed',
      'windDir=wind_dir',
    ]);
    expectSameAsCsv(readCfPoint(f, plan, { index: [] }).records, 'no-standard-names.csv');
  });

  it('an explicit column map overrides the names', async () => {
    const f = await openFixture('no-standard-names.nc');
    const plan = planCfImport(f, { hs: 'Hm0', wind: 'wind_speed', windDir: 'wind_dir' });
    expect(plan.choices.find((c) => c.role === 'hs')?.via).toBe('column map');
    expect(() => planCfImport(f, { hs: 'VHM0' })).toThrow(/variable VHM0: is named in the column map/);
  });

  it('forecast issue: forecast_reference_time read', async () => {
    const f = await openFixture('forecast.nc');
    const r = readCfPoint(f, planCfImport(f), { index: [] });
    expect(r.forecastReferenceMs).toBe(Date.UTC(2026, 11, 1)); // script: 0 hours since 2026-12-01
    expectSameAsCsv(r.records, 'forecast.csv', ['hs', 'tp']);
  });

  it('noleap calendar is refused naming the variable (CF 4.4.1)', async () => {
    const f = await openFixture('noleap.nc');
    expect(() => readCfPoint(f, planCfImport(f), { index: [] })).toThrow(/variable time: calendar "noleap" is not supported/);
  });
});

describe('NetCDF grid (3×3, longitudes 0-360, land points)', () => {
  it('lists nine points with longitudes in -180..180 and finds the nearest sea point, skipping land and mostly-missing points', async () => {
    const { f, plan, points } = await openGrid('grid-3x3.nc');
    expect(plan.pointDims).toEqual(['latitude', 'longitude']);
    expect(points.map((p) => [p.lat, p.lon])).toEqual(everyLatLon([49.5, 50, 50.5], [-7, -6.5, -6]));
    scanMissingShares(f, plan, points);
    // Script: (50, -6) and (50.5, -6) all fill; (49.5, -6) 30 of 48 missing.
    expect(points.map((p) => p.missingShare)).toEqual([0, 0, 0.625, 0, 0, 1, 0, 0, 1]);
    // Data point of the demo project, 50.041 N 5.988 W: the nearest point (50, -6) is land at
    // 4.64 km, (49.5, -6) is mostly missing at 60.16 km; the sea point chosen is (50, -6.5) at
    // 36.86 km (haversine on the mean Earth radius 6371.0088 km, computed separately in Python).
    const best = nearestSeaPoint(points, 50.041, -5.988)!;
    expect(best.point.index).toEqual([1, 1]);
    expect(best.distanceM / 1000).toBeCloseTo(36.86, 2);
    const r = readCfPoint(f, plan, { index: best.point.index });
    expectSameAsCsv(r.records, 'grid-3x3-j1-i1.csv', ['hs', 'tp', 'dir', 'wind', 'windDir']);
  });

  it('the same grid as a classic 64-bit-offset file reads the same values at every point (our own byte-offset reads)', async () => {
    const { f, plan, points } = await openGrid('grid-3x3-classic.nc');
    expect(f.format).toBe('classic');
    scanMissingShares(f, plan, points);
    expect(points.map((p) => p.missingShare)).toEqual([0, 0, 0.625, 0, 0, 1, 0, 0, 1]);
    for (const p of points) {
      const [j, i] = p.index;
      expectSameAsCsv(readCfPoint(f, plan, { index: p.index }).records, `grid-3x3-j${j}-i${i}.csv`, ['hs', 'tp', 'dir', 'wind', 'windDir']);
    }
  });

  it('every sea point reads the values the script wrote there', async () => {
    const f = await openFixture('grid-3x3.nc');
    const plan = planCfImport(f);
    for (const [j, i] of [
      [0, 0],
      [0, 2],
      [2, 1],
    ]) {
      expectSameAsCsv(readCfPoint(f, plan, { index: [j, i] }).records, `grid-3x3-j${j}-i${i}.csv`, ['hs', 'tp', 'dir', 'wind', 'windDir']);
    }
  });
});

describe('NetCDF-4 groups (variables read wherever the writer put them)', () => {
  it('root dimensions with variables in groups and a nested group: every variable found by its path, values as the script wrote them', async () => {
    const f = await openFixture('point-groups.nc');
    const plan = planCfImport(f);
    // Layout written by make_fixtures.py point_in_groups(): /time, /waves, /waves/partitions, /atmosphere, /ocean.
    expect(plan.time.name).toBe('time');
    expect(Object.fromEntries(plan.choices.map((c) => [c.role, c.variable]))).toMatchObject({
      hs: 'waves/hs',
      wind: 'atmosphere/wspd',
      'windSea.hs': 'waves/partitions/hs_ww',
      'swell2.dir': 'waves/partitions/dir_sw2',
      waterLevel: 'ocean/ssh',
    });
    const r = readCfPoint(f, plan, { index: [], waterLevelOffsetM: 0.7 });
    expectSameAsCsv(r.records, 'point-groups.csv', ['hs', 'tp', 'dir', 'wind', 'windDir']);
    const rows = expected('point-groups.csv');
    rows.forEach((row, i) => {
      for (const p of ['windSea', 'swell1', 'swell2'] as const) {
        const s = r.partitions[p]!;
        for (const [k, got] of [
          ['hs', s.hs[i]],
          ['tp', s.tp![i]],
          ['dir', s.dir![i]],
        ] as const) {
          // float32 values: within float32's relative precision, directions scaled by 360 (see expectSameAsCsv).
          expect(Math.abs(got - (row[`${p}.${k}`] as number)), `${p}.${k} at time index ${i}`).toBeLessThan(
            1e-6 + 2e-7 * (k === 'dir' ? 360 : Math.abs(row[`${p}.${k}`] as number)),
          );
        }
      }
      expect(r.waterLevel![i]).toBeCloseTo((row.level_above_msl as number) + 0.7, 6);
    });
    // A column map may name a variable by its own name when only one group has it.
    expect(planCfImport(f, { hs: 'hs' }).choices.find((c) => c.role === 'hs')).toMatchObject({ variable: 'waves/hs', via: 'column map' });
  });

  it('a grid whose dimensions, coordinates and variables all live in one group', async () => {
    const { f, plan, points } = await openGrid('grid-group.nc');
    expect(plan.time.name).toBe('model/time');
    expect(plan.pointDims).toEqual(['model/lat', 'model/lon']);
    // make_fixtures.py grid_in_group(): latitudes 50.0, 50.25; longitudes -6.25, -6.0.
    expect(points.map((p) => [p.lat, p.lon])).toEqual(everyLatLon([50, 50.25], [-6.25, -6]));
    for (const [j, i] of [
      [0, 0],
      [1, 1],
    ]) {
      expectSameAsCsv(readCfPoint(f, plan, { index: [j, i] }).records, `grid-group-j${j}-i${i}.csv`, ['hs', 'tp']);
    }
  });
});

describe('a total and partitions that disagree', () => {
  it('scales the partitions to the given total where they differ by more than 5%, keeping their ratios (docs/domain.md#partitions)', () => {
    // Written here by hand: three times; wind sea 0.6 m and swell 0.8 m give sqrt(0.36 + 0.64) = 1.0 m
    // (energies add: common practice, no source). Totals: 1.0 (agrees), 1.04 (4%: kept), 2.0 (100%: scaled).
    const values: Record<string, number[]> = {
      time: [0, 1, 2],
      hs: [1.0, 1.04, 2.0],
      ww: [0.6, 0.6, 0.6],
      sw: [0.8, 0.8, 0.8],
    };
    const names: Record<string, string> = {
      hs: 'sea_surface_wave_significant_height',
      ww: 'sea_surface_wind_wave_significant_height',
      sw: 'sea_surface_primary_swell_wave_significant_height',
    };
    const file: NcFile = {
      format: 'netcdf4',
      variables: [
        { name: 'time', dims: ['time'], shape: [3], attrs: { standard_name: 'time', units: 'hours since 2020-01-01' } },
        ...Object.entries(names).map(([name, sn]) => ({ name, dims: ['time'], shape: [3], attrs: { standard_name: sn } })),
      ],
      readRaw: (name) => Float64Array.from(values[name]),
    };
    const r = readCfPoint(file, planCfImport(file), { index: [] });
    expect(Array.from(r.records.hs)).toEqual([1.0, 1.04, 2.0]);
    // Time index 2: both doubled (1.2 and 1.6 m, the ratio 0.75 kept); the others as given.
    expect(Array.from(r.partitions.windSea!.hs).map((x) => +x.toFixed(12))).toEqual([0.6, 0.6, 1.2]);
    expect(Array.from(r.partitions.swell1!.hs).map((x) => +x.toFixed(12))).toEqual([0.8, 0.8, 1.6]);
    expect(r.notes.join(' ')).toMatch(/differ by more than 5% in 1 records \(first at time index 2/);
  });
});

describe('2-D latitude and longitude (CF 5.2, a curvilinear grid)', () => {
  it('lists the points from 2-D coordinates named by the coordinates attribute and picks the nearest sea point', () => {
    // A 2×2 rotated grid written here by hand: lat(y, x), lon(y, x) in 0-360, one land point.
    const lat = [60.0, 60.1, 60.4, 60.5];
    const lon = [359.8, 0.2, 359.7, 0.1];
    const hs = [
      [1, 2, NaN, 4],
      [1.1, 2.1, NaN, 4.1],
    ]; // two times × four points; point (1,0) is land
    const file: NcFile = {
      format: 'netcdf4',
      variables: [
        { name: 'time', dims: ['time'], shape: [2], attrs: { standard_name: 'time', units: 'hours since 2020-01-01' } },
        { name: 'nav_lat', dims: ['y', 'x'], shape: [2, 2], attrs: { units: 'degrees_north' } },
        { name: 'nav_lon', dims: ['y', 'x'], shape: [2, 2], attrs: { units: 'degrees_east' } },
        {
          name: 'swh',
          dims: ['time', 'y', 'x'],
          shape: [2, 2, 2],
          attrs: { standard_name: 'sea_surface_wave_significant_height', coordinates: 'nav_lat nav_lon' },
        },
      ],
      readRaw(name, start, count) {
        if (name === 'time') return Float64Array.of(0, 1);
        if (name === 'nav_lat') return Float64Array.from(lat);
        if (name === 'nav_lon') return Float64Array.from(lon);
        const out: number[] = [];
        for (let t = start[0]; t < start[0] + count[0]; t++)
          for (let y = start[1]; y < start[1] + count[1]; y++)
            for (let x = start[2]; x < start[2] + count[2]; x++) out.push(hs[t][y * 2 + x]);
        return Float64Array.from(out);
      },
    };
    const plan = planCfImport(file);
    expect(plan.pointDims).toEqual(['y', 'x']);
    const points = listGridPoints(file, plan);
    expect(points.map((p) => [p.lat, Math.round(p.lon * 10) / 10])).toEqual([
      [60, -0.2],
      [60.1, 0.2],
      [60.4, -0.3],
      [60.5, 0.1],
    ]);
    scanMissingShares(file, plan, points);
    expect(points.map((p) => p.missingShare)).toEqual([0, 0, 1, 0]);
    // Data point 60.42 N 0.28 W: the land point (60.4, -0.3) is nearest; next is (60.5, 0.1), about
    // 0.08° of latitude (8.9 km) and 0.38° of longitude at 60.5° (20.8 km) away: ≈ 22.6 km
    // (flat-earth estimate, good to a few metres at this distance).
    const best = nearestSeaPoint(points, 60.42, -0.28)!;
    expect(best.point.index).toEqual([1, 1]);
    expect(best.distanceM / 1000).toBeCloseTo(22.6, 0);
    expect(Array.from(readCfPoint(file, plan, { index: [1, 1] }).records.hs)).toEqual([4, 4.1]);
  });
});

describe('CF rules on small inputs', () => {
  it('time units and calendars (CF 4.4)', () => {
    expect(parseTimeUnits('hours since 1900-01-01 00:00:00', 'standard')).toEqual({ unitMs: 3_600_000, originMs: Date.UTC(1900, 0, 1) });
    expect(parseTimeUnits('days since 2023-6-1', undefined).originMs).toBe(Date.UTC(2023, 5, 1));
    // CF 4.4 example: "minutes since 1990-1-1 0:0:0 -6:00" is 06:00 UTC.
    expect(parseTimeUnits('minutes since 1990-1-1 0:0:0 -6:00', 'gregorian').originMs).toBe(Date.UTC(1990, 0, 1, 6));
    for (const cal of ['noleap', '365_day', '360_day']) expect(() => parseTimeUnits('days since 2000-01-01', cal)).toThrow(ImportError);
    expect(() => parseTimeUnits('months since 2000-01-01', 'standard')).toThrow(/months and years have no fixed length/);
  });

  it('fill, missing and valid range are compared on the raw packed values before scaling (CF 2.5.1)', () => {
    const v = { name: 'x', dims: ['t'], shape: [5], attrs: { _FillValue: [-1], valid_max: [100], scale_factor: [0.5], add_offset: [10] } };
    // Raw 150 scales to 85, inside 100, but the raw value is above valid_max: missing.
    const out = unpack(v, Float64Array.of(-1, 0, 100, 150, 20));
    expect(Array.from(out)).toEqual([NaN, 10, 60, NaN, 20]);
  });

  it('longitudes and great-circle distance', () => {
    expect(normaliseLongitude(356)).toBe(-4);
    expect(normaliseLongitude(180)).toBe(180);
    expect(normaliseLongitude(-190)).toBe(170);
    // One degree of latitude on the mean Earth radius: 6371.0088 km × π/180 = 111.195 km (from memory).
    expect(greatCircleM(0, 0, 1, 0) / 1000).toBeCloseTo(111.195, 2);
    // Across the antimeridian: 179.5 E to 179.5 W at the equator is 1° of longitude.
    expect(greatCircleM(0, 179.5, 0, -179.5) / 1000).toBeCloseTo(111.195, 2);
  });

  it('values out of range are refused naming the variable, the count and the time index', async () => {
    const f = await openFixture('classic.nc');
    const plan = planCfImport(f);
    const spoilt = {
      ...f,
      variables: f.variables,
      readRaw: (name: string, start: number[], count: number[]) => {
        const raw = f.readRaw(name, start, count);
        if (name === 'swh') for (let i = 10; i < 14; i++) raw[i] = -0.5;
        return raw;
      },
    };
    expect(() => readCfPoint(spoilt, plan, { index: [] })).toThrow(
      'variable swh: 4 values with negative significant wave height, first at time index 10',
    );
  });
});
