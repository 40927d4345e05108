// The wave calculator's response form (shared/schemas/vessel.ts ResponseForm): the text of its
// fields to the request GET /api/wave/response takes, and errors in words on the field they concern.
// The request is then parsed by the server's own ResponseQuery, so the two must agree.
import { describe, expect, it } from 'vitest';
import { ResponseForm, ResponseQuery, type ResponseFormFields } from '../../shared/schemas/vessel';

const VESSEL = '7d1d4c1e-8a57-4c57-9d1b-2f1e0b6c9a11';
const BLANK: ResponseFormFields = {
  projectId: 'p',
  vesselId: VESSEL,
  heading: '0',
  sea: 'total',
  hs: '',
  tp: '',
  dir: '',
  windSeaHs: '',
  windSeaTp: '',
  windSeaDir: '',
  swell1Hs: '',
  swell1Tp: '',
  swell1Dir: '',
  swell2Hs: '',
  swell2Tp: '',
  swell2Dir: '',
};

const issues = (fields: Partial<ResponseFormFields>) => {
  const r = ResponseForm.safeParse({ ...BLANK, ...fields });
  return r.success ? [] : r.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message }));
};

describe('the response form', () => {
  it('gives a total sea as hs, tp and dir, with a decimal comma read as a point', () => {
    const r = ResponseForm.parse({ ...BLANK, heading: '12,5', hs: '1,5', tp: '9', dir: '270' });
    expect(r).toEqual({ vesselId: VESSEL, heading: 12.5, hs: 1.5, tp: 9, dir: 270 });
    // The server's query schema reads the same request (as the query string carries it).
    expect(ResponseQuery.safeParse({ vesselId: VESSEL, heading: '12.5', hs: '1.5', tp: '9', dir: '270' }).success).toBe(true);
  });

  it('gives partitions in order, leaving out a partition left blank', () => {
    const r = ResponseForm.parse({
      ...BLANK,
      sea: 'partitions',
      windSeaHs: '1.5',
      windSeaTp: '6',
      windSeaDir: '0',
      swell2Hs: '1',
      swell2Tp: '14',
      swell2Dir: '250',
    });
    expect(r.partitions).toEqual([
      { kind: 'windSea', hs: 1.5, tp: 6, dir: 0 },
      { kind: 'swell', hs: 1, tp: 14, dir: 250 },
    ]);
    expect(r.hs).toBeUndefined();
    const q = ResponseQuery.safeParse({ vesselId: VESSEL, heading: '0', partitions: JSON.stringify(r.partitions) });
    expect(q.success).toBe(true);
  });

  it('names what is missing or out of range on its own field', () => {
    expect(issues({ hs: '2', tp: '9' })).toEqual([{ path: 'dir', message: 'Enter the direction the waves come from' }]);
    expect(issues({ hs: '2', tp: '50', dir: '0' })).toEqual([{ path: 'tp', message: 'Tp must be between 1 and 40 s' }]);
    expect(issues({ hs: 'two', tp: '9', dir: '0' })).toEqual([{ path: 'hs', message: 'Hs must be a number' }]);
    expect(issues({ heading: '361', hs: '2', tp: '9', dir: '0' })).toEqual([
      { path: 'heading', message: 'Heading must be between 0 and 360°' },
    ]);
    expect(issues({ vesselId: '', hs: '2', tp: '9', dir: '0' })).toEqual([{ path: 'vesselId', message: 'Choose a vessel' }]);
    expect(issues({ sea: 'partitions', swell1Hs: '1', swell1Dir: '90' })).toEqual([
      { path: 'swell1Tp', message: 'Enter the swell 1 Tp (or leave all three blank)' },
    ]);
    expect(issues({ sea: 'partitions' })).toEqual([{ path: 'windSeaHs', message: 'Give at least one partition' }]);
  });
});
