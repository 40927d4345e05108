/**
 * Short explanations of the trade's words as the product uses them, for tooltips on screen, the
 * printed report and e-mails alike (definitions in docs/domain.md: #operations-and-limits,
 * #weather-restricted, #weather-windows, #hindcast-statistics, #campaigns).
 */
export const GLOSSARY = {
  wow: {
    term: 'WoW',
    text: 'Waiting on weather: the hours spent waiting, from the moment an operation is ready, until a weather window long enough for it begins.',
  },
  goStart: {
    term: 'Go-start share',
    text: 'The share of hours at which the operation could start and stay within its limits for the whole reference period TR.',
  },
  censored: {
    term: 'Censored',
    text: 'The hindcast ended before a long enough window came, so the real wait is longer than the one counted: the figure is a lower bound.',
  },
  censoredYears: {
    term: 'Censored years',
    text: 'Hindcast years in which the campaign had not finished when the data ended; its duration in those years is at least the figure shown.',
  },
  oplim: {
    term: 'OPLIM',
    text: 'Operation limits: the highest sea state, wind and current in which the operation may be carried out, as the vessel and equipment allow.',
  },
  opwf: {
    term: 'OPWF',
    text: 'Forecast limit: OPLIM times the alpha factor α. Used against a forecast, so that forecast error leaves a margin.',
  },
  tr: {
    term: 'TR',
    text: 'Reference period: TPOP + TC. The weather must stay within the limits for all of it before the operation may start.',
  },
  tpop: {
    term: 'TPOP',
    text: 'Planned operation period: how long the operation itself is planned to take, in hours.',
  },
  tc: {
    term: 'TC',
    text: 'Contingency time: hours added to TPOP for delays and the unforeseen.',
  },
  alpha: {
    term: 'α (alpha factor)',
    text: 'A factor up to 1 that lowers the Hs limit on a forecast (OPWF = α × OPLIM) for forecast uncertainty. It is smaller for longer operations and lower limits.',
  },
  p50p90: {
    term: 'P50 / P90',
    text: 'Half of the hindcast years did no worse than P50; nine in ten did no worse than P90.',
  },
} as const;

export type GlossaryKey = keyof typeof GLOSSARY;
