/** About five round tick values from `min` up to 0 (steps of 1, 2 or 5 times a power of ten). */
export function depthTicks(min: number, count = 5): number[] {
  const raw = -min / count;
  const power = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * power).find((s) => s >= raw) ?? 10 * power;
  const ticks: number[] = [];
  for (let v = 0; v >= min - 1e-9 * step; v -= step) ticks.push(Number(v.toPrecision(12)));
  return ticks.reverse();
}
