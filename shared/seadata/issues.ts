/**
 * Problems found while importing sea-state files, reported line by line.
 *
 * The API answers a refused import with
 * `400 { error: { code, message, details: ImportIssue[] } }` (issue 4), so an issue carries the
 * 1-based line number of the text file, the column's header name, the raw value and a reason a
 * coordinator can act on.
 */

/** One problem in an imported file. */
export interface ImportIssue {
  /**
   * 1-based line number in the uploaded text (the header is line 1 in a CSV). 0 means the file
   * as a whole (e.g. "no usable record").
   */
  line: number;
  /**
   * Header name of the column (as written in the file), or '' for the whole row or file. For a
   * row refused for its size or for an unclosed quote, the 1-based place where it went wrong: the
   * field number (too many columns) or the character number in the line (the reason says which).
   */
  column: string;
  /** The raw text that was refused ('' when there is none). */
  value: string;
  /** Why it was refused, in plain words. */
  reason: string;
}

/** Issues kept in a list; beyond this only the total is counted (a garbage file can have millions). */
export const MAX_LISTED_ISSUES = 200;

/** Longest raw value quoted in an issue; longer ones are cut with an ellipsis. */
const MAX_VALUE_CHARS = 80;

/**
 * Collects issues: keeps the first {@link MAX_LISTED_ISSUES} and counts all of them.
 */
export class IssueList {
  readonly items: ImportIssue[] = [];
  private count = 0;

  constructor(private readonly limit = MAX_LISTED_ISSUES) {}

  /** Total number of issues added (listed or not). */
  get total(): number {
    return this.count;
  }

  /** True when issues were left out of {@link IssueList.items}. */
  get truncated(): boolean {
    return this.count > this.items.length;
  }

  add(line: number, column: string, value: string, reason: string): void {
    this.count++;
    if (this.items.length < this.limit) {
      this.items.push({ line, column: shownText(column), value: shownText(value), reason });
    }
  }
}

/**
 * Text from a file as an issue shows it (and as the import report stores it, in a jsonb column):
 * at most {@link MAX_VALUE_CHARS} characters, cut between code points, never inside a surrogate
 * pair; C0 control characters other than tab, line feed and carriage return, and DEL, as their
 * Unicode control pictures (U+2400-U+241F, U+2421), so that a NUL byte shows as '␀' and never
 * reaches PostgreSQL (whose text and jsonb cannot hold U+0000); a lone surrogate as U+FFFD (jsonb
 * refuses it too).
 */
export function shownText(raw: string): string {
  const cut = raw.length > MAX_VALUE_CHARS;
  let s = cut ? raw.slice(0, MAX_VALUE_CHARS) : raw;
  if (cut && /[\uD800-\uDBFF]$/.test(s)) s = s.slice(0, -1);
  // eslint-disable-next-line no-control-regex
  s = s.replace(/[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f]/g, (c) =>
    String.fromCharCode(c === '\u007f' ? 0x2421 : 0x2400 + c.charCodeAt(0)),
  );
  s = s.replace(/[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g, '\uFFFD');
  return cut ? `${s}…` : s;
}

/**
 * The file cannot be imported. Thrown by the parsers in `refuse` mode at the first `end()` after
 * any issue, and in both modes when the file is not readable at all (no header, no usable record).
 * Nothing is returned with it: the import service stores nothing.
 */
export class ImportError extends Error {
  override readonly name = 'ImportError';
  /** The first {@link MAX_LISTED_ISSUES} issues, in file order. */
  readonly issues: ImportIssue[];
  /** Total number of issues found (may exceed `issues.length`). */
  readonly issueCount: number;

  constructor(issues: ImportIssue[], issueCount = issues.length, message?: string) {
    super(message ?? ImportError.describe(issues, issueCount));
    this.issues = issues;
    this.issueCount = Math.max(issueCount, issues.length);
  }

  /** Builds an ImportError from an {@link IssueList}. */
  static fromList(list: IssueList, message?: string): ImportError {
    return new ImportError(list.items.slice(), list.total, message);
  }

  /** Builds an ImportError for one issue. */
  static single(line: number, column: string, value: string, reason: string): ImportError {
    const list = new IssueList();
    list.add(line, column, value, reason);
    return ImportError.fromList(list);
  }

  private static describe(issues: ImportIssue[], total: number): string {
    if (issues.length === 0) return 'The file cannot be imported.';
    const first = issues[0];
    const where = first.line > 0 ? `line ${first.line}` : 'file';
    const col = first.column ? `, column ${first.column}` : '';
    const more = total > 1 ? ` (and ${total - 1} more issue${total > 2 ? 's' : ''})` : '';
    return `The file cannot be imported: ${where}${col}: ${first.reason}${more}.`;
  }
}
