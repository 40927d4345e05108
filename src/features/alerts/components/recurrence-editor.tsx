// The recurrence form of one operation: builds the rule from frequency, weekdays, interval, local
// start and an optional end; shows the RFC 5545 text and the next five occurrences in the zone's
// local time (the same expansion the server uses, shared/recurrence.ts); saves or removes it.
import { useState } from 'react';
import { Controller, useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { format } from 'date-fns';
import { tz } from '@date-fns/tz';
import type { OperationResponse } from '../../../../shared/api-types-sites';
import { expandRecurrence, RecurrenceInput, recurrenceText, WEEKDAYS } from '../../../../shared/recurrence';
import { Button, ErrorNotice, FieldShell, Input, Notice, PlainOptions, Select } from '../../../components/ui';
import { DateEcho } from '../../../components/ui/date-echo';
import { useRemoveRecurrence } from '../api/remove-recurrence';
import { useSaveRecurrence } from '../api/save-recurrence';
import type { StoredRecurrence } from '../api/types';
import { msIn, timeZoneList } from './format';
import {
  MAX_COUNT,
  MAX_INTERVAL,
  parseRule,
  RecurrenceForm,
  ruleInWords,
  toRecurrenceInput,
  WEEKDAY_LONG,
  WEEKDAY_SHORT,
  weekdayOf,
} from './recurrence-rule';

const PREVIEW_COUNT = 5;
const DAY_MS = 86_400_000;

interface Props {
  projectId: string;
  operation: OperationResponse;
  stored: StoredRecurrence | null;
  defaultTimeZone: string;
  /** the worksites' zones, listed first */
  zones: string[];
  onDone: () => void;
}

/** The end of an occurrence's TR: the time only when it ends on the same local day, else day and time. */
function endOfTr(startMs: number, trH: number, timeZone: string): string {
  const endMs = startMs + trH * 3_600_000;
  const day = (ms: number) => format(new Date(ms), 'yyyy-MM-dd', { in: tz(timeZone) });
  return msIn(endMs, timeZone, day(endMs) === day(startMs) ? 'HH:mm' : 'EEE d MMM HH:mm');
}

/** A new rule: weekly on today's weekday (in the worksite's zone) at 06:00, no end. */
function freshForm(timeZone: string): RecurrenceForm {
  const today = format(new Date(), 'yyyy-MM-dd', { in: tz(timeZone) });
  const until = format(new Date(Date.now() + 90 * DAY_MS), 'yyyy-MM-dd', { in: tz(timeZone) });
  return {
    freq: 'WEEKLY',
    byDay: [weekdayOf(today) ?? 'MO'],
    interval: 1,
    startDate: today,
    startTime: '06:00',
    timeZone,
    endKind: 'never',
    count: 10,
    untilDate: until,
  };
}

export function RecurrenceEditor({ projectId, operation, stored, defaultTimeZone, zones, onDone }: Props) {
  const parsed = stored ? parseRule(stored) : null;
  // The stored rule is read once, when the form opens.
  const [initial] = useState<RecurrenceForm>(() => {
    const fresh = freshForm(stored?.timeZone ?? defaultTimeZone);
    if (!parsed) return fresh;
    return { ...parsed, count: Number.isFinite(parsed.count) ? parsed.count : fresh.count, untilDate: parsed.untilDate || fresh.untilDate };
  });
  const form = useForm<RecurrenceForm>({ resolver: zodResolver(RecurrenceForm), defaultValues: initial, mode: 'onChange' });
  const v = useWatch({ control: form.control }) as RecurrenceForm;
  const errors = form.formState.errors;
  const save = useSaveRecurrence(projectId);
  const remove = useRemoveRecurrence(projectId);
  const [confirmRemove, setConfirmRemove] = useState(false);
  const idp = `rec-${operation.id}`;
  const allZones = timeZoneList(v.timeZone, ...zones);
  const unitWord = v.freq === 'DAILY' ? (v.interval === 1 ? 'day' : 'days') : v.interval === 1 ? 'week' : 'weeks';

  // "Now" for the preview is when the form opened (render stays pure).
  const [now] = useState(() => Date.now());
  // The built rule and its preview, whenever the fields are valid.
  const built = (() => {
    const ok = RecurrenceForm.safeParse(v);
    if (!ok.success) return null;
    const input = RecurrenceInput.safeParse(toRecurrenceInput(ok.data));
    if (!input.success) return null;
    // Far enough ahead for five occurrences of the sparsest rule the form builds (every 99 weeks).
    const span = (ok.data.freq === 'WEEKLY' ? 7 : 1) * ok.data.interval * (PREVIEW_COUNT + 1) * DAY_MS + 14 * DAY_MS;
    const startMs = Date.parse(`${ok.data.startDate}T00:00:00Z`);
    const next = expandRecurrence(input.data, now, Math.max(now, startMs) + span, PREVIEW_COUNT);
    return { input: input.data, text: recurrenceText(input.data), words: ruleInWords(ok.data), next };
  })();

  const startDay = weekdayOf(v.startDate);
  const offRule = v.freq === 'WEEKLY' && startDay !== null && v.byDay.length > 0 && !v.byDay.includes(startDay);

  return (
    <form
      noValidate
      className="mt-3 flex flex-col gap-4 border-t border-line pt-3"
      aria-label={`Recurrence of ${operation.name}`}
      onSubmit={form.handleSubmit((values) =>
        save.mutate({ operationId: operation.id, input: toRecurrenceInput(values) }, { onSuccess: onDone }),
      )}
    >
      {stored && !parsed ? (
        <Notice>
          The stored rule uses parts this form does not build:
          <pre className="mt-1 whitespace-pre-wrap break-all font-mono text-xs">{stored.text}</pre>
          Saving here replaces it with the rule below.
        </Notice>
      ) : null}

      <fieldset>
        <legend className="mb-1 text-sm font-semibold">Repeats</legend>
        <Controller
          control={form.control}
          name="freq"
          render={({ field }) => (
            <div className="flex flex-wrap gap-2" role="radiogroup" aria-label="Frequency">
              {(['DAILY', 'WEEKLY'] as const).map((f) => (
                <button
                  key={f}
                  type="button"
                  role="radio"
                  aria-checked={field.value === f}
                  onClick={() => field.onChange(f)}
                  className={`min-h-11 rounded-lg border px-4 text-sm font-semibold ${field.value === f ? 'border-accent bg-accent text-accent-ink' : 'border-line bg-surface hover:border-accent'}`}
                >
                  {f === 'DAILY' ? 'Daily' : 'Weekly'}
                </button>
              ))}
            </div>
          )}
        />
      </fieldset>

      {v.freq === 'WEEKLY' ? (
        <fieldset>
          <legend className="mb-1 text-sm font-semibold">On these weekdays</legend>
          <Controller
            control={form.control}
            name="byDay"
            render={({ field }) => (
              <div className="flex flex-wrap gap-2">
                {WEEKDAYS.map((d) => {
                  const on = field.value.includes(d);
                  return (
                    <button
                      key={d}
                      type="button"
                      aria-pressed={on}
                      aria-label={WEEKDAY_LONG[d]}
                      onClick={() =>
                        field.onChange(on ? field.value.filter((x) => x !== d) : WEEKDAYS.filter((x) => x === d || field.value.includes(x)))
                      }
                      className={`inline-flex size-11 items-center justify-center rounded-full border text-sm font-bold ${on ? 'border-accent bg-accent text-accent-ink' : 'border-line bg-surface hover:border-accent'}`}
                    >
                      {WEEKDAY_SHORT[d]}
                    </button>
                  );
                })}
              </div>
            )}
          />
          {errors.byDay ? (
            <p role="alert" className="mt-1 text-sm text-danger">
              {errors.byDay.message}
            </p>
          ) : null}
        </fieldset>
      ) : null}

      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <FieldShell
          label="Repeat every"
          htmlFor={`${idp}-interval`}
          unit={unitWord}
          error={errors.interval?.message}
          hint={`1 to ${MAX_INTERVAL}`}
        >
          <Input
            id={`${idp}-interval`}
            type="number"
            inputMode="numeric"
            min={1}
            max={MAX_INTERVAL}
            step={1}
            {...form.register('interval', { valueAsNumber: true })}
            invalid={!!errors.interval}
          />
        </FieldShell>
        <FieldShell label="First date" htmlFor={`${idp}-date`} unit="local" error={errors.startDate?.message}>
          <Input id={`${idp}-date`} type="date" {...form.register('startDate')} invalid={!!errors.startDate} />
          <DateEcho value={v.startDate} />
        </FieldShell>
        <FieldShell label="Start time" htmlFor={`${idp}-time`} unit="local, HH:MM" error={errors.startTime?.message}>
          <Input id={`${idp}-time`} type="time" step={60} {...form.register('startTime')} invalid={!!errors.startTime} />
        </FieldShell>
        <FieldShell
          label="Time zone"
          htmlFor={`${idp}-zone`}
          error={errors.timeZone?.message}
          hint="Defaults to the first worksite's zone."
        >
          <Select id={`${idp}-zone`} {...form.register('timeZone')} invalid={!!errors.timeZone}>
            <PlainOptions values={allZones} />
          </Select>
        </FieldShell>
      </div>
      {offRule && startDay ? (
        <p className="text-sm text-ink-soft">
          The first date is a {WEEKDAY_LONG[startDay]}, not one of the chosen days: the first occurrence is the next chosen day after it.
        </p>
      ) : null}

      <fieldset>
        <legend className="mb-1 text-sm font-semibold">Ends</legend>
        <div className="grid gap-2 sm:grid-cols-3">
          <label className="flex min-h-11 items-center gap-2 rounded-lg border border-line px-3 text-sm has-[:checked]:border-accent">
            <input type="radio" value="never" className="size-5 accent-[var(--color-accent)]" {...form.register('endKind')} />
            Never
          </label>
          <label className="flex min-h-11 items-center gap-2 rounded-lg border border-line px-3 text-sm has-[:checked]:border-accent">
            <input type="radio" value="count" className="size-5 accent-[var(--color-accent)]" {...form.register('endKind')} />
            After a number of occurrences
          </label>
          <label className="flex min-h-11 items-center gap-2 rounded-lg border border-line px-3 text-sm has-[:checked]:border-accent">
            <input type="radio" value="until" className="size-5 accent-[var(--color-accent)]" {...form.register('endKind')} />
            On a last date
          </label>
        </div>
        {v.endKind === 'count' ? (
          <div className="mt-2 max-w-xs">
            <FieldShell
              label="Occurrences in all"
              htmlFor={`${idp}-count`}
              unit="count"
              error={errors.count?.message}
              hint={`1 to ${MAX_COUNT}, counted from the first date`}
            >
              <Input
                id={`${idp}-count`}
                type="number"
                inputMode="numeric"
                min={1}
                max={MAX_COUNT}
                step={1}
                {...form.register('count', { valueAsNumber: true })}
                invalid={!!errors.count}
              />
            </FieldShell>
          </div>
        ) : null}
        {v.endKind === 'until' ? (
          <div className="mt-2 max-w-xs">
            <FieldShell label="Last date" htmlFor={`${idp}-until`} unit="local, included" error={errors.untilDate?.message}>
              <Input id={`${idp}-until`} type="date" {...form.register('untilDate')} invalid={!!errors.untilDate} />
              <DateEcho value={v.untilDate} />
            </FieldShell>
          </div>
        ) : null}
      </fieldset>

      {built ? (
        <div className="grid gap-3 lg:grid-cols-2" aria-live="polite">
          <div>
            <p className="text-sm font-semibold">The rule</p>
            <p className="text-sm">{built.words}</p>
            <p className="mt-2 text-xs text-ink-soft">As iCalendar (RFC 5545) text:</p>
            <pre className="mt-1 overflow-x-auto rounded-lg border border-line bg-surface-2 p-2 font-mono text-xs" data-testid="rule-text">
              {built.text}
            </pre>
          </div>
          <div>
            <p className="text-sm font-semibold">
              Next {PREVIEW_COUNT} occurrences <span className="font-normal text-ink-soft">({built.input.timeZone} local time)</span>
            </p>
            {built.next.length === 0 ? (
              <p className="text-sm text-ink-soft">None from now on: the rule has ended.</p>
            ) : (
              <ol className="mt-1 list-decimal pl-5 text-sm" data-testid="rule-preview">
                {built.next.map((ms) => (
                  <li key={ms}>
                    {msIn(ms, built.input.timeZone)}
                    <span className="text-ink-soft">
                      {' '}
                      to {endOfTr(ms, operation.tr, built.input.timeZone)} (TR {operation.tr} h)
                    </span>
                  </li>
                ))}
              </ol>
            )}
          </div>
        </div>
      ) : (
        <p className="text-sm text-ink-soft">Correct or complete the fields above to see the rule and its next occurrences.</p>
      )}

      {save.error ? <ErrorNotice error={save.error} /> : null}
      {remove.error ? <ErrorNotice error={remove.error} /> : null}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" disabled={save.isPending}>
          {save.isPending ? 'Saving…' : stored ? 'Save the recurrence' : 'Make it recur'}
        </Button>
        <Button variant="ghost" onClick={onDone}>
          Cancel
        </Button>
        {stored && !confirmRemove ? (
          <Button variant="secondary" onClick={() => setConfirmRemove(true)}>
            Stop it recurring
          </Button>
        ) : null}
      </div>
      {confirmRemove ? (
        <div className="rounded-lg border border-danger bg-danger-soft p-3 text-sm">
          <p className="font-semibold">Stop {operation.name} recurring? Its occurrences leave the board and the calendar feed.</p>
          <div className="mt-2 flex flex-wrap gap-2">
            <Button variant="danger" disabled={remove.isPending} onClick={() => remove.mutate(operation.id, { onSuccess: onDone })}>
              Yes, stop it recurring
            </Button>
            <Button variant="secondary" onClick={() => setConfirmRemove(false)}>
              Keep it
            </Button>
          </div>
        </div>
      ) : null}
    </form>
  );
}
