import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { generateSyntheticSea, type SyntheticSeaSeries } from '../../server/forecast';

const HOUR = 3_600_000;
const COLUMNS = ['hsM', 'tpS', 'dirDeg', 'windMps', 'windDirDeg'] as const;
/** Deep-water wavelength per Tp^2, g / (2 pi) with g = 9.81 m/s2 (docs/domain.md#dispersion: L0 = g T^2 / 2 pi). */
const L0_PER_TP2 = 9.81 / (2 * Math.PI);

// One long series shared by the statistical checks: 20 years hourly, 2001-2020 (175,320 records).
const START_2001 = Date.UTC(2001, 0, 1);
const twentyYears = generateSyntheticSea({ startMs: START_2001, hours: 175_320, seed: 7 });

function month(ms: number): number {
  return new Date(ms).getUTCMonth();
}
const isWinter = (ms: number) => [11, 0, 1].includes(month(ms));
const isSummer = (ms: number) => [5, 6, 7].includes(month(ms));

function meanWhere(s: SyntheticSeaSeries, pick: (ms: number) => boolean): number {
  let sum = 0;
  let n = 0;
  for (let i = 0; i < s.timeMs.length; i++) {
    if (pick(s.timeMs[i])) {
      sum += s.hsM[i];
      n++;
    }
  }
  return sum / n;
}

/** Signed smallest angle from a to b, deg in (-180, 180]. */
function angleDiff(a: number, b: number): number {
  const d = ((((b - a) % 360) + 540) % 360) - 180;
  return d === -180 ? 180 : d;
}

describe('generateSyntheticSea: shape and speed', () => {
  it('computes 20 years of hourly records (175,320) with regular UTC times', () => {
    const s = twentyYears;
    expect(s.timeMs.length).toBe(175_320);
    for (const c of COLUMNS) expect(s[c].length).toBe(175_320);
    expect(s.timeMs[0]).toBe(START_2001);
    // 20 years of 365.25 days end one hour before 2021-01-01T00:00Z (2001-2020 holds 5 leap years).
    expect(new Date(s.timeMs[175_319]).toISOString()).toBe('2020-12-31T23:00:00.000Z');
    for (let i = 1; i < s.timeMs.length; i++) if (s.timeMs[i] - s.timeMs[i - 1] !== HOUR) throw new Error(`step broken at ${i}`);
  });

  it('honours the step and the length of the period', () => {
    expect(generateSyntheticSea({ startMs: 0, hours: 24, stepMinutes: 10, seed: 1 }).timeMs.length).toBe(144);
    expect(generateSyntheticSea({ startMs: 0, hours: 24, stepMinutes: 180, seed: 1 }).timeMs.length).toBe(8);
    expect(generateSyntheticSea({ startMs: 0, hours: 0, seed: 1 }).hsM.length).toBe(0);
  });

  it('refuses invalid requests', () => {
    expect(() => generateSyntheticSea({ startMs: NaN, hours: 1, seed: 1 })).toThrow(RangeError);
    expect(() => generateSyntheticSea({ startMs: 0, hours: -1, seed: 1 })).toThrow(RangeError);
    expect(() => generateSyntheticSea({ startMs: 0, hours: 1, stepMinutes: 0, seed: 1 })).toThrow(RangeError);
    expect(() => generateSyntheticSea({ startMs: 0, hours: 1, seed: Infinity })).toThrow(RangeError);
    expect(() => generateSyntheticSea({ startMs: 0, hours: 1, seed: 1, climate: { summerMeanHsM: 3, winterMeanHsM: 2 } })).toThrow(
      RangeError,
    );
    expect(() => generateSyntheticSea({ startMs: 0, hours: 1, seed: 1, climate: { calmShare: 2 } })).toThrow(RangeError);
  });
});

describe('generateSyntheticSea: a pure function of seed and time', () => {
  const base = generateSyntheticSea({ startMs: Date.UTC(2024, 0, 1), hours: 24 * 120, seed: 99 });

  it('gives the same value at a given hour whatever window the call covers', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 24 * 100 }), fc.integer({ min: 1, max: 24 * 20 }), (offsetH, lengthH) => {
        const part = generateSyntheticSea({ startMs: Date.UTC(2024, 0, 1) + offsetH * HOUR, hours: lengthH, seed: 99 });
        for (let i = 0; i < part.timeMs.length; i++) {
          for (const c of COLUMNS) {
            if (part[c][i] !== base[c][offsetH + i]) return false;
          }
        }
        return true;
      }),
      { numRuns: 60 },
    );
  });

  it('gives the same values on the hour in a 10-minute series as in the hourly one', () => {
    const fine = generateSyntheticSea({ startMs: Date.UTC(2024, 1, 3, 5), hours: 72, stepMinutes: 10, seed: 99 });
    const offset = (Date.UTC(2024, 1, 3, 5) - Date.UTC(2024, 0, 1)) / HOUR;
    for (let h = 0; h < 72; h++) {
      for (const c of COLUMNS) expect(fine[c][h * 6]).toBe(base[c][offset + h]);
    }
  });

  it('repeats itself for one seed and differs between seeds', () => {
    const a = generateSyntheticSea({ startMs: Date.UTC(2024, 0, 1), hours: 24 * 30, seed: 99 });
    const b = generateSyntheticSea({ startMs: Date.UTC(2024, 0, 1), hours: 24 * 30, seed: 100 });
    expect(Array.from(a.hsM)).toEqual(Array.from(base.hsM.subarray(0, 720)));
    let same = 0;
    for (let i = 0; i < 720; i++) if (a.hsM[i] === b.hsM[i]) same++;
    expect(same).toBeLessThan(72);
  });
});

describe('generateSyntheticSea: realistic values', () => {
  it('keeps every value in its plausible range, rounded like real data', () => {
    const s = twentyYears;
    for (let i = 0; i < s.hsM.length; i++) {
      const hs = s.hsM[i];
      const tp = s.tpS[i];
      const ok =
        hs >= 0.05 &&
        hs <= 12 &&
        tp >= 2.5 &&
        tp <= 20 &&
        s.windMps[i] >= 2 &&
        s.windMps[i] <= 20 &&
        s.dirDeg[i] >= 0 &&
        s.dirDeg[i] < 360 &&
        Number.isInteger(s.dirDeg[i]) &&
        s.windDirDeg[i] >= 0 &&
        s.windDirDeg[i] < 360 &&
        Number.isInteger(s.windDirDeg[i]) &&
        Math.abs(hs * 100 - Math.round(hs * 100)) < 1e-6 &&
        Math.abs(tp * 10 - Math.round(tp * 10)) < 1e-6 &&
        Math.abs(s.windMps[i] * 10 - Math.round(s.windMps[i] * 10)) < 1e-6;
      if (!ok) throw new Error(`record ${i}: Hs ${hs} Tp ${tp} dir ${s.dirDeg[i]} wind ${s.windMps[i]} windDir ${s.windDirDeg[i]}`);
    }
  });

  it('keeps the steepness Hs/L0 at or below 1/15', () => {
    // Limiting sea-state steepness Sp = 2 pi Hs / (g Tp^2) = 1/15 for Tp <= 8 s (DNV-RP-C205, from
    // memory); the brief asks for Hs/L0 <= ~1/15 with L0 = 1.56 Tp^2.
    let worst = 0;
    for (let i = 0; i < twentyYears.hsM.length; i++) {
      worst = Math.max(worst, twentyYears.hsM[i] / (L0_PER_TP2 * twentyYears.tpS[i] ** 2));
    }
    expect(worst).toBeLessThanOrEqual(1 / 15);
    expect(worst).toBeGreaterThan(1 / 40); // the bound is approached, not trivially met
  });

  it('has rough winters and calm summers (northern-hemisphere temperate coast)', () => {
    // Ten years from 2001; targets of the brief: about 2.2 m in December-February, 1.0 m in June-August.
    const tenYears = twentyYears.timeMs.findIndex((t) => t >= Date.UTC(2011, 0, 1));
    const s: SyntheticSeaSeries = {
      timeMs: twentyYears.timeMs.subarray(0, tenYears),
      hsM: twentyYears.hsM.subarray(0, tenYears),
      tpS: twentyYears.tpS.subarray(0, tenYears),
      dirDeg: twentyYears.dirDeg.subarray(0, tenYears),
      windMps: twentyYears.windMps.subarray(0, tenYears),
      windDirDeg: twentyYears.windDirDeg.subarray(0, tenYears),
    };
    const winter = meanWhere(s, isWinter);
    const summer = meanWhere(s, isSummer);
    expect(winter).toBeGreaterThan(summer * 1.6);
    expect(winter).toBeGreaterThan(1.9);
    expect(winter).toBeLessThan(2.5);
    expect(summer).toBeGreaterThan(0.8);
    expect(summer).toBeLessThan(1.2);
  });

  it('follows a climate override, seasons flipped for the southern hemisphere', () => {
    const south = generateSyntheticSea({
      startMs: Date.UTC(2001, 0, 1),
      hours: 5 * 8766,
      seed: 3,
      climate: { roughestDayOfYear: 197, summerMeanHsM: 0.8, winterMeanHsM: 3 },
    });
    const dec2feb = meanWhere(south, isWinter);
    const jun2aug = meanWhere(south, isSummer);
    expect(jun2aug).toBeGreaterThan(2.6);
    expect(dec2feb).toBeLessThan(1.0);
  });

  it('passes weather systems every 3-7 days, with winter storm peaks of 3-7 m', () => {
    // Peaks: hours that are the highest within +-36 h, in December-February.
    const s = twentyYears;
    const peaks: number[] = [];
    for (let i = 36; i < s.hsM.length - 36; i++) {
      if (!isWinter(s.timeMs[i])) continue;
      let top = true;
      for (let j = i - 36; j <= i + 36 && top; j++) if (s.hsM[j] > s.hsM[i] || (s.hsM[j] === s.hsM[i] && j < i)) top = false;
      if (top) peaks.push(s.hsM[i]);
    }
    const winterDays = s.timeMs.filter(isWinter).length / 24;
    const daysBetween = winterDays / peaks.length;
    expect(daysBetween).toBeGreaterThanOrEqual(3);
    expect(daysBetween).toBeLessThanOrEqual(7);
    const storms = peaks.filter((p) => p >= 2).sort((a, b) => a - b);
    const median = storms[Math.floor(storms.length / 2)];
    const p90 = storms[Math.floor(storms.length * 0.9)];
    expect(median).toBeGreaterThanOrEqual(3);
    expect(median).toBeLessThanOrEqual(7);
    expect(p90).toBeLessThanOrEqual(7.5);
  });

  it('has calm spells: every winter a day below 1.5 m, every summer two days below 1 m', () => {
    const s = twentyYears;
    for (let year = 2001; year < 2020; year++) {
      const longestRun = (from: number, to: number, limit: number) => {
        let best = 0;
        let run = 0;
        for (let i = 0; i < s.timeMs.length; i++) {
          if (s.timeMs[i] < from || s.timeMs[i] >= to) continue;
          run = s.hsM[i] < limit ? run + 1 : 0;
          best = Math.max(best, run);
        }
        return best;
      };
      expect(longestRun(Date.UTC(year, 11, 1), Date.UTC(year + 1, 2, 1), 1.5), `winter ${year}`).toBeGreaterThanOrEqual(24);
      expect(longestRun(Date.UTC(year, 5, 1), Date.UTC(year, 8, 1), 1.0), `summer ${year}`).toBeGreaterThanOrEqual(48);
    }
  });

  it('mixes swell and wind sea, with longer periods in bigger seas', () => {
    const s = twentyYears;
    let swell = 0;
    let windSea = 0;
    let tpBig = 0;
    let nBig = 0;
    let tpMid = 0;
    let nMid = 0;
    for (let i = 0; i < s.hsM.length; i++) {
      if (s.tpS[i] >= 11 && s.hsM[i] < 2) swell++;
      if (s.tpS[i] < 7) windSea++;
      if (s.hsM[i] >= 4) {
        tpBig += s.tpS[i];
        nBig++;
      } else if (s.hsM[i] >= 1 && s.hsM[i] < 2) {
        tpMid += s.tpS[i];
        nMid++;
      }
    }
    expect(swell / s.hsM.length).toBeGreaterThan(0.05);
    expect(windSea / s.hsM.length).toBeGreaterThan(0.15);
    // Storm seas of 4 m and more: peak periods of about 8-14 s (common practice, no source).
    expect(tpBig / nBig).toBeGreaterThan(8);
    expect(tpBig / nBig).toBeLessThan(14);
    expect(tpBig / nBig).toBeGreaterThan(tpMid / nMid);
  });

  it('comes mostly from the prevailing 200-290 deg sector and veers through each system', () => {
    const s = twentyYears;
    let inSector = 0;
    for (let i = 0; i < s.dirDeg.length; i++) if (s.dirDeg[i] >= 200 && s.dirDeg[i] <= 290) inSector++;
    expect(inSector / s.dirDeg.length).toBeGreaterThan(0.6);
    // Around winter storm peaks above 3 m, the wind direction 12 h after minus 12 h before is
    // clockwise (positive) on average: a depression passing poleward of a northern-hemisphere site.
    let turn = 0;
    let n = 0;
    for (let i = 36; i < s.hsM.length - 36; i++) {
      if (!isWinter(s.timeMs[i]) || s.hsM[i] < 3) continue;
      let top = true;
      for (let j = i - 36; j <= i + 36 && top; j++) if (s.hsM[j] > s.hsM[i] || (s.hsM[j] === s.hsM[i] && j < i)) top = false;
      if (!top) continue;
      turn += angleDiff(s.windDirDeg[i - 12], s.windDirDeg[i + 12]);
      n++;
    }
    expect(n).toBeGreaterThan(100);
    expect(turn / n).toBeGreaterThan(10);
  });

  it('blows harder when the sea is rough', () => {
    const s = twentyYears;
    const n = s.hsM.length;
    let mx = 0;
    let my = 0;
    for (let i = 0; i < n; i++) {
      mx += s.hsM[i];
      my += s.windMps[i];
    }
    mx /= n;
    my /= n;
    let sxy = 0;
    let sxx = 0;
    let syy = 0;
    let windBig = 0;
    let nBig = 0;
    for (let i = 0; i < n; i++) {
      sxy += (s.hsM[i] - mx) * (s.windMps[i] - my);
      sxx += (s.hsM[i] - mx) ** 2;
      syy += (s.windMps[i] - my) ** 2;
      if (s.hsM[i] >= 4) {
        windBig += s.windMps[i];
        nBig++;
      }
    }
    expect(sxy / Math.sqrt(sxx * syy)).toBeGreaterThan(0.6);
    // A 4 m wind sea needs at least the wind of a fully developed Pierson-Moskowitz sea,
    // Hs = 0.21 U^2 / g (from memory), U = sqrt(4 * 9.81 / 0.21) = 13.7 m/s; decaying seas have
    // less wind, so only the mean is checked, against a lower 10 m/s.
    expect(windBig / nBig).toBeGreaterThan(10);
  });
});

describe('generateSyntheticSea: partitions (docs/domain.md#partitions)', () => {
  // Two winters and a summer, hourly, with partitions; the totals must be those of the plain call.
  const start = Date.UTC(2021, 9, 1);
  const plain = generateSyntheticSea({ startMs: start, hours: 24 * 400, seed: 11 });
  const split = generateSyntheticSea({ startMs: start, hours: 24 * 400, seed: 11, partitions: true });
  const p = split.partitions!;

  it('leaves the totals as they are without partitions', () => {
    expect(plain.partitions).toBeUndefined();
    for (const c of COLUMNS) expect(Array.from(split[c])).toEqual(Array.from(plain[c]));
  });

  it('adds energies: sqrt(sum Hs_i^2) is the total within rounding (common practice, no source)', () => {
    let worst = 0;
    for (let i = 0; i < split.hsM.length; i++) {
      const sum = Math.hypot(p.windSea.hsM[i], p.swell1.hsM[i], p.swell2.hsM[i]);
      // each of four values rounded to 0.01 m; the total floored at 0.05 m
      worst = Math.max(worst, Math.abs(sum - Math.max(split.hsM[i], 0.05)) - 0.02);
    }
    expect(worst).toBeLessThanOrEqual(0.01);
  });

  it('has a long-period swell from west of the prevailing south-westerly, slowly varying, under a wind sea following the wind', () => {
    const swellTp: number[] = [];
    let dirOff = 0;
    let n = 0;
    let jumps = 0;
    let windAgree = 0;
    let windN = 0;
    for (let i = 0; i < split.hsM.length; i++) {
      if (p.swell1.hsM[i] >= 0.3) {
        swellTp.push(p.swell1.tpS[i]);
        dirOff += Math.abs(angleDiff(p.swell1.dirDeg[i], 265));
        n++;
        if (i > 0 && p.swell1.hsM[i - 1] > 0 && Math.abs(p.swell1.hsM[i] - p.swell1.hsM[i - 1]) > 0.15 * p.swell1.hsM[i]) jumps++;
      }
      if (p.windSea.hsM[i] >= 1.5 && split.windMps[i] >= 10) {
        windN++;
        if (Math.abs(angleDiff(p.windSea.dirDeg[i], split.windDirDeg[i])) <= 45) windAgree++;
      }
    }
    expect(n).toBeGreaterThan(1000);
    swellTp.sort((a, b) => a - b);
    // Swell from distant storms: 11-16 s at the source (common practice: swell periods above 10 s).
    expect(swellTp[Math.floor(swellTp.length * 0.05)]).toBeGreaterThanOrEqual(10);
    expect(swellTp[Math.floor(swellTp.length * 0.95)]).toBeLessThanOrEqual(18);
    expect(dirOff / n).toBeLessThan(20); // about W-WSW
    expect(jumps / n).toBeLessThan(0.01); // changes over hours, not from one hour to the next
    expect(windN).toBeGreaterThan(100);
    expect(windAgree / windN).toBeGreaterThan(0.8);
  });
});
