/** Default p of the calibrated alpha table: the accepted chance that the observed Hs exceeds OPLIM (docs/domain.md#forecast-uncertainty). */
export const DEFAULT_CALIBRATION_P = 1e-4;
/** Bounds of p a project may set (docs/domain.md#calibrated-alpha). */
export const MIN_CALIBRATION_P = 1e-9;
export const MAX_CALIBRATION_P = 0.2;
