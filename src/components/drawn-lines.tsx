import type { LineCustomSvgLayerProps, LineSeries } from '@nivo/line';

/**
 * A line chart's lines drawn by a layer of its own rather than by the chart library, so that a
 * series can be dashed: each series' path in its colour, with the dash pattern `dashOf` gives it
 * (none: a solid line).
 */
export function DrawnLines<S extends LineSeries>({
  series,
  lineGenerator,
  strokeWidth,
  dashOf,
  lineJoin,
}: Pick<LineCustomSvgLayerProps<S>, 'series' | 'lineGenerator'> & {
  strokeWidth: number;
  dashOf: (id: S['id']) => string | undefined;
  lineJoin?: 'round';
}) {
  return (
    <g>
      {series.map((s) => (
        <path
          key={s.id}
          d={lineGenerator(s.data.map((d) => d.position)) ?? undefined}
          fill="none"
          stroke={s.color}
          strokeWidth={strokeWidth}
          strokeDasharray={dashOf(s.id)}
          strokeLinejoin={lineJoin}
        />
      ))}
    </g>
  );
}
