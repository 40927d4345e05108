import { describe, expect, it } from 'vitest';
import { RegularWaveForm, RegularWaveQuery, SeaStateForm, WaveTableForm, WAVE_RANGES } from '../../shared/schemas/wave';

// The wave calculator's forms (react-hook-form with a zod resolver) read the typed text with the
// same query schema the server parses the request with (issue 17, item from issue 19). The
// expected messages are the product's own words for the documented ranges.

const issues = (r: { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } }) =>
  r.success ? [] : r.error!.issues.map((i) => `${i.path.join('.')}: ${i.message}`);

describe('calculator form schemas over typed text', () => {
  it('reads a decimal comma as a point and a blank optional field as not given', () => {
    const r = RegularWaveForm.safeParse({ period: '10', height: '1,5', depth: ' 10 ', z: '' });
    expect(r.success).toBe(true);
    expect(r.data).toEqual({ period: 10, height: 1.5, depth: 10 });
  });

  it('gives the same answer as the server schema on the same values', () => {
    const typed = { period: '8', height: '2', depth: '12', z: '-3' };
    expect(RegularWaveForm.safeParse(typed).data).toEqual(RegularWaveQuery.parse({ period: '8', height: '2', depth: '12', z: '-3' }));
  });

  it('asks for a blank required field in words', () => {
    expect(issues(RegularWaveForm.safeParse({ period: '', height: '2', depth: '10', z: '' }))).toEqual(['period: Enter the wave period']);
    expect(issues(SeaStateForm.safeParse({ hs: '2', tp: '10', tz: '', te: '', gamma: '', depth: ' ' }))).toEqual([
      'depth: Enter the water depth',
    ]);
  });

  it("refuses out-of-range values with the server's own range message, on the field", () => {
    const r = issues(RegularWaveForm.safeParse({ period: '45', height: '2', depth: '10', z: '' }));
    expect(r).toEqual([`period: period must be between ${WAVE_RANGES.periodS.min} and ${WAVE_RANGES.periodS.max} s`]);
  });

  it('keeps the rules that join fields: z above the bed, one period at least, to above from', () => {
    expect(issues(RegularWaveForm.safeParse({ period: '10', height: '2', depth: '10', z: '-12' }))).toEqual([
      'z: z must not be below the seabed (z >= -depth)',
    ]);
    expect(issues(SeaStateForm.safeParse({ hs: '2', tp: '', tz: '', te: '', gamma: '', depth: '20' }))).toEqual([
      'tp: give at least one of tp, tz, te',
    ]);
    expect(issues(WaveTableForm.safeParse({ from: '0.5', to: '0.1', step: '0.01' }))).toEqual(['to: to must not be below from']);
  });

  it('refuses text that is not a number', () => {
    expect(issues(RegularWaveForm.safeParse({ period: 'ten', height: '2', depth: '10', z: '' }))[0]).toMatch(
      /^period: period must be a number/,
    );
  });
});
