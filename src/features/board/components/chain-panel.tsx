// The chain behind one hour of the board: data point values → angle of incidence, Ks, Kr and the
// flags → worksite Hs and bed velocity → each limit at OPLIM and OPWF → margin. A drawer at the
// right on a laptop, a sheet from the bottom on a phone; not modal, so another hour can be picked
// while it is open.
import { CURRENT_SOURCE_WORDS, WATER_LEVEL_SOURCE_WORDS } from '../../../../shared/seadata/water-level';
import { useEffect, useRef, type ReactNode } from 'react';
import type { LimitCheck, OperationSitePlan } from '../../../../shared/api-types-plan';
import { TRANSFORMATION_CAUTION } from '../../../../shared/caution';
import { CHANCE_WORDS, chancePercent } from '../../../../shared/status-words';
import { ErrorNotice, Spinner } from '../../../components/ui';
import { Term } from '../../../components/ui/term';
import { useHourChain, type HourChain } from '../api/get-hour-chain';
import { STATUS_META, flagWords, fmt, fmtDir, fmtTowards, formatIn, limitWord } from './board-format';
import { HeadingRow } from '../../../components/ui/table';

interface ChainPanelProps {
  projectId: string;
  plan: OperationSitePlan;
  index: number;
  timeMs: number;
  alpha: boolean;
  datasetId?: string;
  canStepBack: boolean;
  canStepOn: boolean;
  onStep: (delta: number) => void;
  onClose: () => void;
}

export function ChainPanel({ projectId, plan, index, timeMs, alpha, datasetId, canStepBack, canStepOn, onStep, onClose }: ChainPanelProps) {
  const time = new Date(timeMs).toISOString();
  const chain = useHourChain({ projectId, operationId: plan.operationId, siteId: plan.siteId, time, alpha, datasetId });
  const headingRef = useRef<HTMLHeadingElement>(null);
  const zone = plan.timeZone;
  const status = plan.status[index];
  const meta = STATUS_META[status];

  useEffect(() => {
    headingRef.current?.focus({ preventScroll: true });
  }, [plan.operationId, plan.siteId]);
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (e.key === 'Escape') onClose();
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [onClose]);

  return (
    <aside
      id="hour-chain"
      role="dialog"
      aria-modal="false"
      aria-labelledby="hour-chain-title"
      data-testid="chain-panel"
      className="fixed inset-x-0 bottom-0 z-40 flex max-h-[78vh] flex-col rounded-t-2xl border border-line bg-surface shadow-2xl lg:inset-x-auto lg:top-3 lg:right-3 lg:bottom-3 lg:max-h-none lg:w-[27rem] lg:rounded-2xl"
    >
      <header className="flex items-start gap-2 border-b border-line px-4 py-3">
        <div className="min-w-0 flex-1">
          <h2 id="hour-chain-title" ref={headingRef} tabIndex={-1} className="text-lg leading-tight font-bold outline-none">
            {formatIn(timeMs, zone, 'EEE d MMM HH:mm')}
          </h2>
          <p className="text-sm text-ink-soft">
            {plan.operationName} at {plan.siteName}
          </p>
          <p className="mt-1 flex flex-wrap items-center gap-2 text-sm">
            <span className={`inline-flex size-6 items-center justify-center rounded text-xs font-bold ${meta.cell}`} aria-hidden>
              {meta.letter}
            </span>
            <strong data-testid="chain-status">{meta.word[0].toUpperCase() + meta.word.slice(1)}</strong>
            {status !== 'workable' && status !== 'no_data' && plan.limiting[index] ? (
              <span>limited by {limitWord(plan.limiting[index])}</span>
            ) : null}
          </p>
          {plan.chance ? (
            <p className="mt-1 text-sm" data-testid="chain-chance">
              Ensemble: {CHANCE_WORDS.hour} <strong>{chancePercent(plan.chance[index])}</strong>
              {plan.startChance ? (
                <>
                  {' '}
                  · {CHANCE_WORDS.window} from this hour <strong>{chancePercent(plan.startChance[index])}</strong>
                </>
              ) : null}
            </p>
          ) : null}
        </div>
        <button
          type="button"
          onClick={onClose}
          className="inline-flex min-h-11 min-w-11 items-center justify-center rounded-lg text-xl text-ink hover:bg-surface-2"
          aria-label="Close the hour’s details"
        >
          ×
        </button>
      </header>
      <div className="flex-1 overflow-y-auto px-4 py-3">
        {chain.isPending ? <Spinner label="Working out the chain" /> : null}
        {chain.error ? <ErrorNotice error={chain.error} /> : null}
        {chain.data ? <ChainBody chain={chain.data} alpha={alpha} weatherRestricted={!plan.informationOnly} /> : null}
      </div>
      <footer className="flex gap-2 border-t border-line px-4 py-2">
        <button
          type="button"
          className="inline-flex min-h-11 flex-1 items-center justify-center rounded-lg border border-line text-sm font-semibold hover:border-accent disabled:opacity-40"
          disabled={!canStepBack}
          onClick={() => onStep(-1)}
        >
          ‹ Previous hour
        </button>
        <button
          type="button"
          className="inline-flex min-h-11 flex-1 items-center justify-center rounded-lg border border-line text-sm font-semibold hover:border-accent disabled:opacity-40"
          disabled={!canStepOn}
          onClick={() => onStep(1)}
        >
          Next hour ›
        </button>
      </footer>
    </aside>
  );
}

function Step({ n, title, children }: { n: number; title: string; children: ReactNode }) {
  return (
    <section className="relative border-l-2 border-line pb-4 pl-4 last:pb-1">
      <span
        className="absolute top-0 -left-[0.8rem] inline-flex size-6 items-center justify-center rounded-full bg-deep-2 text-xs font-bold text-white"
        aria-hidden
      >
        {n}
      </span>
      <h3 className="text-sm font-bold">{title}</h3>
      <div className="mt-1 text-sm">{children}</div>
    </section>
  );
}

function Facts({ rows }: { rows: [ReactNode, ReactNode][] }) {
  return (
    <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-0.5">
      {rows.map(([k, v], i) => (
        <div key={i} className="contents">
          <dt className="text-ink-soft">{k}</dt>
          <dd className="tabular-nums">{v}</dd>
        </div>
      ))}
    </dl>
  );
}

function ChainBody({ chain, alpha, weatherRestricted }: { chain: HourChain; alpha: boolean; weatherRestricted: boolean }) {
  const t = chain.transform;
  const dp = chain.dataPoint;
  const gammaB = t.depthLimitM !== null && chain.site.depthM > 0 ? t.depthLimitM / chain.site.depthM : null;
  const table = t.transferFactor !== null;
  const flags = flagWords(t.flags ?? 0, { depthLimitM: t.depthLimitM, transferFactor: t.transferFactor });
  const capped = t.hsBeforeCapM !== null && t.hsM !== null && t.hsBeforeCapM > t.hsM;

  return (
    <div className="pl-3">
      <Step n={1} title={`At the data point (${dp.depthM === null ? 'deep water' : `depth ${fmt(dp.depthM, 0, 'm')}`})`}>
        <Facts
          rows={[
            ['Hs', fmt(dp.hs, 2, 'm')],
            ['Tp', fmt(dp.tp, 1, 's')],
            [
              'Tz',
              <>
                {fmt(dp.tz ?? t.tzS, 1, 's')}
                {t.tzSource === 'tp' ? <span className="text-ink-soft"> (from Tp, JONSWAP γ 3.3)</span> : null}
              </>,
            ],
            ['Direction', fmtDir(dp.dir)],
            ['Wind at 10 m', fmt(dp.wind, 1, 'm/s')],
          ]}
        />
      </Step>
      <Step n={2} title={`To the worksite (depth ${fmt(chain.site.depthM, 1, 'm')})`}>
        {table ? (
          <p>
            Factor from the worksite’s transfer table: <strong className="tabular-nums">{fmt(t.transferFactor, 3)}</strong> (replaces
            shoaling and refraction).
          </p>
        ) : (
          <Facts
            rows={[
              ['Shore normal', t.shoreNormalDeg === null ? 'none set: no refraction' : fmtDir(t.shoreNormalDeg)],
              ...(t.shoreNormalDeg !== null
                ? ([
                    [
                      'Angle of incidence',
                      <>
                        {fmt(t.thetaSrcDeg, 1)}° at the data point → {fmt(t.thetaSiteDeg, 1)}° at the worksite
                      </>,
                    ],
                  ] as [ReactNode, ReactNode][])
                : []),
              [
                'Celerity C',
                <>
                  {fmt(t.cSrcMps, 2, 'm/s')} → {fmt(t.cSiteMps, 2, 'm/s')}
                </>,
              ],
              [
                'Group celerity Cg',
                <>
                  {fmt(t.cgSrcMps, 2, 'm/s')} → {fmt(t.cgSiteMps, 2, 'm/s')}
                </>,
              ],
              [
                <abbr key="ks" title="Shoaling coefficient √(Cg data point / Cg worksite)">
                  Ks
                </abbr>,
                <span data-testid="chain-ks">{fmt(t.ks, 3)}</span>,
              ],
              [
                <abbr key="kr" title="Refraction coefficient √(cos θ data point / cos θ worksite)">
                  Kr
                </abbr>,
                fmt(t.kr, 3),
              ],
            ]}
          />
        )}
        <p className="mt-2">
          Hs = {fmt(t.hsSrcM, 2, 'm')} × {fmt(t.ks, 3)}
          {table ? '' : ` × ${fmt(t.kr, 3)}`} = <strong className="tabular-nums">{fmt(t.hsBeforeCapM, 2, 'm')}</strong>
          {capped ? ', capped at ' : '; depth limit '}γb × d = {fmt(gammaB, 2)} × {fmt(chain.site.depthM, 1, 'm')} ={' '}
          {fmt(t.depthLimitM, 2, 'm')}
          {capped ? '' : ', not reached'}.
        </p>
        <ul className="mt-2 flex flex-col gap-1 text-sm">
          {flags.length === 0 ? (
            <li className="text-ink-soft">
              No flags:{' '}
              {t.shoreNormalDeg === null && !table
                ? 'shoaling only, direction kept.'
                : 'straight-contour refraction and shoaling as computed.'}
            </li>
          ) : (
            flags.map((f) => (
              <li key={f} className="rounded-md bg-surface-2 px-2 py-1">
                <span aria-hidden>⚑ </span>
                {f}
              </li>
            ))
          )}
        </ul>
      </Step>
      <Step n={3} title="At the worksite">
        <Facts
          rows={[
            ['Hs', <strong key="hs">{fmt(chain.site.hs, 2, 'm')}</strong>],
            ['Direction', fmtDir(chain.site.dir ?? t.dirDeg)],
            ['Bed velocity, linear', fmt(chain.site.bedVelocityLinear, 2, 'm/s')],
            ['Bed velocity, Soulsby (2006)', fmt(chain.site.bedVelocitySoulsby, 2, 'm/s')],
            ['Wind at 10 m', fmt(chain.site.wind, 1, 'm/s')],
            ...(chain.site.waterLevel !== null
              ? ([
                  [
                    'Water level above chart datum',
                    `${fmt(chain.site.waterLevel, 2, 'm')} (${WATER_LEVEL_SOURCE_WORDS[chain.site.waterLevelSource]})`,
                  ],
                  ['Still-water depth h = d + level', fmt(chain.site.depth, 2, 'm')],
                ] as [string, ReactNode][])
              : []),
            ...(chain.site.current !== null
              ? ([
                  [
                    'Current',
                    `${fmt(chain.site.current, 2, 'm/s')}${chain.site.currentDir !== null ? `, flowing towards ${fmtTowards(chain.site.currentDir)}` : ''} (${
                      chain.site.currentSource === 'predicted' && chain.site.currentStation
                        ? `predicted tidal current of station ${chain.site.currentStation}, no wind-driven or surge current`
                        : CURRENT_SOURCE_WORDS[chain.site.currentSource]
                    })`,
                  ],
                ] as [string, ReactNode][])
              : []),
          ]}
        />
        {chain.partitions ? <PartitionTable partitions={chain.partitions} /> : null}
      </Step>
      <Step n={4} title="Against each limit">
        <p className="mb-2 text-xs text-ink-soft">
          {alpha && weatherRestricted
            ? 'Hs limits are tested at the forecast limit OPWF = α × OPLIM; other limits at OPLIM.'
            : alpha
              ? 'Not weather-restricted: every limit at OPLIM, for information only (no go-start, window or "may start now" from a forecast).'
              : 'Forecast limits are off: every limit at OPLIM.'}
        </p>
        <ul className="flex flex-col gap-2">
          {chain.checks.map((c, i) => (
            <LimitRow key={`${c.limit}-${i}`} check={c} />
          ))}
        </ul>
        <p className="mt-3 text-sm">
          Result: <strong>{STATUS_META[chain.status].word}</strong>.
        </p>
      </Step>
      {chain.ensemble ? (
        <Step n={5} title={`Ensemble spread at the worksite (${chain.ensemble.runs} runs)`}>
          <p className="mb-1 text-xs text-ink-soft">
            Hs of the control and every member through the same chain. Chances count the runs on OPLIM (no α); the status above is the
            control&rsquo;s and still decides go or no-go.
          </p>
          <div data-testid="chain-spread">
            <Facts
              rows={[
                ['Hs min', fmt(chain.ensemble.hs.min, 2, 'm')],
                ['Hs P10', fmt(chain.ensemble.hs.p10, 2, 'm')],
                ['Hs P50', fmt(chain.ensemble.hs.p50, 2, 'm')],
                ['Hs P90', fmt(chain.ensemble.hs.p90, 2, 'm')],
                ['Hs max', fmt(chain.ensemble.hs.max, 2, 'm')],
              ]}
            />
          </div>
        </Step>
      ) : null}
      <p className="mt-1 text-xs text-ink-soft">{TRANSFORMATION_CAUTION}</p>
    </div>
  );
}

const PARTITION_LABEL = { windSea: 'Wind sea', swell1: 'Swell 1', swell2: 'Swell 2' } as const;

/** Each partition at the data point and at the worksite (docs/domain.md#partitions): the total above is √(ΣHs²) of these. */
function PartitionTable({ partitions }: { partitions: NonNullable<HourChain['partitions']> }) {
  return (
    <table className="mt-2 w-full text-xs tabular-nums" data-testid="chain-partitions">
      <caption className="text-left text-ink-soft">
        Partitions, each through the chain with its own Tp and direction; the total is √(ΣHs²)
      </caption>
      <thead>
        <HeadingRow
          className="text-left text-ink-soft"
          headings={['Partition', 'Hs at data point', 'Hs at worksite', 'Tp', 'Direction at worksite']}
        />
      </thead>
      <tbody>
        {partitions.map((p) => (
          <tr key={p.name}>
            <th scope="row" className="text-left font-normal">
              {PARTITION_LABEL[p.name]}
            </th>
            <td>{p.dataPoint.hs === 0 ? 'absent' : fmt(p.dataPoint.hs, 2, 'm')}</td>
            <td>{p.site.hs === 0 ? 'absent' : fmt(p.site.hs, 2, 'm')}</td>
            <td>{p.site.tp === null ? '–' : fmt(p.site.tp, 1, 's')}</td>
            <td>{p.site.dir === null ? '–' : fmtDir(p.site.dir)}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

function LimitRow({ check: c }: { check: LimitCheck }) {
  const d = c.unit === 'm/s' ? 2 : c.unit === 'm' ? 2 : 1;
  const verdict = c.met === null ? 'no data' : c.met ? 'met' : c.metAtOplim ? 'met at OPLIM only' : 'broken';
  const tone = c.met === null ? 'bg-st-nodata text-ink' : c.met ? 'bg-ok-soft text-ink' : 'bg-danger-soft text-ink';
  const isBand = c.limit === 'tpBand';
  return (
    <li className="rounded-lg border border-line p-2" data-testid="limit-check">
      <div className="flex items-center justify-between gap-2">
        <strong className="text-sm">
          {c.label}
          {c.drivenBy ? <span className="font-normal text-ink-soft"> · driven by {PARTITION_LABEL[c.drivenBy].toLowerCase()}</span> : null}
        </strong>
        <span className={`rounded px-2 py-0.5 text-xs font-bold ${tone}`}>
          {c.met === null ? '?' : c.met ? '✓' : '✗'} {verdict}
        </span>
      </div>
      <dl className="mt-1 grid grid-cols-2 gap-x-3 gap-y-1 text-xs">
        <div>
          <dt className="text-ink-soft">Value</dt>
          <dd className="tabular-nums">{fmt(c.value, d, c.unit)}</dd>
        </div>
        <div>
          <dt className="text-ink-soft">{isBand ? 'Nearest edge' : <Term k="oplim" />}</dt>
          <dd className="tabular-nums">{c.oplim === null && c.limit === 'hsTpCurve' ? 'outside the curve' : fmt(c.oplim, d, c.unit)}</dd>
        </div>
        {c.opwf !== null ? (
          <div>
            <dt className="text-ink-soft">
              <Term k="opwf" />
            </dt>
            <dd className="tabular-nums">
              {fmt(c.opwf, d, c.unit)} <span className="text-ink-soft">(α {fmt(c.alpha, 2)})</span>
            </dd>
          </div>
        ) : null}
        <div>
          <dt className="text-ink-soft">Margin</dt>
          <dd className={`tabular-nums ${c.margin !== null && c.margin < 0 ? 'font-bold text-danger' : ''}`}>{fmt(c.margin, d, c.unit)}</dd>
        </div>
      </dl>
      {c.response ? <ResponseDetail detail={c.response} unit={c.unit} /> : null}
      {c.reason ? (
        <p className="mt-1 text-xs font-semibold" data-testid="limit-reason">
          {c.reason}
        </p>
      ) : null}
    </li>
  );
}

type ResponseDetailData = NonNullable<LimitCheck['response']>;

/** Words for the partitions the response engine reads: swells numbered when there are two. */
function responsePartitionLabels(parts: ResponseDetailData['partitions']): string[] {
  const swells = parts.filter((p) => p.kind === 'swell').length;
  let n = 0;
  return parts.map((p) => (p.kind === 'windSea' ? 'Wind sea' : swells > 1 ? `Swell ${++n}` : 'Swell'));
}

const percent = (share: number | null) => (share === null ? '–' : `${Math.round(share * 100)} %`);

/**
 * A response limit's figures (docs/domain.md#vessel-response): R_s and R_mpm (the one the limit
 * takes marked in words), the response's Tz, the equivalent Hs limit alpha is read at, and the sea
 * it came from, partition by partition at the worksite, with each one's share of the response.
 */
function ResponseDetail({ detail: r, unit }: { detail: ResponseDetailData; unit: string }) {
  const labels = responsePartitionLabels(r.partitions);
  const limited = (s: ResponseDetailData['statistic']) => (r.statistic === s ? ' (the limit)' : '');
  return (
    <div className="mt-2 border-t border-line pt-2" data-testid="response-detail">
      <dl className="grid grid-cols-2 gap-x-3 gap-y-1 text-xs">
        <div>
          <dt className="text-ink-soft">Significant R_s{limited('significant')}</dt>
          <dd className="tabular-nums" data-testid="response-significant">
            {fmt(r.significant, 2, unit)}
          </dd>
        </div>
        <div>
          <dt className="text-ink-soft">
            Most probable max R_mpm, {fmt(r.durationH, 1, 'h')}
            {limited('mpm')}
          </dt>
          <dd className="tabular-nums" data-testid="response-mpm">
            {fmt(r.mpm, 2, unit)}
          </dd>
        </div>
        <div>
          <dt className="text-ink-soft">Response zero-crossing period</dt>
          <dd className="tabular-nums">{fmt(r.tz, 1, 's')}</dd>
        </div>
        <div>
          <dt className="text-ink-soft">Hs total / equivalent Hs limit</dt>
          <dd className="tabular-nums" data-testid="response-hs">
            {fmt(r.hsTotal, 2, 'm')} / {r.hsEquivalent === null ? '–' : fmt(r.hsEquivalent, 2, 'm')}
          </dd>
        </div>
      </dl>
      <p className="mt-1 text-xs" data-testid="response-driven-by">
        {r.drivenBy
          ? `Driven by the ${labels[r.drivenBy.index].toLowerCase()} (${percent(r.drivenBy.share)} of the response's energy).`
          : 'No partition drives it: the response could not be computed for this hour.'}
      </p>
      {r.partitions.length > 0 ? (
        <table className="mt-1 w-full text-xs tabular-nums" data-testid="response-partitions">
          <caption className="text-left text-ink-soft">
            Sea at the worksite the response is computed from (a sea without partitions counts as one wind sea)
          </caption>
          <thead>
            <HeadingRow className="text-left text-ink-soft" headings={['Partition', 'Hs', 'Tp', 'Direction', 'Share']} />
          </thead>
          <tbody>
            {r.partitions.map((p, i) => (
              <tr key={i}>
                <th scope="row" className="text-left font-normal">
                  {labels[i]}
                  {r.drivenBy?.index === i ? ' (drives it)' : ''}
                </th>
                <td>{fmt(p.hsM, 2, 'm')}</td>
                <td>{fmt(p.tpS, 1, 's')}</td>
                <td>{p.dirDeg === null ? '–' : fmtDir(p.dirDeg)}</td>
                <td>{percent(p.share)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      ) : (
        <p className="mt-1 text-xs">No sea at the worksite for this hour: no data.</p>
      )}
    </div>
  );
}
