// The tasks an engine worker thread runs (engine-pool.ts): pure computations on plain data (a
// stored series, the dataset row, the project setup, an uploaded file's path), no database.
import { computeCampaignMonths } from './campaigns';
import { computeOutlookGoStarts } from './campaign-outlook';
import { computeExpectations } from './ledger-monthly';
import { computeWorkability } from './workability';
import { generateSyntheticSea } from '../forecast/synthetic-sea';
import { netcdfPointTask, netcdfPointsTask } from './netcdf-import';

export const ENGINE_TASKS = {
  workability: (...a: Parameters<typeof computeWorkability>) => computeWorkability(...a),
  campaign: (...a: Parameters<typeof computeCampaignMonths>) => computeCampaignMonths(...a),
  ledgerExpectations: (...a: Parameters<typeof computeExpectations>) => computeExpectations(...a),
  outlookGoStarts: (...a: Parameters<typeof computeOutlookGoStarts>) => computeOutlookGoStarts(...a),
  // The demo's invented hindcast, generated off the API thread while a first start already answers.
  syntheticSea: (...a: Parameters<typeof generateSyntheticSea>) => generateSyntheticSea(...a),
  // A NetCDF upload's points or chosen point, read from its file (runIsolatedTask: a fresh worker
  // per upload, terminated after a time limit, as a damaged HDF5 file can make the reader loop).
  netcdfPoints: netcdfPointsTask,
  netcdfPoint: netcdfPointTask,
};
export type EngineTasks = typeof ENGINE_TASKS;
export type EngineTaskName = keyof EngineTasks;
