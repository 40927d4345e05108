// The transfer-table CSV reader on papaparse: quoted cells follow RFC 4180 (a quoted cell may hold
// the delimiter; "" inside quotes is one quote), and every problem keeps its line and column.
import { describe, expect, it } from 'vitest';
import { parseTransferTableCsv } from '../../shared/schemas/sites';

const TABLE = {
  directionSectorsDeg: [
    [0, 180],
    [180, 360],
  ],
  tpBandsS: [
    [0, 6],
    [6, 30],
  ],
  factors: [
    [0.5, 0.6],
    [0.7, 0.8],
  ],
};

describe('transfer-table CSV with quoted cells', () => {
  it('reads a quoted header cell that holds a comma as one cell (RFC 4180, section 2, rule 6)', () => {
    const csv = '"sector_from [deg, coming from]","sector_to [deg, coming from]",0-6,6-30\n0,180,0.5,0.6\n180,360,0.7,0.8\n';
    expect(parseTransferTableCsv(csv)).toEqual({ table: TABLE, issues: [] });
  });

  it('reads quoted numbers and a doubled quote inside a quoted cell', () => {
    const csv = 'sector_from,"sector_to ""deg""",0-6,6-30\n"0","180","0.5","0.6"\n180,360,0.7,0.8\n';
    expect(parseTransferTableCsv(csv)).toEqual({ table: TABLE, issues: [] });
  });

  it('takes the delimiter from outside the quotes: semicolons around quoted commas', () => {
    // Two commas inside the quoted cells against three semicolons outside them.
    const csv = 'sector_from;sector_to;"0,0-6";6-30\n0;180;"0,5";0,6\n180;360;0,7;0,8\n';
    expect(parseTransferTableCsv(csv)).toEqual({ table: TABLE, issues: [] });
  });

  it('reports a quote left open at its line, and reads the other lines', () => {
    const csv = 'sector_from,sector_to,0-6,6-30\n0,180,"0.5,0.6\n180,360,0.7,x\n';
    const { table, issues } = parseTransferTableCsv(csv);
    expect(table).toBeNull();
    expect(issues).toEqual([
      { line: 2, column: 0, value: '', reason: 'A quoted cell is not closed on this line' },
      { line: 3, column: 4, value: 'x', reason: expect.stringMatching(/number/) },
    ]);
  });
});
