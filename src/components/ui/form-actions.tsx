import { Button } from './button';
import { ErrorNotice } from './error-notice';

/** A form that edits something and locks Cancel while it saves (the setup's add-or-edit forms). */
export const EDIT_FORM_ACTIONS = { pendingLabel: 'Saving…', cancelVariant: 'secondary', lockCancel: true } as const;

/**
 * The end of a form: the error of its submission, the submit button (`pendingLabel` while it is
 * sent) and Cancel (`cancelVariant`; `lockCancel` disables it while the form is sent).
 */
export function SubmitOrCancel({
  mutation: { isPending: pending, error },
  label,
  pendingLabel = label,
  onCancel,
  cancelVariant = 'ghost',
  lockCancel = false,
  className = 'flex flex-wrap gap-2',
}: {
  /** The form's write: whether it is being sent, and its error. */
  mutation: { isPending: boolean; error: unknown };
  label: string;
  pendingLabel?: string;
  onCancel: () => void;
  cancelVariant?: 'ghost' | 'secondary';
  lockCancel?: boolean;
  className?: string;
}) {
  return (
    <>
      <ErrorNotice error={error} />
      <div className={className}>
        <Button type="submit" disabled={pending}>
          {pending ? pendingLabel : label}
        </Button>
        <Button variant={cancelVariant} onClick={onCancel} disabled={lockCancel && pending}>
          Cancel
        </Button>
      </div>
    </>
  );
}
