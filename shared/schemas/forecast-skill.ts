import { z } from 'zod';
import { CalibrationP } from './projects';

const datasetId = z.string().uuid('must be a dataset id');

/** GET forecast-skill?observation= */
export const ForecastSkillQuery = z.object({ observation: datasetId });

/** GET alpha/calibrated?p=&observation= (p as text in the query, docs/domain.md#calibrated-alpha) */
export const CalibratedAlphaQuery = z.object({
  p: z
    .string()
    .trim()
    .regex(/^[0-9.eE+-]+$/, 'must be a number such as 0.0001 or 1e-4')
    .transform(Number)
    .pipe(CalibrationP)
    .optional(),
  observation: datasetId.optional(),
});

/** POST alpha/adopt-calibrated: the p and observation dataset the coordinator looked at. */
export const AdoptCalibratedInput = z.object({
  p: CalibrationP.optional(),
  observation: datasetId.optional(),
});
export type AdoptCalibratedInput = z.infer<typeof AdoptCalibratedInput>;
