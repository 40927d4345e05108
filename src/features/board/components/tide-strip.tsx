import type { SiteResponse } from '../../../../shared/api-types-sites';
import { useTide } from '../api/get-tide';
import { TideCurve } from '../../../components/tide/tide-curve';

/**
 * The predicted tide under the watch board (docs/domain.md#tide): water level above chart datum
 * over the hours shown, with each high and low water and its time in the worksite's zone.
 */
export function TideStrip({ projectId, site, fromMs, toMs }: { projectId: string; site: SiteResponse; fromMs: number; toMs: number }) {
  // Whole hours keep the query key stable while the board's clock ticks.
  const from = new Date(Math.floor(fromMs / 3_600_000) * 3_600_000).toISOString();
  const to = new Date(
    Math.min(Math.ceil(toMs / 3_600_000) * 3_600_000, Math.floor(fromMs / 3_600_000) * 3_600_000 + 31 * 86_400_000),
  ).toISOString();
  const tide = useTide({ projectId, siteId: site.id, from, to });
  if (!tide.data) return tide.isError ? <p className="text-xs text-ink-soft">Tide at {site.name}: not available.</p> : null;
  const { times, datum } = tide.data;
  if (times.length < 2) return null;
  return (
    <section
      className="rounded-[var(--radius-card)] border border-line bg-surface p-3"
      aria-labelledby={`tide-${site.id}`}
      data-testid="tide-strip"
    >
      <h3 id={`tide-${site.id}`} className="text-sm font-bold">
        Tide at {site.name} <span className="font-normal text-ink-soft">(m above {datum})</span>
      </h3>
      <TideCurve answer={tide.data} zone={site.timeZone} label={`Predicted water level at ${site.name}`} />
    </section>
  );
}
