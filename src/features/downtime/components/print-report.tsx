// The head of the printed downtime report: shown only on paper (and in a print-to-PDF), above the
// page's own sections, which print without their controls (`no-print`).
import { useState } from 'react';
import type { DatasetSummary } from '../../../../shared/api-types-datasets';
import type { OperationResponse, SiteResponse } from '../../../../shared/api-types-sites';
import { CAUTION_LINE, TRANSFORMATION_CAUTION } from '../../../../shared/caution';
import { formatInstant } from '../../../../shared/dates';
import { dateIn } from './format';
import { describeLimits } from '../../../../shared/limits-in-words';

interface Props {
  projectName: string;
  hindcast: DatasetSummary | undefined;
  ledgerSources: string[];
  alpha: boolean;
  operations: OperationResponse[];
  sites: SiteResponse[];
  /** The page's zone (its statement, printed under the project's name, says which). */
  zone: string;
}

export function PrintReport({ projectName, hindcast, ledgerSources, alpha, operations, sites, zone }: Props) {
  const siteName = new Map(sites.map((s) => [s.id, s.name]));
  const [printedAt] = useState(() => Date.now());
  return (
    <section className="hidden text-sm text-black print:block" data-testid="print-report" aria-label="Report header">
      <h1 className="text-2xl font-bold">Downtime schedule: {projectName}</h1>
      <p className="mt-1">Printed {formatInstant(printedAt, zone, 'dateTimeYear')}.</p>

      <h2 className="mt-4 text-base font-bold">Data sources</h2>
      <ul className="ml-5 list-disc">
        <li>
          Hindcast:{' '}
          {hindcast
            ? `${hindcast.name}, ${dateIn(hindcast.start, zone)} to ${dateIn(hindcast.end, zone)}, ${hindcast.records.toLocaleString('en-GB')} records every ${hindcast.stepMinutes} min, at ${hindcast.dataPoint.name || 'the data point'} (${hindcast.dataPoint.depthM === null ? 'deep water' : `${hindcast.dataPoint.depthM} m deep`}).`
            : 'none.'}
        </li>
        <li>Downtime ledger: {ledgerSources.length > 0 ? ledgerSources.join('; ') : 'no proposed or confirmed day in the month shown.'}</li>
      </ul>

      <h2 className="mt-4 text-base font-bold">Limits used (OPLIM)</h2>
      <ul className="ml-5 list-disc">
        {operations.map((o) => (
          <li key={o.id}>
            <span className="font-semibold">{o.name}</span>: TPOP {o.tpop} h, TC {o.tc} h (TR {o.tr} h)
            {o.weatherRestricted ? ', weather-restricted' : ''}; {limitsLine(o)}; at{' '}
            {o.siteIds.length === 0 ? 'every worksite' : o.siteIds.map((id) => siteName.get(id) ?? 'a removed worksite').join(', ')}.
          </li>
        ))}
      </ul>
      <h2 className="mt-4 text-base font-bold">Worksites</h2>
      <ul className="ml-5 list-disc">
        {sites.map((s) => (
          <li key={s.id}>
            {s.name}: {s.depth} m deep{s.tide && s.tide.source !== 'none' ? ` below ${s.tide.datum}` : ''},{' '}
            {s.shoreNormal === null ? 'no refraction' : `shore normal ${s.shoreNormal}°`}, breaker index {s.breakerIndex}
            {s.transferTable ? ', site transfer table' : ''}
            {s.tide?.source === 'constants'
              ? `, tide from ${s.tide.constituents?.length ?? 0} harmonic constants (Z0 ${s.tide.z0} m)`
              : s.tide?.source === 'station'
                ? `, tide from database station ${s.tide.stationId}`
                : ''}
            .
          </li>
        ))}
      </ul>

      <h2 className="mt-4 text-base font-bold">Assumptions</h2>
      <ul className="ml-5 list-disc">
        <li>
          {alpha
            ? 'α on: an hour is workable when Hs meets the forecast limit OPWF = α × OPLIM (α from the project’s table by TPOP and Hs limit); other limits at OPLIM.'
            : 'α off: every limit at OPLIM.'}
        </li>
        <li>Workability = workable hours / hours with data; months are calendar months at the worksite.</li>
        <li>
          A go-start needs TR = TPOP + TC wholly workable; waiting on weather runs to the next go-start; a usable window is a workable run
          of at least TR.
        </li>
        <li>
          Campaigns start on the 1st of each month at 00:00 in every hindcast year; P50/P90 by linear interpolation between order statistics
          (Hyndman &amp; Fan type 7); a year that runs past the end of the data is censored and left out.
        </li>
        <li>
          Live outlook: from the time printed, the steps not yet done run in order on the latest forecast’s go-starts, then in each hindcast
          year from the same calendar time (a step with no go-start left in the forecast waits for the forecast’s end); each forecast ×
          hindcast year pair is one sample. P10/P50/P90 of the finish over the samples that finish (type 7); the hindcast-only figures from
          the same start show how much the forecast moved the date. The history lists the outlook stored by each planning run.
        </li>
        <li>
          Ledger: all hours of a day are planned; hours not workable at OPLIM or without data count as lost. The expectation is the month’s
          lost hours over the hindcast years (P50/P90).
        </li>
        {sites.some((s) => s.tide && s.tide.source !== 'none') ? (
          <li>
            Tide: at a worksite with a tide, every hindcast hour is transformed at its still-water depth h = chart depth + predicted tide,
            so the depth-limited Hs, shoaling and bed velocity, and the depth and tide-window limits, change with the tide; an hour with h ≤
            0 is dry and counts as no data. The prediction is astronomical only (Schureman nodal corrections): storm surge is not included,
            and it is not for navigation.
          </li>
        ) : null}
        <li>{TRANSFORMATION_CAUTION}</li>
      </ul>
      <p className="mt-4 border-t border-black/30 pt-2 font-semibold">{CAUTION_LINE}</p>
    </section>
  );
}

/**
 * The operation's limits in full words (shared/limits-in-words.ts), and for response limits the
 * vessel's fixed heading they were worked at (docs/domain.md#vessel-response).
 */
function limitsLine(o: OperationResponse): string {
  const words = describeLimits(o.limits, 'full');
  if ((o.limits.responses?.length ?? 0) > 0 && o.heading !== null) words.push(`vessel heading ${o.heading}° true`);
  return words.length > 0 ? words.join('; ') : 'no limit set';
}
