import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { ProjectSettingsInput, CreateUserInput } from '../../shared/schemas/projects';
import { OperationInput, ProjectSetupDocument } from '../../shared/schemas/sites';
import { alphaTableSchema } from '../../shared/engine/schemas';
import { issuesInWords, pathInWords, problemSentence } from '../../shared/schemas/words';

// The words users must never read: zod's own English (its default locale), dotted schema paths and
// camel-case keys. The phrases are those issue 22 quotes from a hands-on run.
export const CODE_WORDS =
  /Too big|Too small|Invalid input|expected (?:number|string|boolean|array|object)|received \w+|<=|>=|NaN|\bundefined\b|[a-z][a-zA-Z]*[A-Z][a-zA-Z]*:|› [a-z]+[A-Z]|\b\w+ \d+ \d+\b/;

const settings = {
  name: 'Berth works',
  description: '',
  dataPointName: 'Offshore',
  dataPointLatitude: 10,
  dataPointLongitude: 3,
  dataPointDepthM: null,
  forecastSource: 'uploads',
};

function sentences(schema: z.ZodType, value: unknown): string[] {
  const r = schema.safeParse(value);
  expect(r.success).toBe(false);
  return issuesInWords(r.error as z.ZodError, value).map(problemSentence);
}

describe('validation messages in words (issue 22)', () => {
  it('says a latitude above 90 in words, naming the field', () => {
    const said = sentences(ProjectSettingsInput, { ...settings, dataPointLatitude: 95 });
    // latitudes run from -90 to 90 degrees (common practice, no source)
    expect(said).toEqual(['Data point latitude must be at most 90']);
  });

  it('says "must be a number" for text that is not a number (NaN), never "received NaN"', () => {
    const said = sentences(ProjectSettingsInput, { ...settings, dataPointLongitude: Number('abc') });
    expect(said).toEqual(['Data point longitude must be a number']);
  });

  it('says "is required" for a missing field instead of "expected string, received undefined"', () => {
    const said = sentences(CreateUserInput, { email: 'a@b.example' });
    expect(said).toEqual(['Name is required']);
    expect(sentences(CreateUserInput, { name: 'Ann', email: 'not mail' })).toEqual(['E-mail must be an e-mail address']);
  });

  it('names the operation, the limit and the curve point in a setup file, never "operations 2 › limits › hsTpCurve 2 1"', () => {
    const doc = {
      format: 'lullwatch-setup',
      version: 1,
      exportedAt: '2026-12-01T00:00:00Z',
      project: {},
      worksites: [],
      operations: [
        { name: 'Survey', tpop: 4, tc: 2, weatherRestricted: true, limits: { hsMax: 2 } },
        {
          name: 'Cable pull-in',
          tpop: 4,
          tc: 2,
          weatherRestricted: true,
          limits: {
            hsTpCurve: [
              [6, 1.5],
              [99, 1],
            ],
          },
        },
      ],
    };
    expect(pathInWords(['operations', 1, 'limits', 'hsTpCurve', 1, 0], doc)).toBe(
      'Operation 2 “Cable pull-in” › Limits › Hs–Tp curve point 2, Tp',
    );
    const said = sentences(ProjectSetupDocument, doc).join('\n');
    // The bound of Tp is 40 s in shared/engine/schemas.ts LIMIT_RANGES (a sanity bound, common practice, no source).
    expect(said).toContain('Operation 2 “Cable pull-in” › Limits › Hs–Tp curve point 2, Tp: Curve Tp must be at most 40 s');
    expect(said).not.toMatch(CODE_WORDS);
  });

  it('names the row and column of an alpha table value', () => {
    expect(pathInWords(['values', 1, 2])).toBe('Alpha row 2, column 3');
    const said = sentences(alphaTableSchema, {
      tpopBoundsH: [6, 72],
      hsColumnsM: [1, 2],
      values: [
        [0.8, 0.9],
        [0.7, 1.5],
      ],
    });
    expect(said).toEqual(['Alpha row 2, column 2: Alpha must not exceed 1']);
  });

  it('leaves no code words in any message of a badly filled operation', () => {
    const bad = {
      name: '',
      description: 'x'.repeat(5000),
      tpop: Number.NaN,
      tc: -1,
      weatherRestricted: 'yes',
      limits: { hsMax: 99, tpMin: 'a', tpExcluded: [[5, 2]], bedVelocityMethod: 'other' },
      siteIds: ['not-an-id'],
      skipperIds: [],
    };
    const said = sentences(OperationInput, bad);
    expect(said.length).toBeGreaterThanOrEqual(7);
    for (const s of said) expect(s, s).not.toMatch(CODE_WORDS);
    expect(said).toContain('TPOP must be a number');
  });
});
