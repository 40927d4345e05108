import { fieldLabel, problemSentence } from '../../../shared/schemas/words';
import { ApiError } from '../../lib/api';
import { Notice } from './card';

/**
 * Shows an API error in words, with the fields or lines it names; nothing without an error.
 * `className` (spacing such as `mt-3`) puts the notice in a box of that class.
 */
export function ErrorNotice({ error, className }: { error: unknown; className?: string }) {
  if (!error) return null;
  if (className) {
    return (
      <div className={className}>
        <ErrorNotice error={error} />
      </div>
    );
  }
  const message = error instanceof Error ? error.message : String(error);
  const details = error instanceof ApiError && error.details ? error.details.slice(0, 20) : [];
  return (
    <Notice tone="error">
      <p className="font-semibold">{message}</p>
      {details.length > 0 ? (
        <ul className="mt-2 list-disc pl-5">
          {details.map((d, i) => (
            <li key={i}>
              {d.line !== undefined ? `Line ${d.line}` : null}
              {d.column ? `, column ${d.column}` : null}
              {d.value !== undefined ? ` (“${d.value}”)` : null}
              {d.message !== undefined && (d.label || d.field)
                ? problemSentence({ label: d.label ?? fieldLabel(d.field ?? ''), message: d.message })
                : (d.message ?? (d.reason ? `: ${d.reason}` : null))}
            </li>
          ))}
        </ul>
      ) : null}
    </Notice>
  );
}
