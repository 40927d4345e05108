/**
 * Validation problems in words: the one place where zod's issue codes become plain sentences and
 * schema paths become field labels. The server's 400 answers (`server/http/errors.ts`), the setup
 * file check and every client form use it, so a user never reads "Too big: expected number to be
 * <=90" or "operations 2 › limits › hsTpCurve 2 1".
 *
 * Importing this module installs {@link plainIssueMessage} as zod's global error map; every shared
 * schema file imports it (through `common.ts`), so server and browser agree. A message a schema
 * gives itself ("Hs max must be at most 20 m") always wins over the global map.
 */
import { z } from 'zod';

/** Field keys of the shared schemas, in words. Unknown keys fall back to {@link fieldLabel}'s split. */
const LABELS: Record<string, string> = {
  name: 'Name',
  description: 'Description',
  email: 'E-mail',
  globalRole: 'Role',
  role: 'Role',
  active: 'Active',
  dataPointName: 'Data point name',
  dataPointLatitude: 'Data point latitude',
  dataPointLongitude: 'Data point longitude',
  dataPointDepthM: 'Water depth at the data point',
  forecastSource: 'Forecast source',
  project: 'Project',
  latitude: 'Latitude',
  longitude: 'Longitude',
  depth: 'Depth',
  depthM: 'Depth',
  shoreNormal: 'Shore normal',
  breakerIndex: 'Breaker index',
  timeZone: 'Time zone',
  hindcastDatasetId: 'Hindcast dataset',
  transferTable: 'Transfer table',
  tide: 'Tide',
  stationId: 'Tide station',
  constituents: 'Tide constituents',
  amplitude: 'Amplitude',
  phase: 'Phase',
  z0: 'Z0 (mean sea level above chart datum)',
  datum: 'Chart datum',
  directionSectorsDeg: 'Direction sectors',
  tpBandsS: 'Tp bands',
  factors: 'Factors',
  tpop: 'TPOP (planned duration)',
  tpopH: 'TPOP (planned duration)',
  tc: 'TC (contingency)',
  tcH: 'TC (contingency)',
  weatherRestricted: 'Weather-restricted',
  limits: 'Limits',
  hsMax: 'Hs max',
  hsTpCurve: 'Hs–Tp curve',
  tpMin: 'Tp min',
  tpMax: 'Tp max',
  tpExcluded: 'Excluded Tp bands',
  bedVelocityMax: 'Bed velocity max',
  bedVelocityMethod: 'Bed velocity method',
  windMax: 'Wind max',
  minDepth: 'Min depth',
  minDepthParts: 'Draught and under-keel clearance',
  draught: 'Draught',
  clearance: 'Under-keel clearance',
  maxDepth: 'Max depth',
  currentMax: 'Current max',
  tideWindow: 'Tide window',
  hsTargets: 'Hs limits on targets',
  minPeriodS: 'Long-period T*',
  tpExcludedMinHs: 'Band Hs threshold',
  reference: 'High or low water',
  before: 'Hours before',
  after: 'Hours after',
  siteIds: 'Worksites',
  siteId: 'Worksite',
  siteNames: 'Worksites',
  siteName: 'Worksite',
  operationIds: 'Operations',
  operationId: 'Operation',
  operationName: 'Operation',
  skipperIds: 'Skippers',
  alphaTable: 'Alpha table',
  tpopBoundsH: 'TPOP bounds',
  hsColumnsM: 'Hs columns',
  values: 'Alpha values',
  worksites: 'Worksites',
  operations: 'Operations',
  campaigns: 'Campaigns',
  steps: 'Steps',
  plannedStart: 'Planned start',
  lostHours: 'Lost hours',
  limiting: 'Limiting factor',
  note: 'Note',
  from: 'From',
  to: 'To',
  immediate: 'Immediate alerts',
  digest: 'Daily digest',
  digestTime: 'Digest time',
  digestTimeZone: 'Digest time zone',
  format: 'File format',
  version: 'File version',
  exportedAt: 'Export time',
  period: 'Period',
  height: 'Wave height',
  z: 'Height above the seabed point (z)',
  hs: 'Hs',
  tp: 'Tp',
  kind: 'Kind',
  anemometerHeightM: 'Anemometer height',
  gridPoint: 'Grid point',
  variables: 'NetCDF variables',
  waterLevelOffset: 'Water level offset to chart datum',
  delimiter: 'Delimiter',
  decimalComma: 'Decimal comma',
  dateOrder: 'Date order',
  missingCodes: 'Missing-value codes',
  onBadRows: 'Bad rows',
  mapping: 'Column mapping',
  units: 'Units',
  file: 'File',
  rule: 'Repeat rule',
  start: 'Start',
};

/** One entry of a list, in words ("Operation 3"), keyed by the list's field. */
const ITEM: Record<string, string> = {
  worksites: 'Worksite',
  operations: 'Operation',
  campaigns: 'Campaign',
  steps: 'Step',
  hsTpCurve: 'Hs–Tp curve point',
  tpExcluded: 'Excluded Tp band',
  hsTargets: 'Hs limit on a target',
  directionSectorsDeg: 'Direction sector',
  tpBandsS: 'Tp band',
  factors: 'Factor row',
  tpopBoundsH: 'TPOP bound',
  hsColumnsM: 'Hs column',
  values: 'Alpha row',
  siteIds: 'Worksite',
  siteNames: 'Worksite',
  operationIds: 'Operation',
  skipperIds: 'Skipper',
  missingCodes: 'Missing-value code',
};

/** Lists of rows whose next index is a column. */
const TABLES = new Set(['values', 'factors']);

/** Names of a tuple's places, keyed by the list's field ("Hs–Tp curve point 2, Tp"). */
const TUPLE: Record<string, readonly string[]> = {
  hsTpCurve: ['Tp', 'Hs'],
  tpExcluded: ['from', 'to'],
  directionSectorsDeg: ['from', 'to'],
  tpBandsS: ['from', 'to'],
};

/** A schema key in words: its label, or the camel-case key split into words ("dataPoint" -> "Data point"). */
export function fieldLabel(key: string): string {
  const known = LABELS[key];
  if (known) return known;
  const words = key
    .replace(/([a-z0-9])([A-Z])/g, '$1 $2')
    .replace(/[_.]+/g, ' ')
    .trim()
    .toLowerCase();
  return words ? words[0].toUpperCase() + words.slice(1) : 'This field';
}

/**
 * A zod issue path in words, naming list entries by number and by their `name` when the checked
 * value has one: `['operations', 1, 'limits', 'hsTpCurve', 1, 0]` on a setup file becomes
 * "Operation 2 “Lift” › Limits › Hs–Tp curve point 2, Tp". An empty path is `whole` ("The form").
 */
export function pathInWords(path: readonly PropertyKey[], value?: unknown, whole = 'The form'): string {
  const parts: string[] = [];
  const addToLast = (words: string) => {
    if (parts.length === 0) parts.push(words[0].toUpperCase() + words.slice(1));
    else parts[parts.length - 1] += `, ${words}`;
  };
  let node: unknown = value;
  // what a following number means: an entry of a list, a place of a tuple, a column of a table row
  let expect: { kind: 'list' | 'tuple' | 'row'; key: string } | null = null;
  for (const key of path) {
    const next = node && typeof node === 'object' ? (node as Record<PropertyKey, unknown>)[key as string] : undefined;
    if (typeof key === 'number') {
      if (expect?.kind === 'list') {
        const name =
          next && typeof next === 'object' && typeof (next as { name?: unknown }).name === 'string'
            ? (next as { name: string }).name
            : null;
        parts[parts.length - 1] = `${ITEM[expect.key] ?? `${fieldLabel(expect.key)}, entry`} ${key + 1}${name ? ` “${name}”` : ''}`;
        expect = TABLES.has(expect.key) ? { kind: 'row', key: expect.key } : TUPLE[expect.key] ? { kind: 'tuple', key: expect.key } : null;
      } else if (expect?.kind === 'tuple') {
        addToLast(TUPLE[expect.key]?.[key] ?? `value ${key + 1}`);
        expect = null;
      } else if (expect?.kind === 'row') {
        addToLast(`column ${key + 1}`);
        expect = null;
      } else {
        addToLast(`entry ${key + 1}`);
      }
    } else {
      parts.push(fieldLabel(String(key)));
      expect = { kind: 'list', key: String(key) };
    }
    node = next;
  }
  return parts.join(' › ') || whole;
}

/** A number as a person writes it (no "1e-4", no trailing zeros). */
function num(n: unknown): string {
  if (typeof n === 'bigint') return n.toString();
  if (typeof n !== 'number' || !Number.isFinite(n)) return String(n);
  return String(Number(n.toPrecision(12)));
}

const TYPE_WORDS: Record<string, string> = {
  number: 'must be a number',
  int: 'must be a whole number',
  string: 'must be text',
  boolean: 'must be yes or no',
  array: 'must be a list',
  object: 'must be a group of fields',
  date: 'must be a date',
};

const FORMAT_WORDS: Record<string, string> = {
  email: 'must be an e-mail address',
  uuid: 'must be the id of an existing item',
  guid: 'must be the id of an existing item',
  datetime: 'must be a date and time such as 2027-04-01T06:00:00Z',
  date: 'must be a date such as 2027-04-01',
  time: 'must be a time such as 06:00',
  url: 'must be a web address',
  regex: 'is not in the expected form',
  starts_with: 'is not in the expected form',
  ends_with: 'is not in the expected form',
  includes: 'is not in the expected form',
};

type RawIssue = Parameters<z.core.$ZodErrorMap>[0];

/**
 * Zod's error map in plain sentences, each written to follow a field label ("Latitude: must be at
 * most 90"). Used for every issue whose schema gives no message of its own.
 */
export function plainIssueMessage(issue: RawIssue): string {
  const i = issue as RawIssue & Record<string, unknown>;
  switch (issue.code) {
    case 'invalid_type': {
      const input = i.input;
      if (input === undefined || input === null || input === '') return 'is required';
      if (i.expected === 'number' && typeof input === 'number' && Number.isNaN(input)) return 'must be a number';
      if (i.expected === 'number' && typeof input === 'number') return 'must be a finite number';
      return TYPE_WORDS[String(i.expected)] ?? 'has the wrong kind of value';
    }
    case 'too_big': {
      const max = num(i.maximum);
      const incl = i.inclusive !== false;
      switch (i.origin) {
        case 'string':
          return `must be at most ${max} characters long`;
        case 'array':
        case 'set':
          return `may hold at most ${max} entries`;
        case 'date':
          return `must not be later than ${max}`;
        default:
          return incl ? `must be at most ${max}` : `must be below ${max}`;
      }
    }
    case 'too_small': {
      const min = num(i.minimum);
      const incl = i.inclusive !== false;
      switch (i.origin) {
        case 'string':
          return Number(i.minimum) <= 1 ? 'is required' : `must be at least ${min} characters long`;
        case 'array':
        case 'set':
          return Number(i.minimum) <= 1 ? 'needs at least one entry' : `needs at least ${min} entries`;
        case 'date':
          return `must not be earlier than ${min}`;
        default:
          return incl ? `must be at least ${min}` : `must be above ${min}`;
      }
    }
    case 'invalid_format':
      return FORMAT_WORDS[String(i.format)] ?? 'is not in the expected form';
    case 'not_multiple_of':
      return `must be a multiple of ${num(i.divisor)}`;
    case 'invalid_value': {
      const values = Array.isArray(i.values) ? (i.values as unknown[]) : [];
      if (values.length === 1) return `must be ${JSON.stringify(values[0])}`;
      return values.length > 0 ? `must be one of: ${values.map((v) => String(v)).join(', ')}` : 'is not an allowed value';
    }
    case 'unrecognized_keys': {
      const keys = Array.isArray(i.keys) ? (i.keys as string[]) : [];
      return `has fields this form does not know: ${keys.join(', ')}`;
    }
    case 'invalid_key':
    case 'invalid_element':
    case 'invalid_union':
      return 'is not valid';
    default:
      return 'is not valid';
  }
}

z.config({ customError: plainIssueMessage });

/** One problem for a user: the path as `field` (for forms), `label` in words and the `message`. */
export interface ProblemInWords {
  field: string;
  label: string;
  message: string;
}

/** Every issue of a zod error in words (see {@link pathInWords}), `value` the checked input. */
export function issuesInWords(error: z.ZodError, value?: unknown, whole?: string): ProblemInWords[] {
  return error.issues.map((iss) => ({
    field: iss.path.map(String).join('.') || '(body)',
    label: pathInWords(iss.path, value, whole),
    message: iss.message,
  }));
}

/** First words of a message that continues its field's label ("must be at most 90"). */
const FRAGMENT = /^(is|are|must|may|needs?|has|have|should|cannot|can|was|were|does|do)\b/;

/**
 * A problem as one sentence: "Data point latitude must be at most 90". A message that is a
 * sentence of its own follows the place after a colon; when it already names the field ("Hs max
 * must be at most 20 m"), the place is the path above the field, so the label is not said twice.
 */
export function problemSentence(p: { label: string; message: string }): string {
  const msg = p.message.trim();
  if (FRAGMENT.test(msg)) return `${p.label} ${msg}`;
  const parts = p.label.split(' › ');
  const last = (parts[parts.length - 1] ?? '').replace(/ \(.*\)$/, '');
  const text = msg[0] ? msg[0].toUpperCase() + msg.slice(1) : msg;
  if (last && text.toLowerCase().startsWith(last.toLowerCase())) {
    const place = parts.slice(0, -1).join(' › ');
    return place ? `${place}: ${text}` : text;
  }
  return `${p.label}: ${text}`;
}

/** A message to show under a field: first letter upper case, ending with a full stop. */
export function messageUnderField(message: string): string {
  const m = message.trim();
  if (!m) return m;
  const cap = m[0].toUpperCase() + m.slice(1);
  return /[.!?)]$/.test(cap) ? cap : `${cap}.`;
}
