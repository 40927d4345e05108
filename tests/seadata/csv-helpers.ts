// Helpers of the CSV tests: parse a whole text, or the issues of a refused one.
import { expect } from 'vitest';
import { CsvTextParser, ImportError, type CsvTextParserOptions, type ImportIssue } from '../../shared/seadata';

export function parse(text: string, options: CsvTextParserOptions = {}) {
  const p = new CsvTextParser(options);
  p.push(text);
  return p.end();
}

export function issuesOf(text: string, options: CsvTextParserOptions = {}): ImportIssue[] {
  try {
    parse(text, options);
  } catch (e) {
    expect(e).toBeInstanceOf(ImportError);
    return (e as ImportError).issues;
  }
  throw new Error('expected an ImportError');
}
