// Ensemble forecasts end to end (docs/domain.md#forecast-uncertainty): the demo's forecast is
// fetched from the fake with 20 members, stored columnar, read back unchanged, and the plan carries
// per-hour and per-window chances beside the deterministic status.
import { describe, expect, it } from 'vitest';
import { buildFakeForecast, latestIssueTimeMs } from '../../server/forecast';
import { DEMO_SEA_SEED } from '../../seed/demo';
import { readMembers } from '../../server/services/ensemble-store';
import { readSeries } from '../../server/services/series-store';
import { useSignedInApp } from '../support/app';

const NOW = new Date('2026-12-01T07:30:00Z');

const ctx = useSignedInApp({ clock: () => NOW, forecast: true }, { timeoutMs: 240_000 });

interface PlanBody {
  ensemble: { runs: number } | null;
  plans: {
    informationOnly: boolean;
    times: string[];
    status: string[];
    chance: number[] | null;
    startChance: number[] | null;
    windows: { start: string; chance: number | null }[];
  }[];
}

describe('an ensemble forecast', () => {
  it('is stored with its 20 members, which read back as the fake sent them', async () => {
    const list = await ctx.as.coordinator.get(`${ctx.base}/datasets`);
    const forecast = list.body.find((d: { kind: string }) => d.kind === 'forecast');
    expect(forecast.ensembleMembers).toBe(20);
    const control = await readSeries(ctx.t.deps.db, forecast.id);
    const members = await readMembers(ctx.t.deps.db, forecast.id, control);
    // What the fake answered for the project's data point at that clock (the same request again).
    const sent = buildFakeForecast({
      seed: DEMO_SEA_SEED,
      latitude: forecast.dataPoint.latitude,
      longitude: forecast.dataPoint.longitude,
      issuedAtMs: latestIssueTimeMs(NOW.getTime()),
      horizonDays: 10,
      members: 20,
    });
    expect(Array.from(control.hs)).toEqual(sent.series.hs);
    expect(members.map((m) => m.member)).toEqual(sent.members!.map((m) => m.member));
    for (const [k, m] of members.entries()) {
      for (const col of ['hs', 'tp', 'dir', 'wind', 'windDir'] as const) {
        expect(Array.from(m[col]), `member ${m.member} ${col}`).toEqual(sent.members![k].series[col]);
      }
      expect(m.timeMs).toBe(control.timeMs);
    }
    // A stretch of the control reads the same stretch of every member.
    const part = await readSeries(ctx.t.deps.db, forecast.id, { fromMs: control.timeMs[10], toMs: control.timeMs[30] });
    const partMembers = await readMembers(ctx.t.deps.db, forecast.id, part);
    expect(Array.from(partMembers[3].hs)).toEqual(sent.members![3].series.hs.slice(10, 31));
  });

  it('gives the plan a chance per hour and per window, consistent with the control being one of the 21 runs', async () => {
    // On OPLIM (alpha=false) the control's own status is one of the runs counted.
    const res = await ctx.as.skipper.get(`${ctx.base}/plan?alpha=false`);
    expect(res.status, res.text).toBe(200);
    const body = res.body as PlanBody;
    expect(body.ensemble).toEqual({ runs: 21 });
    let windows = 0;
    for (const p of body.plans) {
      expect(p.chance).toHaveLength(p.times.length);
      for (const [i, c] of p.chance!.entries()) {
        // Shares of 21 runs, rounded to 3 decimals.
        expect(Math.abs(c * 21 - Math.round(c * 21))).toBeLessThan(0.011);
        if (p.status[i] === 'workable') expect(c).toBeGreaterThanOrEqual(Math.floor((1000 * 1) / 21) / 1000);
        else expect(c).toBeLessThanOrEqual(Math.ceil((1000 * 20) / 21) / 1000);
      }
      if (p.informationOnly) {
        expect(p.startChance).toBeNull();
        continue;
      }
      for (const w of p.windows) {
        windows++;
        const i = p.times.indexOf(w.start);
        expect(w.chance).toBe(p.startChance![i]);
        // The control has a go-start at the window's start, so at least 1 of 21 runs holds.
        expect(w.chance!).toBeGreaterThanOrEqual(0.047);
        // Never more likely to hold TR than to be workable in its first hour.
        expect(w.chance!).toBeLessThanOrEqual(p.chance![i]);
      }
    }
    expect(windows).toBeGreaterThan(0);
  });

  it('has no chances for a dataset without members', async () => {
    const hindcast = await ctx.as.coordinator
      .post(`${ctx.base}/datasets`)
      .field('name', 'Two days')
      .field('kind', 'hindcast')
      .field('format', 'csv')
      .field('dataPointDepth', 'deep')
      .attach(
        'file',
        Buffer.from('time,hs,tp,wind\n2026-12-01T00:00Z,1.0,8,5\n2026-12-01T01:00Z,1.1,8,5\n2026-12-01T02:00Z,1.2,8,5\n'),
        'two.csv',
      );
    expect(hindcast.status, hindcast.text).toBe(201);
    const res = await ctx.as.skipper.get(`${ctx.base}/plan?dataset=${hindcast.body.id}`);
    expect(res.status, res.text).toBe(200);
    const body = res.body as PlanBody;
    expect(body.ensemble).toBeNull();
    for (const p of body.plans) {
      expect(p.chance).toBeNull();
      for (const w of p.windows) expect(w.chance).toBeNull();
    }
  });
});

describe('an ensemble forecast from CSV (a member column; 0 = the control)', () => {
  const upload = (name: string, text: string, kind = 'forecast') =>
    ctx.as.coordinator
      .post(`${ctx.base}/datasets`)
      .field('name', name)
      .field('kind', kind)
      .field('format', 'csv')
      .field('dataPointDepth', 'deep')
      .attach('file', Buffer.from(text), `${name}.csv`);
  const forecasts = async () => (await ctx.as.coordinator.get(`${ctx.base}/datasets`)).body.length as number;

  it('stores the control and each member, rows in any order of members', async () => {
    const text = [
      'time,member,hs,tp,wind',
      '2026-12-05T00:00Z,0,1.0,8,5',
      '2026-12-05T00:00Z,1,1.2,8.5,6',
      '2026-12-05T00:00Z,2,0.9,7.5,4',
      '2026-12-05T01:00Z,2,1.0,7.6,4.5',
      '2026-12-05T01:00Z,0,1.1,8.1,5.5',
      '2026-12-05T01:00Z,1,1.3,8.6,6.5',
    ].join('\n');
    const res = await upload('Ensemble CSV', text);
    expect(res.status, res.text).toBe(201);
    expect(res.body.records).toBe(2);
    const detail = (await ctx.as.coordinator.get(`${ctx.base}/datasets`)).body.find((d: { id: string }) => d.id === res.body.id);
    expect(detail.ensembleMembers).toBe(2);
    const control = await readSeries(ctx.t.deps.db, res.body.id);
    const members = await readMembers(ctx.t.deps.db, res.body.id, control);
    // The values as written in the file above.
    expect(Array.from(control.hs)).toEqual([1.0, 1.1]);
    expect(members.map((m) => [m.member, Array.from(m.hs), Array.from(m.tp), Array.from(m.wind)])).toEqual([
      [1, [1.2, 1.3], [8.5, 8.6], [6, 6.5]],
      [2, [0.9, 1.0], [7.5, 7.6], [4, 4.5]],
    ]);
  });

  it('refuses the whole file, naming line, column and value, for a bad member, a missing control or a member off the control times', async () => {
    const before = await forecasts();
    const bad = await upload('Bad member', 'time,member,hs\n2026-12-05T00:00Z,0,1.0\n2026-12-05T00:00Z,one,1.2\n');
    expect(bad.status, bad.text).toBe(400);
    expect(bad.body.error.details[0]).toMatchObject({ line: 3, column: 'member', value: 'one' });

    const noControl = await upload('No control', 'time,member,hs\n2026-12-05T00:00Z,1,1.0\n2026-12-05T01:00Z,1,1.2\n');
    expect(noControl.status, noControl.text).toBe(400);
    expect(noControl.body.error.message).toMatch(/member 0/);

    const short = await upload(
      'Short member',
      'time,member,hs\n2026-12-05T00:00Z,0,1.0\n2026-12-05T01:00Z,0,1.1\n2026-12-05T00:00Z,1,1.2\n',
    );
    expect(short.status, short.text).toBe(400);
    // The control's row at 01:00 (line 3) has no partner in member 1.
    expect(short.body.error.details[0]).toMatchObject({ line: 3, column: 'member' });
    expect(short.body.error.details[0].reason).toMatch(/member 1 has no row/);

    const extra = await upload('Extra time', 'time,member,hs\n2026-12-05T00:00Z,0,1.0\n2026-12-05T00:00Z,1,1.2\n2026-12-05T02:00Z,1,1.3\n');
    expect(extra.status, extra.text).toBe(400);
    expect(extra.body.error.details[0]).toMatchObject({ line: 4, column: 'member', value: '1' });

    // A bad value inside a member's row is named at its own line of the file.
    const value = await upload(
      'Bad value',
      'time,member,hs\n2026-12-05T00:00Z,0,1.0\n2026-12-05T01:00Z,0,1.1\n2026-12-05T00:00Z,1,1.2\n2026-12-05T01:00Z,1,-3\n',
    );
    expect(value.status, value.text).toBe(400);
    expect(value.body.error.details).toContainEqual(expect.objectContaining({ line: 5, column: 'hs', value: '-3' }));

    const hindcast = await upload('Member hindcast', 'time,member,hs\n2026-12-05T00:00Z,0,1.0\n', 'hindcast');
    expect(hindcast.status, hindcast.text).toBe(400);
    expect(hindcast.body.error.message).toMatch(/forecast/);
    // All-or-nothing: nothing of the refused files was stored.
    expect(await forecasts()).toBe(before);
  });
});
