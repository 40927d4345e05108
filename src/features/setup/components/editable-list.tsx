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
 * confirmation says a delete does; without `canEdit` (not a coordinator) items have no actions.
 */
export function useEditableList(remove: UseMutationResult<void, Error, string>, noun: string, consequence: string, canEdit: boolean) {
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
  /** The Edit and Delete buttons of one item (none without `canEdit`). */
  const actions = (item: Named, className = 'flex flex-wrap gap-1') =>
    canEdit ? (
      <div className={className}>
        <Button variant="secondary" onClick={() => edit(item.id)} aria-label={`Edit ${item.name}`}>
          Edit
        </Button>
        <Button variant="ghost" className="text-danger" onClick={() => startDelete(item.id)} aria-label={`Delete ${item.name}`}>
          Delete
        </Button>
      </div>
    ) : null;
  return { noun, canEdit, editing, confirming, saved, edit, confirmBox, formDone, actions };
}

/**
 * A setup list's frame: the intro with the Add button (coordinators), the saved line, the form in
 * a card while one is open (scrolled into view when it opens; `form` gets the item it edits, null
 * for a new one), then the items, or a card saying there are none yet.
 */
export function EditableListFrame<T extends Named>({
  list,
  items,
  intro,
  form,
  empty,
  children,
}: {
  list: ReturnType<typeof useEditableList>;
  items: readonly T[];
  intro: ReactNode;
  form: (editing: T | null) => ReactNode;
  /** Shown when there are no items: the title, and what coordinators are asked to add. */
  empty: { title: string; addHint: string };
  children: ReactNode;
}) {
  const { canEdit, noun } = list;
  const editing = list.editing && list.editing !== 'new' ? (items.find((item) => item.id === list.editing) ?? null) : null;
  const formRef = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (list.editing) formRef.current?.scrollIntoView({ block: 'start', behavior: 'smooth' });
  }, [list.editing]);

  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <p className="max-w-3xl text-sm text-ink-soft">{intro}</p>
        {canEdit && list.editing !== 'new' ? <Button onClick={() => list.edit('new')}>{`Add ${noun.toLowerCase()}`}</Button> : null}
      </div>
      {list.saved ? <Notice tone="success">{list.saved}</Notice> : null}
      {canEdit && list.editing ? (
        <div ref={formRef} className="scroll-mt-4">
          <Card>
            <h2 className="mb-4 text-lg font-bold">{editing ? `Edit “${editing.name}”` : `New ${noun.toLowerCase()}`}</h2>
            {form(editing)}
          </Card>
        </div>
      ) : null}
      {items.length === 0 ? (
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
