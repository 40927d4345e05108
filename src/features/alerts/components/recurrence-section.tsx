// "Recurring operations" (coordinators and admins): for each operation, whether and how it recurs
// (e.g. a crew change every Monday, Wednesday and Friday at 06:00 worksite time). The form builds
// the iCalendar rule, shows its RFC 5545 text and previews the next occurrences.
import { useState } from 'react';
import type { OperationResponse, SiteResponse } from '../../../../shared/api-types-sites';
import { recurrenceText, RecurrenceInput } from '../../../../shared/recurrence';
import { OCCURRENCE_VERDICTS, STATUS_WORDS } from '../../../../shared/status-words';
import { Button, SectionCard } from '../../../components/ui';
import type { StoredRecurrence } from '../api/types';
import { RecurrenceEditor } from './recurrence-editor';
import { parseRule, ruleInWords } from './recurrence-rule';

interface Props {
  projectId: string;
  operations: OperationResponse[];
  sites: SiteResponse[];
}

/** The stored recurrence of an operation, when it has a valid one. */
export function storedRecurrence(op: OperationResponse): StoredRecurrence | null {
  const parsed = RecurrenceInput.safeParse(op.recurrence);
  if (!parsed.success) return null;
  const text = typeof op.recurrence?.text === 'string' ? op.recurrence.text : recurrenceText(parsed.data);
  return { ...parsed.data, text };
}

export function RecurrenceSection({ projectId, operations, sites }: Props) {
  return (
    <SectionCard
      titleId="rec-title"
      title="Recurring operations"
      intro={
        <>
          An operation that repeats, such as a crew change on set days, is judged {OCCURRENCE_VERDICTS} for each occurrence from the hours
          [start, start + TR). Occurrences appear on the board and in the calendar feed, and an occurrence turning{' '}
          {STATUS_WORDS.not_workable.word} is an alert. A rule keeps its wall-clock time, so 06:00 stays 06:00 across a daylight-saving
          change.
        </>
      }
    >
      {operations.length === 0 ? <p className="mt-3 text-sm text-ink-soft">This project has no operations yet.</p> : null}
      <ul className="mt-4 flex flex-col gap-3">
        {operations.map((op) => (
          <OperationRecurrence key={op.id} projectId={projectId} op={op} sites={sites} />
        ))}
      </ul>
    </SectionCard>
  );
}

function OperationRecurrence({ projectId, op, sites }: { projectId: string; op: OperationResponse; sites: SiteResponse[] }) {
  const [editing, setEditing] = useState(false);
  const stored = storedRecurrence(op);
  const form = stored ? parseRule(stored) : null;
  const opSites = op.siteIds.length > 0 ? sites.filter((s) => op.siteIds.includes(s.id)) : sites;
  // The page states the worksites' zone once; a rule in its worksite's zone does not repeat it.
  const siteZone = opSites[0]?.timeZone ?? sites[0]?.timeZone ?? 'UTC';
  return (
    <li className="rounded-lg border border-line p-3" data-testid={`recurrence-${op.id}`}>
      <div className="flex flex-wrap items-start justify-between gap-2">
        <div className="min-w-0">
          <p className="font-semibold">
            {op.name}{' '}
            <span className="text-sm font-normal text-ink-soft">
              TR {op.tr} h · {opSites.map((s) => s.name).join(', ') || 'no worksite'}
            </span>
          </p>
          <p className="text-sm">
            {stored ? (
              form ? (
                ruleInWords(form, siteZone)
              ) : (
                'Recurs by a rule this form does not build (see its text when editing).'
              )
            ) : (
              <span className="text-ink-soft">Does not recur.</span>
            )}
          </p>
        </div>
        <Button variant={editing ? 'ghost' : 'secondary'} onClick={() => setEditing((e) => !e)} aria-expanded={editing}>
          {editing ? 'Close' : stored ? 'Edit recurrence' : 'Make it recur'}
        </Button>
      </div>
      {editing ? (
        <RecurrenceEditor
          projectId={projectId}
          operation={op}
          stored={stored}
          defaultTimeZone={siteZone}
          zones={[...new Set(sites.map((s) => s.timeZone))]}
          onDone={() => setEditing(false)}
        />
      ) : null}
    </li>
  );
}
