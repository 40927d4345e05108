import type { ReactNode } from 'react';

/** The choice among the public database's stations near a worksite: its legend, its error, then its radios. */
export function StationFieldset({
  legend,
  error,
  testId,
  children,
}: {
  legend: string;
  error: string | undefined;
  testId?: string;
  children: ReactNode;
}) {
  return (
    <fieldset className="flex flex-col gap-2" data-testid={testId}>
      <legend className="text-sm font-semibold">{legend}</legend>
      {error ? (
        <p role="alert" className="text-sm text-danger">
          {error}
        </p>
      ) : null}
      {children}
    </fieldset>
  );
}

/** One station (or none, id '') of a `group` of radios, described by `children`. */
export function StationRadio({
  group,
  id,
  chosen,
  onChoose,
  children,
}: {
  group: string;
  id: string;
  chosen: string;
  onChoose: (id: string) => void;
  children: ReactNode;
}) {
  return (
    <label className="flex min-h-11 items-start gap-3 rounded-md border border-line p-2 text-sm">
      <input
        type="radio"
        name={group}
        className="mt-1 size-5 accent-[var(--color-accent)]"
        checked={chosen === id}
        onChange={() => onChoose(id)}
      />
      <span>{children}</span>
    </label>
  );
}
