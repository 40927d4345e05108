// Clean: pure code with no imports.
export const twice = (n: number): number => 2 * n;
