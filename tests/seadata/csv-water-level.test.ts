// CSV water level and current columns (docs/domain.md#tide): detection from the header, what the
// water level is (an import option, never guessed), current directions going-to, errors with line
// and column.
import { describe, expect, it } from 'vitest';
import { issuesOf, parse } from './csv-helpers';
import { detectColumns } from '../../shared/seadata';
import { combineWaterLevel, WATER_LEVEL_SOURCES } from '../../shared/seadata/water-level';

describe('CSV water level and current columns', () => {
  it('detects the usual header names (common practice, no source)', () => {
    expect(detectColumns(['time', 'hs', 'water_level'])).toMatchObject({ waterLevel: 'water_level' });
    expect(detectColumns(['time', 'hs', 'WL [m]'])).toMatchObject({ waterLevel: 'WL [m]' });
    expect(detectColumns(['time', 'hs', 'tide_m'])).toMatchObject({ waterLevel: 'tide_m' });
    expect(detectColumns(['time', 'hs', 'Sea level (m)'])).toMatchObject({ waterLevel: 'Sea level (m)' });
    expect(detectColumns(['time', 'hs', 'current_speed_mps', 'current_dir_deg'])).toMatchObject({
      currentSpeed: 'current_speed_mps',
      currentDir: 'current_dir_deg',
    });
  });

  it('reads a water level referred to chart datum, and current speed and direction (going-to kept)', () => {
    const text =
      'time,hs,tp,water_level,current_speed,current_dir\n2024-01-01T00:00Z,1.0,8,2.35,0.8,90\n2024-01-01T01:00Z,1.1,8,,1.2,360\n';
    const { records, report } = parse(text, { waterLevelReference: 'chart-datum' });
    expect(Array.from(records.extra!.waterLevel!)).toEqual([2.35, NaN]);
    expect(Array.from(records.extra!.currentSpeed!)).toEqual([0.8, 1.2]);
    // 360 is north: stored as 0, directions in [0, 360).
    expect(Array.from(records.extra!.currentDir!)).toEqual([90, 0]);
    expect(report.notes.join(' ')).toMatch(/chart datum/);
    expect(report.notes.join(' ')).toMatch(/flows towards/);
  });

  it('turns coming-from current directions into going-to (180° added, docs/domain.md#tide)', () => {
    const text = 'time,hs,current_speed,current_dir\n2024-01-01T00:00Z,1.0,0.5,90\n2024-01-01T01:00Z,1.0,0.5,270\n';
    const { records } = parse(text, { currentDirConvention: 'coming-from' });
    // A current from the east (90°) flows towards the west (270°); from the west (270°) towards the east (90°).
    expect(Array.from(records.extra!.currentDir!)).toEqual([270, 90]);
  });

  it('refuses a water level column without saying what it holds, naming the column on the header line', () => {
    const issues = issuesOf('time,hs,surge\n2024-01-01T00:00Z,1.0,0.2\n');
    expect(issues[0]).toMatchObject({ line: 1, column: 'surge' });
    expect(issues[0].reason).toMatch(/chart-datum|residual/);
  });

  it('refuses implausible values with line and column, all-or-nothing', () => {
    const text = 'time,hs,wl,current_speed\n2024-01-01T00:00Z,1.0,1.2,0.4\n2024-01-01T01:00Z,1.0,45,0.4\n2024-01-01T02:00Z,1.0,1.0,-1\n';
    const issues = issuesOf(text, { waterLevelReference: 'residual' });
    expect(issues.map((i) => [i.line, i.column])).toEqual([
      [3, 'wl'],
      [4, 'current_speed'],
    ]);
    expect(issues[0].reason).toMatch(/water level out of range/);
    expect(issues[1].reason).toMatch(/current speed out of range/);
  });
});

describe('which water level a worksite record uses (docs/domain.md#tide)', () => {
  const src = (k: number) => WATER_LEVEL_SOURCES[k];
  // A hand case: predicted tide 1.0, 2.0, 3.0, 4.0 m above chart datum at four records.
  const predicted = Float64Array.of(1, 2, 3, 4);

  it('a measured level (chart datum) wins where it has a value; elsewhere the prediction', () => {
    const c = combineWaterLevel(predicted, { values: Float64Array.of(1.5, NaN, 2.8, NaN), reference: 'chart-datum' })!;
    expect(Array.from(c.levelM)).toEqual([1.5, 2, 2.8, 4]);
    expect(Array.from(c.source, src)).toEqual(['dataset', 'predicted', 'dataset', 'predicted']);
  });

  it('a residual adds to the prediction (a missing residual leaves the prediction alone)', () => {
    const c = combineWaterLevel(predicted, { values: Float64Array.of(0.25, -0.5, NaN, 0), reference: 'residual' })!;
    expect(Array.from(c.levelM)).toEqual([1.25, 1.5, 3, 4]);
    expect(Array.from(c.source, src)).toEqual(['predicted+residual', 'predicted+residual', 'predicted', 'predicted+residual']);
  });

  it('no dataset level: the prediction; no tide set: a chart-datum level alone, a residual not at all, nothing: null', () => {
    expect(Array.from(combineWaterLevel(predicted, null)!.levelM)).toEqual([1, 2, 3, 4]);
    const alone = combineWaterLevel(null, { values: Float64Array.of(0.5, NaN), reference: 'chart-datum' })!;
    expect(Array.from(alone.levelM)).toEqual([0.5, NaN]);
    expect(Array.from(alone.source, src)).toEqual(['dataset', 'none']);
    expect(combineWaterLevel(null, { values: Float64Array.of(0.5), reference: 'residual' })).toBeNull();
    expect(combineWaterLevel(null, null)).toBeNull();
  });
});
