/** The caution shown on every screen, e-mail and report. */
export const CAUTION_LINE =
  'Decision support only: the vessel master’s authority, marine warranty approval, local codes and licensed practice decide whether work goes ahead.';

/** What the worksite transformation leaves out (docs/domain.md#cautions). */
export const TRANSFORMATION_CAUTION =
  'Straight-contour refraction and shoaling only: no diffraction, currents, local wind growth or bottom friction.';
