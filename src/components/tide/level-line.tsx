/** One pixel wide however a stretched SVG plot (`preserveAspectRatio="none"`) is scaled. */
export const HAIRLINE = { strokeWidth: 1, vectorEffect: 'non-scaling-stroke' } as const;

/** A level across a stretched SVG plot: a hairline from `x1` to `x2` at height `y`; `dashed` for a datum. */
export function LevelLine({ x1, x2, y, stroke, dashed }: { x1: number; x2: number; y: number; stroke: string; dashed?: boolean }) {
  return <line x1={x1} x2={x2} y1={y} y2={y} stroke={stroke} strokeDasharray={dashed ? '4 4' : undefined} {...HAIRLINE} />;
}
