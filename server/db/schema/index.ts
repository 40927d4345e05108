export * from './auth';
export * from './projects';
