// The upload form schema shared by the browser and the server.
import { describe, expect, it } from 'vitest';
import { DATASET_KINDS, ImportFormSchema, csvOptionsFromForm, isValidTimeZone, ndbcOptionsFromForm } from '../../shared/seadata';

const base = { name: 'Buoy 46026', kind: 'observation', dataPointDepth: 'deep' };

describe('ImportFormSchema', () => {
  it('parses multipart strings with defaults', () => {
    const f = ImportFormSchema.parse({ ...base, format: '', timeZone: '', onBadRows: '', columns: '', units: '' });
    expect(f).toEqual({
      name: 'Buoy 46026',
      kind: 'observation',
      format: 'auto',
      dataPointDepth: 'deep',
      onBadRows: 'refuse',
      directionConvention: 'coming-from',
      // Current directions default to flowing towards, the oceanographic convention (docs/domain.md#tide).
      currentDirConvention: 'going-to',
    });
    // CSV: no height means already at 10 m, exponent 0.11 (open sea).
    expect(csvOptionsFromForm(f)).toMatchObject({ anemometerHeightM: 10, windExponent: 0.11, directionConvention: 'coming-from' });
    // NDBC: no height stays unset (the import refuses a file with wind then).
    expect(ndbcOptionsFromForm(f).anemometerHeightM).toBeUndefined();
  });

  it('reads depth, zone, JSON fields and flags', () => {
    const f = ImportFormSchema.parse({
      ...base,
      kind: 'hindcast',
      format: 'csv',
      dataPointDepth: '52.5',
      timeZone: 'Europe/Oslo',
      onBadRows: 'skip',
      columns: JSON.stringify({ time: 'Time', hs: 'Hs [m]' }),
      units: JSON.stringify({ height: 'ft' }),
      missingCodes: JSON.stringify(['', '-9']),
      dateOrder: 'dmy',
      delimiter: ';',
      decimalComma: 'false',
      anemometerHeight: '4.1',
      windExponent: '1/7',
      directionConvention: 'going-to',
    });
    expect(f.dataPointDepth).toBe(52.5);
    expect(f.columns).toEqual({ time: 'Time', hs: 'Hs [m]' });
    expect(f.units).toEqual({ height: 'ft', speed: 'm/s', direction: 'deg' });
    expect(csvOptionsFromForm(f)).toEqual({
      mapping: { time: 'Time', hs: 'Hs [m]' },
      units: { height: 'ft', speed: 'm/s', direction: 'deg' },
      timeZone: 'Europe/Oslo',
      dateOrder: 'dmy',
      missingCodes: ['', '-9'],
      delimiter: ';',
      decimalComma: false,
      onBadRows: 'skip',
      anemometerHeightM: 4.1,
      windExponent: 1 / 7,
      directionConvention: 'going-to',
      currentDirConvention: 'going-to',
    });
    expect(ndbcOptionsFromForm(f)).toEqual({ onBadRows: 'skip', anemometerHeightM: 4.1, windExponent: 1 / 7 });
    // The earlier field name is still read.
    expect(ndbcOptionsFromForm(ImportFormSchema.parse({ ...base, anemometerHeightM: '5' })).anemometerHeightM).toBe(5);
  });

  it('accepts DEEP in any case and numbers from the browser form', () => {
    expect(ImportFormSchema.parse({ ...base, dataPointDepth: ' Deep ' }).dataPointDepth).toBe('deep');
    expect(ImportFormSchema.parse({ ...base, dataPointDepth: 30 }).dataPointDepth).toBe(30);
  });

  it('refuses bad values, naming the field', () => {
    const bad: [string, unknown][] = [
      ['name', '  '],
      ['kind', 'nowcast'],
      ['format', 'xlsx'],
      ['dataPointDepth', '0'],
      ['dataPointDepth', '-5'],
      ['dataPointDepth', '12abc'],
      ['dataPointDepth', 'shallow'],
      ['timeZone', 'Mars/Olympus_Mons'],
      ['onBadRows', 'ignore'],
      ['columns', '{not json'],
      ['columns', JSON.stringify({ hs: 'Hs' })],
      ['units', JSON.stringify({ height: 'yards' })],
      ['missingCodes', JSON.stringify([1, 2])],
      ['anemometerHeightM', '0'],
      ['anemometerHeight', '-1'],
      ['windExponent', '1.5'],
      ['windExponent', 'steep'],
      ['directionConvention', 'sideways'],
    ];
    for (const [field, value] of bad) {
      const r = ImportFormSchema.safeParse({ ...base, [field]: value });
      expect(r.success, `${field}=${String(value)}`).toBe(false);
      expect(r.error?.issues[0].path[0], `${field}=${String(value)}`).toBe(field);
    }
  });

  it('has the three dataset kinds of issue 4', () => {
    expect(DATASET_KINDS).toEqual(['hindcast', 'forecast', 'observation']);
  });
});

describe('isValidTimeZone', () => {
  it('uses the runtime zone database', () => {
    expect(isValidTimeZone('Europe/Oslo')).toBe(true);
    expect(isValidTimeZone('UTC')).toBe(true);
    expect(isValidTimeZone('Mars/Olympus_Mons')).toBe(false);
    expect(isValidTimeZone('')).toBe(false);
  });
});
