import type { AlphaTable } from './engine/types';
import type { CalibratedCell } from './skill/calibrated-alpha';
import type { SkillBin } from './skill/forecast-skill';

/** The dataset forecasts were compared with. */
export interface SkillObservationRef {
  id: string;
  name: string;
  kind: 'observation' | 'hindcast';
}

/** GET /api/projects/:projectId/forecast-skill?observation= */
export interface ForecastSkillAnswer {
  observation: SkillObservationRef;
  /** stored forecast issues that overlap the observation, and how many gave at least one pair */
  issuesCompared: number;
  issuesPaired: number;
  /** every pair (the points are a sample of them) */
  pairs: number;
  /** per (lead, Hs) bin, lead-major (docs/domain.md#forecast-uncertainty) */
  bins: SkillBin[];
  /** per lead bin over every Hs bin (the bias-by-lead-time chart) */
  byLead: Omit<SkillBin, 'hsFrom' | 'hsTo'>[];
  /** forecast and observed Hs (m) at lead leadH (h), at most `pointsCap`, evenly sampled */
  points: { leadH: number; fc: number; obs: number }[];
  pointsCap: number;
  /** a bin with fewer distinct issues than this is shown with a warning */
  fewIssues: number;
}

/** GET /api/projects/:projectId/alpha/calibrated?p=&observation= */
export interface CalibratedAlphaAnswer {
  p: number;
  /** the project's setting (the default p when the query gives none) */
  projectP: number;
  /** the (1 - p) standard normal quantile */
  z: number;
  /** null when the project has no observation or hindcast to compare with: every cell is the default's */
  observation: SkillObservationRef | null;
  issuesPaired: number;
  pairs: number;
  table: AlphaTable;
  /** cells[row][column], with the bin and the counts behind each value */
  cells: CalibratedCell[][];
  /** the default table (docs/domain.md#weather-restricted) */
  defaultTable: AlphaTable;
  /** whether the project's table in force is the default, and when its own was last saved */
  current: { isDefault: boolean; updatedAt: string | null };
  fewIssues: number;
}
