// Bad: one feature imports another feature's internals.
import { betaLabel } from '../beta/labels';

export const alphaLabel = `alpha and ${betaLabel}`;
