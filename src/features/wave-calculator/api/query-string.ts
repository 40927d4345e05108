/** Query string of a wave-calculator request: numbers as typed, undefined parameters left out. */
export function waveQueryString(params: Record<string, number | undefined>): string {
  const qs = new URLSearchParams();
  for (const [name, value] of Object.entries(params)) {
    if (value !== undefined) qs.set(name, String(value));
  }
  return qs.toString();
}
