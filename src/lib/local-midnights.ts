import { addDays, startOfDay } from 'date-fns';
import { tz } from '@date-fns/tz';

/** Midnights of the days in `zone` from `fromMs` to `toMs`, every `stepDays` days, UTC ms (chart gridlines and ticks). */
export function localMidnights(fromMs: number, toMs: number, zone: string, stepDays = 1): number[] {
  const inZone = { in: tz(zone) };
  const out: number[] = [];
  let d = startOfDay(fromMs, inZone);
  if (d.getTime() < fromMs) d = addDays(d, 1, inZone);
  while (d.getTime() <= toMs) {
    out.push(d.getTime());
    d = addDays(d, stepDays, inZone);
  }
  return out;
}

const DAY_MS = 86_400_000;

/**
 * Ticks of a date axis from `fromMs` to `toMs`: local midnights in `zone`, every whole number of
 * days chosen so that at most `maxTicks` fall in the range (a tick never repeats a day's label).
 */
export function dayTicks(fromMs: number, toMs: number, zone: string, maxTicks = 6): number[] {
  const days = Math.max(1, (toMs - fromMs) / DAY_MS);
  return localMidnights(fromMs, toMs, zone, Math.max(1, Math.ceil(days / maxTicks)));
}
