// Scale: 30 years of hourly records (262,968 rows, about 18 MB of CSV with 9 columns) streamed in
// 64 KiB chunks as the server does. Speed is measured by `npm run bench`, not here.
import { describe, expect, it } from 'vitest';
import { CsvTextParser, summarise } from '../../shared/seadata';

const N = 262_968; // hourly records from 1994-01-01 to 2023-12-31 (10,957 days * 24), issue 4

function hindcastCsv(): string {
  const parts: string[] = ['time,Hs [m],Tp [s],Tm02 [s],Tm-10 [s],MWD [deg],Wind speed [m/s],Wind direction [deg],Hmax [m]\n'];
  const t0 = Date.UTC(1994, 0, 1);
  for (let i = 0; i < N; i++) {
    const t = new Date(t0 + i * 3_600_000).toISOString().slice(0, 19) + 'Z';
    const hs = 1 + 0.8 * Math.sin(i / 500) + (i % 17) / 40;
    parts.push(
      `${t},${hs.toFixed(3)},${(9 + Math.sin(i / 300)).toFixed(3)},${(6.5 + (i % 7) / 10).toFixed(3)},` +
        `${(8 + (i % 5) / 10).toFixed(3)},${((i * 0.37) % 360).toFixed(1)},${(7 + 5 * Math.sin(i / 90)).toFixed(2)},${((i * 1.3) % 360).toFixed(1)},${(hs * 1.8).toFixed(3)}\n`,
    );
  }
  return parts.join('');
}

describe('a 30-year hourly file', () => {
  it('reads every record of 30 years of hourly CSV streamed in chunks', () => {
    const text = hindcastCsv();
    expect(text.length).toBeGreaterThan(17e6);
    const p = new CsvTextParser();
    for (let i = 0; i < text.length; i += 65_536) p.push(text.slice(i, i + 65_536));
    const { records } = p.end();
    const s = summarise(records);
    expect(s.records).toBe(N);
    expect(s.stepMinutes).toBe(60);
    expect(s.endMs).toBe(Date.UTC(2023, 11, 31, 23));
  });
});
