// Clean: a feature's own module.
export const betaLabel = 'beta';
