// Invented worksites and operations of the demo campaign. The positions are arbitrary: a real
// stretch of west-facing Atlantic coast (chosen at random, names invented) so that the map and the
// depths agree. The worksites lie on one line square to the coast, at 0.5, 1.3, 5 and 16 km from
// the coastline, and the shore-normal bearing (258 deg, the seaward direction) is the coastline's
// own; tests/unit/demo-positions.test.ts checks them against Natural Earth's land.
// The limits are plausible figures for the kind of work (common practice, no source); a real
// project takes them from its vessels' and contractors' method statements and the marine
// warranty surveyor.

export const DEMO_SITES = [
  {
    key: 'cofferdam',
    name: 'Landfall cofferdam',
    depthM: 3.5,
    shoreNormalDeg: 258,
    breakerIndex: 0.6,
    latitude: 50.0775,
    longitude: -5.7207,
  },
  {
    key: 'trench',
    name: 'Nearshore trench KP 0.8',
    depthM: 8,
    shoreNormalDeg: 258,
    breakerIndex: 0.6,
    latitude: 50.076,
    longitude: -5.7316,
  },
  { key: 'route', name: 'Cable route KP 4.5', depthM: 19, shoreNormalDeg: 258, breakerIndex: 0.6, latitude: 50.069, longitude: -5.782 },
  {
    key: 'substation',
    name: 'Offshore substation approach',
    depthM: 38,
    shoreNormalDeg: null,
    breakerIndex: 0.6,
    latitude: 50.049,
    longitude: -5.933,
  },
] as const;

export const DEMO_TIME_ZONE = 'Europe/London';

/**
 * Invented tide constants of the two shallow worksites (docs/domain.md#tide): a semi-diurnal tide
 * of about 4 m spring range, phase lags referred to UTC, Z0 = mean sea level above LAT. Not taken
 * from any station; a real project enters its own or picks a database station.
 */
const DEMO_TIDE = {
  source: 'constants' as const,
  constituents: [
    { name: 'M2', amplitude: 1.45, phase: 172 },
    { name: 'S2', amplitude: 0.52, phase: 214 },
    { name: 'N2', amplitude: 0.28, phase: 151 },
    { name: 'K1', amplitude: 0.09, phase: 188 },
    { name: 'O1', amplitude: 0.07, phase: 37 },
  ],
  z0: 2.45,
  datum: 'LAT',
};
export const DEMO_SITE_TIDES: Partial<Record<(typeof DEMO_SITES)[number]['key'], typeof DEMO_TIDE>> = {
  cofferdam: DEMO_TIDE,
  trench: DEMO_TIDE,
};

type SiteKey = (typeof DEMO_SITES)[number]['key'];

export const DEMO_OPERATIONS: {
  name: string;
  description: string;
  tpopH: number;
  tcH: number;
  weatherRestricted: boolean;
  limits: Record<string, unknown>;
  sites: SiteKey[];
  skipper: boolean;
  recurrence?: { start: string; timeZone: string; rule: string };
}[] = [
  {
    name: 'Cable pull-in at landfall',
    description: 'Winch the cable end through the duct into the cofferdam; divers on the bell mouth.',
    tpopH: 18,
    tcH: 6,
    weatherRestricted: true,
    limits: { hsMax: 1.0, windMax: 12, bedVelocityMax: 0.6, bedVelocityMethod: 'linear' },
    sites: ['cofferdam', 'trench'],
    skipper: false,
  },
  {
    // The pull-in's winching stage: the barge floats over the duct only around high water.
    name: 'Pull-in winching at high water',
    description: 'Float the pull-in barge over the duct end and winch; needs water under the keel, so only around high water.',
    tpopH: 4,
    tcH: 1,
    weatherRestricted: true,
    limits: {
      hsMax: 1.5,
      windMax: 14,
      minDepth: 5,
      minDepthParts: { draught: 4.2, clearance: 0.8 },
      tideWindow: { reference: 'high', before: 3, after: 3 },
    },
    sites: ['cofferdam'],
    skipper: false,
  },
  {
    name: 'Cable lay, nearshore section',
    description: 'Lay from the trench to KP 4.5 with the lay barge on anchors.',
    tpopH: 36,
    tcH: 12,
    weatherRestricted: true,
    limits: {
      hsTpCurve: [
        [4, 1.8],
        [8, 1.5],
        [12, 1.2],
        [16, 1.0],
      ],
      // Long-period swell snatches the cable in the chute more than its height says (docs/domain.md#partitions).
      hsTargets: [{ target: 'longPeriod', minPeriodS: 12, max: 0.8 }],
      windMax: 15,
    },
    sites: ['trench', 'route'],
    skipper: false,
  },
  {
    name: 'Rock berm placement',
    description: 'Fall-pipe placement over the cable crossing; the vessel rolls badly in 13-15 s swell.',
    tpopH: 10,
    tcH: 4,
    weatherRestricted: true,
    limits: { hsMax: 1.5, tpExcluded: [[13, 15]], windMax: 16 },
    sites: ['route'],
    skipper: true,
  },
  {
    name: 'ROV burial survey',
    description: 'Work-class ROV survey of burial depth; limited by near-bed orbital velocity at the route.',
    tpopH: 8,
    tcH: 4,
    weatherRestricted: true,
    limits: { hsMax: 2.0, bedVelocityMax: 0.35, bedVelocityMethod: 'soulsby' },
    sites: ['route', 'substation'],
    skipper: true,
  },
  {
    name: 'Crew transfer (CTV Sable Wren)',
    description: 'Bow-on transfer to the substation boat landing.',
    tpopH: 2,
    tcH: 1,
    weatherRestricted: true,
    limits: { hsMax: 1.5, tpMin: 3, windMax: 14 },
    sites: ['substation'],
    skipper: true,
    // Crew change every Monday, Wednesday and Friday at 06:00 worksite time.
    recurrence: { start: '2026-01-05T06:00', timeZone: 'Europe/London', rule: 'FREQ=WEEKLY;BYDAY=MO,WE,FR' },
  },
];
