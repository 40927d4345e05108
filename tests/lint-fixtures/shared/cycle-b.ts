// Bad: the other half of the cycle.
import { a } from './cycle-a';

export const b = (n: number): number => (n <= 0 ? 1 : a(n - 1));
