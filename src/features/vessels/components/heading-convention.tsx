// The relative wave heading of an RAO table in words and as a plan view of the vessel
// (docs/domain.md#vessel-response): heading_deg = direction the waves come from minus the vessel's
// heading, 0° = from ahead, 90° = from starboard, 180° = from astern, 270° = from port.
import { useId } from 'react';
import { RAO_HEADING_CONVENTION } from '../../../../shared/schemas/vessel';

/** Arrows of waves coming towards the vessel from each relative heading, with their words. */
const ARROWS: { deg: number; words: string }[] = [
  { deg: 0, words: '0° head seas' },
  { deg: 45, words: '45°' },
  { deg: 90, words: '90° beam, starboard' },
  { deg: 135, words: '135°' },
  { deg: 180, words: '180° following seas' },
  { deg: 225, words: '225°' },
  { deg: 270, words: '270° beam, port' },
  { deg: 315, words: '315°' },
];

const CX = 160;
const CY = 150;

/** Point at `r` from the centre towards relative heading `deg` (bow up, starboard to the right). */
const at = (deg: number, r: number): [number, number] => [
  CX + r * Math.sin((deg * Math.PI) / 180),
  CY - r * Math.cos((deg * Math.PI) / 180),
];

export function HeadingConvention() {
  const id = useId();
  return (
    <figure className="flex flex-col gap-2 sm:flex-row sm:items-start" data-testid="heading-convention">
      <svg viewBox="0 0 320 300" className="w-full max-w-[20rem] shrink-0 text-ink" role="img" aria-labelledby={`${id}-title ${id}-desc`}>
        <title id={`${id}-title`}>Relative wave heading, vessel seen from above, bow up</title>
        <desc id={`${id}-desc`}>
          Arrows show waves coming towards the vessel: 0° from ahead onto the bow, 90° from starboard, 180° from astern, 270° from port.
        </desc>
        <defs>
          <marker id={`${id}-head`} viewBox="0 0 10 10" refX="9" refY="5" markerWidth="7" markerHeight="7" orient="auto-start-reverse">
            <path d="M0 0 L10 5 L0 10 z" fill="currentColor" />
          </marker>
        </defs>
        {/* Hull in plan view: bow up. */}
        <path
          d={`M${CX} ${CY - 62} C${CX + 22} ${CY - 40} ${CX + 22} ${CY - 20} ${CX + 22} ${CY + 10} L${CX + 20} ${CY + 55} L${CX - 20} ${CY + 55} L${CX - 22} ${CY + 10} C${CX - 22} ${CY - 20} ${CX - 22} ${CY - 40} ${CX} ${CY - 62} z`}
          fill="var(--color-surface-2)"
          stroke="currentColor"
          strokeWidth="2"
        />
        <text x={CX} y={CY - 30} textAnchor="middle" fontSize="11" fill="currentColor">
          bow
        </text>
        <text x={CX} y={CY + 48} textAnchor="middle" fontSize="11" fill="currentColor">
          stern
        </text>
        <text x={CX + 14} y={CY + 4} textAnchor="middle" fontSize="10" fill="currentColor" transform={`rotate(90 ${CX + 14} ${CY})`}>
          starboard
        </text>
        <text x={CX - 14} y={CY + 4} textAnchor="middle" fontSize="10" fill="currentColor" transform={`rotate(-90 ${CX - 14} ${CY})`}>
          port
        </text>
        {ARROWS.map(({ deg, words }) => {
          const [x1, y1] = at(deg, 118);
          const [x2, y2] = at(deg, 78);
          const [tx, ty] = at(deg, 134);
          const main = deg % 90 === 0;
          return (
            <g key={deg}>
              <line
                x1={x1}
                y1={y1}
                x2={x2}
                y2={y2}
                stroke="currentColor"
                strokeWidth={main ? 2.5 : 1.5}
                strokeDasharray={main ? undefined : '4 3'}
                markerEnd={`url(#${id}-head)`}
              />
              <text
                x={tx}
                y={ty + 4}
                textAnchor={deg === 0 || deg === 180 ? 'middle' : deg < 180 ? 'start' : 'end'}
                fontSize={main ? 12 : 10}
                fontWeight={main ? 700 : 400}
                fill="currentColor"
              >
                {deg === 90 || deg === 270 ? `${deg}°` : words}
              </text>
            </g>
          );
        })}
        <text x={316} y={CY + 20} textAnchor="end" fontSize="10" fill="currentColor">
          from starboard
        </text>
        <text x={4} y={CY + 20} fontSize="10" fill="currentColor">
          from port
        </text>
      </svg>
      <figcaption className="text-sm">
        <p className="font-semibold">Heading convention</p>
        <p className="mt-1">{RAO_HEADING_CONVENTION}</p>
        <p className="mt-1 text-ink-soft">
          The operation gives the vessel&rsquo;s own heading in degrees true; each hour the relative heading is the sea&rsquo;s direction
          (where it comes from) minus that heading.
        </p>
      </figcaption>
    </figure>
  );
}
