// The Overview's set-up steps for coordinators: what planning needs that the project lacks yet,
// each with the page that does it. Pure, so that the words and the order are tested alone.
import type { OverviewSetup } from '../../../../shared/api-types-overview';
import { plural } from '../../../lib/format';

export interface SetupStep {
  key: 'worksites' | 'operations' | 'dataPoint' | 'statistics' | 'forecasts';
  done: boolean;
  title: string;
  /** What it gives, or what there is already. */
  detail: string;
  /** Path inside the project (after /projects/:projectId/) and the link's words. */
  path: string;
  action: string;
}

/** The steps in the order they are best taken: where, what, from which sea data point, with which data. */
export function setupSteps(s: OverviewSetup): SetupStep[] {
  return [
    {
      key: 'worksites',
      done: s.worksites > 0,
      title: 'Worksites',
      detail: s.worksites > 0 ? plural(s.worksites, 'worksite') : 'where the work happens: position, depth and shore normal',
      path: 'setup?tab=worksites',
      action: 'Add a worksite',
    },
    {
      key: 'operations',
      done: s.operations > 0,
      title: 'Operations and their limits',
      detail: s.operations > 0 ? plural(s.operations, 'operation') : 'each task with its duration (TPOP, TC) and its weather limits',
      path: 'setup?tab=operations',
      action: 'Add an operation',
    },
    {
      key: 'dataPoint',
      done: s.dataPointPlaced,
      title: 'Offshore data point',
      detail: s.dataPointPlaced
        ? 'placed'
        : s.forecastSource === 'service'
          ? 'the position and depth the sea states are given at; the forecast service is asked for that point'
          : 'the position and depth your sea data are given at',
      path: 'settings',
      action: 'Place it in Settings',
    },
    {
      key: 'statistics',
      done: s.statisticsDatasets > 0,
      title: 'A hindcast',
      detail:
        s.statisticsDatasets > 0
          ? plural(s.statisticsDatasets, 'hindcast or observation record', 'hindcasts or observation records')
          : 'years of sea states for downtime by month and campaign durations (P50, P90)',
      path: 'sea-data/import',
      action: 'Import one',
    },
    {
      key: 'forecasts',
      done: s.forecasts > 0,
      title: 'Forecasts',
      detail:
        s.forecasts > 0
          ? plural(s.forecasts, 'forecast issue')
          : s.forecastSource === 'service'
            ? 'fetched from the forecast service at the data point every 6 hours once it is placed, or now from Sea data'
            : 'this project takes uploaded forecast files: import the latest under Sea data',
      path: s.forecastSource === 'service' ? 'sea-data' : 'sea-data/import',
      action: s.forecastSource === 'service' ? 'Open Sea data' : 'Import a forecast',
    },
  ];
}
