import type { CSSProperties } from 'react';

/**
 * A halo of the card's colour behind a chart label (the text's stroke painted under its fill), so
 * a limit's label stays legible where it crosses another limit's line or the data.
 */
export const LABEL_HALO: CSSProperties = { paintOrder: 'stroke', stroke: 'var(--color-surface)', strokeWidth: 3, strokeLinejoin: 'round' };
