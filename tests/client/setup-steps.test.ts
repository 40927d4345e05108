// The Overview's set-up steps for a coordinator (src/features/overview/components/setup-steps.ts):
// which parts planning needs, in the order they are best taken, each with the page that does it.
// What planning needs is the product's own chain (worksites, operations with limits, the offshore
// data point, a hindcast for statistics, forecasts); the words are ours.
import { describe, expect, it } from 'vitest';
import type { OverviewSetup } from '../../shared/api-types-overview';
import { setupSteps } from '../../src/features/overview/components/setup-steps';

const empty: OverviewSetup = {
  worksites: 0,
  operations: 0,
  dataPointPlaced: false,
  statisticsDatasets: 0,
  forecasts: 0,
  forecastSource: 'service',
};

describe('the set-up steps', () => {
  it('lists five steps in order, none done on an empty project', () => {
    const steps = setupSteps(empty);
    expect(steps.map((s) => s.key)).toEqual(['worksites', 'operations', 'dataPoint', 'statistics', 'forecasts']);
    expect(steps.every((s) => !s.done)).toBe(true);
    expect(steps.map((s) => s.path)).toEqual(['setup?tab=worksites', 'setup?tab=operations', 'settings', 'sea-data/import', 'sea-data']);
  });

  it('marks each step done from its own count, and says what there is', () => {
    const steps = setupSteps({ ...empty, worksites: 1, operations: 3, statisticsDatasets: 2 });
    expect(steps.map((s) => s.done)).toEqual([true, true, false, true, false]);
    expect(steps[0].detail).toBe('1 worksite');
    expect(steps[1].detail).toBe('3 operations');
    expect(steps[3].detail).toBe('2 hindcasts or observation records');
  });

  it('points a project on uploaded forecasts to the import, one on the service to Sea data', () => {
    const uploads = setupSteps({ ...empty, forecastSource: 'uploads' })[4];
    expect(uploads.path).toBe('sea-data/import');
    expect(uploads.action).toBe('Import a forecast');
    const service = setupSteps(empty)[4];
    expect(service.path).toBe('sea-data');
    expect(service.detail).toMatch(/every 6 hours/);
    expect(setupSteps({ ...empty, forecasts: 1 })[4]).toMatchObject({ done: true, detail: '1 forecast issue' });
  });
});
