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
