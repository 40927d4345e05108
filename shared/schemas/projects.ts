import { z } from 'zod';
import { PROJECT_ROLES, GLOBAL_ROLES } from '../auth/roles';
import { longText, nameText, storableText } from './common';
import { MAX_CALIBRATION_P, MIN_CALIBRATION_P } from '../skill/calibration-p';

export const CreateProjectInput = z.object({
  name: nameText(),
  description: longText().optional(),
});
export type CreateProjectInput = z.infer<typeof CreateProjectInput>;

/** p of the calibrated alpha table: a chance within 1e-9 - 0.2 (docs/domain.md#calibrated-alpha). */
export const CalibrationP = z
  .number()
  .min(MIN_CALIBRATION_P, `must be at least ${MIN_CALIBRATION_P}`)
  .max(MAX_CALIBRATION_P, `must be at most ${MAX_CALIBRATION_P}`);

export const FORECAST_SOURCES = ['service', 'uploads'] as const;

/** Project settings: the offshore data point and where forecasts come from. */
export const ProjectSettingsInput = z
  .object({
    name: nameText(),
    description: longText(),
    dataPointName: storableText(z.string().trim().max(120)),
    dataPointLatitude: z.number().min(-90).max(90).nullable(),
    dataPointLongitude: z.number().min(-180).max(180).nullable(),
    /** metres; null = deep water (docs/domain.md#convention-1) */
    dataPointDepthM: z.number().min(0.5, 'must be at least 0.5 m').max(11000).nullable(),
    forecastSource: z.enum(FORECAST_SOURCES),
    /** p of the calibrated alpha table (docs/domain.md#calibrated-alpha); unchanged when left out. */
    alphaCalibrationP: CalibrationP.optional(),
  })
  .refine((v) => v.forecastSource !== 'service' || (v.dataPointLatitude !== null && v.dataPointLongitude !== null), {
    message: 'the forecast service needs the data point latitude and longitude',
    path: ['dataPointLatitude'],
  });
export type ProjectSettingsInput = z.infer<typeof ProjectSettingsInput>;

export const CreateUserInput = z.object({
  name: nameText(),
  email: z.string().trim().toLowerCase().email('must be an e-mail address'),
  globalRole: z.enum(GLOBAL_ROLES).default('user'),
});
export type CreateUserInput = z.input<typeof CreateUserInput>;

export const UpdateUserInput = z
  .object({
    active: z.boolean().optional(),
    globalRole: z.enum(GLOBAL_ROLES).optional(),
  })
  .refine((v) => v.active !== undefined || v.globalRole !== undefined, 'nothing to change');
export type UpdateUserInput = z.infer<typeof UpdateUserInput>;

export const SetMembershipInput = z.object({ role: z.enum(PROJECT_ROLES) });
export type SetMembershipInput = z.infer<typeof SetMembershipInput>;
