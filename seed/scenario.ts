// The invented demo scenario. Every name here is made up: the contractor, the coast, the
// vessels and the people do not exist. The data point's coordinates are an arbitrary open-sea
// position chosen for the demo, not a real installation.

export const DEMO_PASSWORD = 'lullwatch-demo';

export const DEMO_USERS = [
  { key: 'admin', email: 'admin@example.com', name: 'Demo Administrator', globalRole: 'admin' as const },
  { key: 'coordinator', email: 'coordinator@example.com', name: 'Demo Coordinator', globalRole: 'user' as const },
  { key: 'skipper', email: 'skipper@example.com', name: 'Demo Skipper', globalRole: 'user' as const },
  { key: 'client', email: 'client@example.com', name: 'Demo Client', globalRole: 'user' as const },
] as const;

export const DEMO_PROJECT = {
  name: 'Varrow Reach export cable and landfall',
  description:
    'Invented demo campaign: Saltmarrow Marine Works lays a 33 kV export cable from an offshore ' +
    'substation to a landfall on the fictional Varrow coast, with a rock berm, a diver-assisted ' +
    'duct pull-in and daily crew transfers by the CTV Sable Wren.',
  dataPointName: 'Varrow offshore point',
  // 20 km off the coast on the worksites' line (arbitrary, see scenario-sites.ts); the fake
  // forecast answers for its grid node at 50.00 N, 6.00 W, also at sea.
  dataPointLatitude: 50.041,
  dataPointLongitude: -5.988,
  dataPointDepthM: 42,
  forecastSource: 'service' as const,
};

/** The fields of a dataset the demo generates at the demo project's data point (no uploaded file). */
export const DEMO_GENERATED_DATASET = {
  dataPointName: DEMO_PROJECT.dataPointName,
  dataPointLatitude: DEMO_PROJECT.dataPointLatitude,
  dataPointLongitude: DEMO_PROJECT.dataPointLongitude,
  dataPointDepthM: DEMO_PROJECT.dataPointDepthM,
  sourceKind: 'upload' as const,
  originalFileName: null,
  format: 'generated (demo)',
};

/** A second, smaller project that the demo client does not belong to (shows per-project access). */
export const DEMO_SECOND_PROJECT = {
  name: 'Harl Sound pontoon renewal',
  description: 'Invented demo: replacing two floating pontoons inside a sheltered sound.',
};
