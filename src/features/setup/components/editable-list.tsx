import type { UseMutationResult } from '@tanstack/react-query';
import { useEffect, useRef, useState, type ReactNode } from 'react';
import { Button, Card, Notice } from '../../../components/ui';
import { ConfirmBox } from './form-bits';

interface Named {
  id: string;
  name: string;
}

/**
 * The add, edit and delete state of a setup list (worksites, operations): which item the form
 * edits ('new' for a new one), which one waits for a delete confirmation, the last "saved" line.
 * `noun` starts the saved and deleted lines ("Worksite “Pier” saved."); `consequence` is what the
 * confirmation says a delete does.
 */
export function useEditableList(remove: UseMutationResult<void, Error, string>, noun: string, consequence: string) {
  const [editing, setEditing] = useState<'new' | string | null>(null);
  const [confirming, setConfirming] = useState<string | null>(null);
  const [saved, setSaved] = useState<string | null>(null);
  const edit = (id: 'new' | string) => {
    setEditing(id);
    setSaved(null);
  };
  const startDelete = (id: string) => {
    remove.reset();
    setConfirming(id);
    setSaved(null);
  };
  const confirmBox = (item: Named) => (
    <ConfirmBox
      what={`“${item.name}”`}
      consequence={consequence}
      onConfirm={() =>
        remove.mutate(item.id, {
          onSuccess: () => {
            setConfirming(null);
            setSaved(`${noun} “${item.name}” deleted.`);
            if (editing === item.id) setEditing(null);
          },
        })
      }
      onCancel={() => setConfirming(null)}
      pending={remove.isPending}
      error={remove.error}
    />
  );
  /** The form's end: closes it and, when it saved an item, says so. */
  const formDone = (item: Named | null | undefined) => {
    setEditing(null);
    if (item) setSaved(`${noun} “${item.name}” saved.`);
  };
  /** The Edit and Delete buttons of one item. */
  const actions = (item: Named, className = 'flex flex-wrap gap-1') => (
    <div className={className}>
      <Button variant="secondary" onClick={() => edit(item.id)} aria-label={`Edit ${item.name}`}>
        Edit
      </Button>
      <Button variant="ghost" className="text-danger" onClick={() => startDelete(item.id)} aria-label={`Delete ${item.name}`}>
        Delete
      </Button>
    </div>
  );
  return { editing, confirming, saved, edit, confirmBox, formDone, actions };
}

/**
 * A setup list's frame: the intro with the Add button (coordinators), the saved line, the form in
 * a card while one is open (scrolled into view when it opens), then the items, or a card saying
 * there are none yet.
 */
export function EditableListFrame({
  list,
  canEdit,
  intro,
  addLabel,
  formTitle,
  form,
  empty,
  children,
}: {
  list: ReturnType<typeof useEditableList>;
  canEdit: boolean;
  intro: ReactNode;
  addLabel: string;
  formTitle: string;
  form: ReactNode;
  /** Set when there are no items: the title, and what coordinators are asked to add. */
  empty: { title: string; addHint: string } | null;
  children: ReactNode;
}) {
  const formRef = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (list.editing) formRef.current?.scrollIntoView({ block: 'start', behavior: 'smooth' });
  }, [list.editing]);

  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <p className="max-w-3xl text-sm text-ink-soft">{intro}</p>
        {canEdit && list.editing !== 'new' ? <Button onClick={() => list.edit('new')}>{addLabel}</Button> : null}
      </div>
      {list.saved ? <Notice tone="success">{list.saved}</Notice> : null}
      {canEdit && list.editing ? (
        <div ref={formRef} className="scroll-mt-4">
          <Card>
            <h2 className="mb-4 text-lg font-bold">{formTitle}</h2>
            {form}
          </Card>
        </div>
      ) : null}
      {empty ? (
        <Card>
          <p className="font-semibold">{empty.title}</p>
          <p className="mt-1 text-sm text-ink-soft">{canEdit ? empty.addHint : 'A marine coordinator adds them.'}</p>
        </Card>
      ) : (
        children
      )}
    </div>
  );
}
