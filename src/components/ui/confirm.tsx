import { useEffect, useId, useRef, type ReactNode } from 'react';
import { Button } from './button';

interface ConfirmProps {
  /** the question, e.g. "Remove Ann from Harbour works?" */
  title: string;
  /** what follows from saying yes */
  children?: ReactNode;
  confirmLabel: string;
  cancelLabel?: string;
  tone?: 'danger' | 'primary';
  busy?: boolean;
  onConfirm: () => void;
  onCancel: () => void;
}

/**
 * An inline question before a change that is hard to undo (removing someone, changing a role).
 * Takes the focus when it opens so a keyboard or screen-reader user meets the question at once;
 * Escape cancels.
 */
export function Confirm({
  title,
  children,
  confirmLabel,
  cancelLabel = 'Cancel',
  tone = 'danger',
  busy,
  onConfirm,
  onCancel,
}: ConfirmProps) {
  const titleId = useId();
  const first = useRef<HTMLButtonElement>(null);
  useEffect(() => {
    first.current?.focus();
  }, []);
  return (
    <div
      role="alertdialog"
      aria-labelledby={titleId}
      className="mt-2 rounded-lg border border-danger bg-danger-soft px-4 py-3 text-sm text-ink"
      onKeyDown={(e) => {
        if (e.key === 'Escape') onCancel();
      }}
    >
      <p id={titleId} className="font-semibold">
        {title}
      </p>
      {children ? <div className="mt-1">{children}</div> : null}
      <div className="mt-2 flex flex-wrap gap-2">
        <Button ref={first} variant={tone} onClick={onConfirm} disabled={busy}>
          {confirmLabel}
        </Button>
        <Button variant="secondary" onClick={onCancel}>
          {cancelLabel}
        </Button>
      </div>
    </div>
  );
}
