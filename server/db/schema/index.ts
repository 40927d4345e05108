export * from './auth';
export * from './projects';
export * from './datasets';
export * from './sites';
export * from './downtime';
export * from './alerts';
export * from './vessels';
