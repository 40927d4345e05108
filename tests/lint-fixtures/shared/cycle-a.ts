// Bad: cycle-a imports cycle-b, which imports cycle-a.
import { b } from './cycle-b';

export const a = (n: number): number => (n <= 0 ? 0 : b(n - 1));
