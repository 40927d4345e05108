import { formatDay } from '../../../shared/dates';

/**
 * A picked date read back in the product's one date style ("Thu 3 Dec 2026", with "14:00" for a
 * date and time), beside a native date picker, whose own display follows the browser's locale.
 */
export function DateEcho({ value }: { value: string | null | undefined }) {
  const match = /^(\d{4}-\d{2}-\d{2})(?:T(\d{2}:\d{2}))?/.exec(value ?? '');
  if (!match) return null;
  return (
    <span className="text-xs font-normal text-ink-soft" data-date-echo>
      {formatDay(match[1])}
      {match[2] ? ` ${match[2]}` : ''}
    </span>
  );
}
