// "What I hear about": the caller's subscription in this project. Operations and worksites to hear
// about (none ticked = all), immediate e-mails and/or a daily digest at a local time, and a master
// switch. Without a stored choice the default applies: skippers hear about their assigned operations.
import { Controller, useForm, useWatch, type UseFormReturn } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { SubscriptionInput } from '../../../../shared/schemas/alerts';
import type { ProjectAccessRole } from '../../../../shared/api-types';
import type { OperationResponse, SiteResponse } from '../../../../shared/api-types-sites';
import { Button, ErrorNotice, FieldShell, Input, Notice, PlainOptions, SectionCard, Select, Spinner } from '../../../components/ui';
import { useSubscription } from '../api/get-subscription';
import { useSaveSubscription } from '../api/save-subscription';
import type { SubscriptionResponse } from '../api/types';
import { timeZoneList } from './format';
import { Switch } from '../../../components/ui/switch';
import { CheckRow } from './toggle';

interface Props {
  projectId: string;
  role: ProjectAccessRole | undefined;
  operations: OperationResponse[];
  sites: SiteResponse[];
}

export function SubscriptionSection({ projectId, role, operations, sites }: Props) {
  const sub = useSubscription(projectId);
  return (
    <SectionCard
      titleId="sub-title"
      title="What I hear about"
      intro="When a new forecast opens, shortens or closes a weather window, or moves the earliest start, Lullwatch can e-mail you. Choose what concerns you; the calendar feed below follows the same choice."
    >
      <div className="mt-4">
        {sub.isPending ? <Spinner label="Reading your alert choices" /> : null}
        {sub.error ? <ErrorNotice error={sub.error} /> : null}
        {sub.data ? <SubscriptionForm projectId={projectId} role={role} operations={operations} sites={sites} initial={sub.data} /> : null}
      </div>
    </SectionCard>
  );
}

function SubscriptionForm({ projectId, role, operations, sites, initial }: Props & { initial: SubscriptionResponse }) {
  const save = useSaveSubscription(projectId);
  const firstZone = sites[0]?.timeZone ?? 'UTC';
  const { stored, ...values } = initial;
  const form = useForm<z.input<typeof SubscriptionInput>, unknown, SubscriptionInput>({
    resolver: zodResolver(SubscriptionInput),
    // A first choice gets the first worksite's zone for the digest rather than the server's UTC default.
    defaultValues: { ...values, digestTimeZone: !stored && values.digestTimeZone === 'UTC' ? firstZone : values.digestTimeZone },
  });
  const v = useWatch({ control: form.control });
  const errors = form.formState.errors;
  const zones = timeZoneList(v.digestTimeZone ?? 'UTC', ...sites.map((s) => s.timeZone));
  const quiet = v.active && !v.immediate && !v.digest;

  const toggleId = (list: string[], id: string, on: boolean) => (on ? [...new Set([...list, id])] : list.filter((x) => x !== id));

  return (
    <form
      noValidate
      className="flex flex-col gap-4"
      data-testid="subscription-form"
      onSubmit={form.handleSubmit((input) => save.mutate(input, { onSuccess: () => form.reset(input) }))}
    >
      {!stored ? (
        <Notice>
          {role === 'skipper' ? (
            <>
              You have not made a choice here yet, so the default applies:{' '}
              <strong>as a skipper you get an e-mail at once about the operations you are assigned to</strong> (ticked below), at every
              worksite. Save to make the choice your own.
            </>
          ) : (
            <>
              You have not made a choice here yet. Skippers hear about their assigned operations by default; other roles hear nothing until
              they switch alerts on and save.
            </>
          )}
        </Notice>
      ) : null}

      <Controller
        control={form.control}
        name="active"
        render={({ field }) => (
          <Switch
            id="sub-active"
            wide
            on={field.value}
            onChange={field.onChange}
            hint={
              field.value
                ? 'E-mails and the calendar feed follow the choices below.'
                : 'Nothing is sent and the calendar feed leaves this project out.'
            }
          >
            Alerts for this project
          </Switch>
        )}
      />

      <fieldset className="flex flex-col gap-2">
        <legend className="mb-1 text-sm font-semibold">Operations</legend>
        <p className="text-xs text-ink-soft">None ticked means every operation, including ones added later.</p>
        {operations.length === 0 ? <p className="text-sm text-ink-soft">This project has no operations yet.</p> : null}
        <Controller
          control={form.control}
          name="operationIds"
          render={({ field }) => (
            <div className="grid gap-2 sm:grid-cols-2">
              {operations.map((o) => (
                <CheckRow
                  key={o.id}
                  checked={field.value.includes(o.id)}
                  onChange={(on) => field.onChange(toggleId(field.value, o.id, on))}
                >
                  {o.name}
                  <span className="ml-1 text-xs text-ink-soft">TR {o.tr} h</span>
                </CheckRow>
              ))}
            </div>
          )}
        />
      </fieldset>

      <fieldset className="flex flex-col gap-2">
        <legend className="mb-1 text-sm font-semibold">Worksites</legend>
        <p className="text-xs text-ink-soft">None ticked means every worksite.</p>
        {sites.length === 0 ? <p className="text-sm text-ink-soft">This project has no worksites yet.</p> : null}
        <Controller
          control={form.control}
          name="siteIds"
          render={({ field }) => (
            <div className="grid gap-2 sm:grid-cols-2">
              {sites.map((s) => (
                <CheckRow
                  key={s.id}
                  checked={field.value.includes(s.id)}
                  onChange={(on) => field.onChange(toggleId(field.value, s.id, on))}
                >
                  {s.name}
                </CheckRow>
              ))}
            </div>
          )}
        />
      </fieldset>

      <fieldset className="flex flex-col gap-2">
        <legend className="mb-1 text-sm font-semibold">How</legend>
        <Controller
          control={form.control}
          name="immediate"
          render={({ field }) => (
            <Switch
              id="sub-immediate"
              wide
              on={field.value}
              onChange={field.onChange}
              hint="An e-mail as soon as a planning run finds a change."
            >
              Immediate alerts
            </Switch>
          )}
        />
        <Controller
          control={form.control}
          name="digest"
          render={({ field }) => (
            <Switch id="sub-digest" wide on={field.value} onChange={field.onChange} hint="One e-mail a day with the windows ahead.">
              Daily digest
            </Switch>
          )}
        />
        {v.digest ? (
          <div className="grid gap-3 sm:grid-cols-[10rem_1fr]">
            <FieldShell label="Digest time" htmlFor="sub-digest-time" unit="local, HH:MM" error={errors.digestTime?.message}>
              <Input id="sub-digest-time" type="time" step={60} {...form.register('digestTime')} invalid={!!errors.digestTime} />
            </FieldShell>
            <FieldShell
              label="Time zone of the digest"
              htmlFor="sub-digest-zone"
              error={errors.digestTimeZone?.message}
              hint="The worksites' zones are in this list too."
            >
              <Select id="sub-digest-zone" {...form.register('digestTimeZone')} invalid={!!errors.digestTimeZone}>
                <PlainOptions values={zones} />
              </Select>
            </FieldShell>
          </div>
        ) : null}
        <OptionalWholeNumber
          form={form}
          field="windowChanceBelow"
          id="sub-window-chance"
          label="Window chance fell below"
          unit="%"
          max={99}
          hint="With an ensemble forecast: e-mail me when a usable window's chance to hold TR falls below this percentage from one planning run to the next (50 is a common choice). Empty: off."
        />
        {role === 'client' || role === 'coordinator' ? (
          <OptionalWholeNumber
            form={form}
            field="outlookMoveDays"
            id="sub-outlook-days"
            label="Campaign finish moved"
            unit="days"
            max={365}
            hint="E-mail me when a campaign's P50 finish moves by more than this many days from one planning run to the next. Empty: off."
          />
        ) : null}
      </fieldset>

      {quiet ? (
        <Notice>With neither immediate alerts nor a digest no e-mail is sent; the calendar feed still follows these choices.</Notice>
      ) : null}
      {save.error ? <ErrorNotice error={save.error} /> : null}
      {save.isSuccess && !form.formState.isDirty ? (
        <Notice tone="success">Saved. Your choice applies from the next planning run.</Notice>
      ) : null}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" disabled={save.isPending || (stored && !form.formState.isDirty)}>
          {save.isPending ? 'Saving…' : 'Save my choice'}
        </Button>
        {form.formState.isDirty ? (
          <Button variant="ghost" onClick={() => form.reset()}>
            Undo changes
          </Button>
        ) : null}
      </div>
    </form>
  );
}

/** A whole number from 1 to `max` that may be left empty (off), e.g. a threshold of an optional alert. */
function OptionalWholeNumber({
  form,
  field,
  id,
  label,
  unit,
  max,
  hint,
}: {
  form: UseFormReturn<z.input<typeof SubscriptionInput>, unknown, SubscriptionInput>;
  field: 'windowChanceBelow' | 'outlookMoveDays';
  id: string;
  label: string;
  unit: string;
  max: number;
  hint: string;
}) {
  const error = form.formState.errors[field];
  return (
    <FieldShell label={label} htmlFor={id} unit={unit} error={error?.message} hint={hint}>
      <Input
        id={id}
        type="number"
        min={1}
        max={max}
        step={1}
        inputMode="numeric"
        {...form.register(field, {
          setValueAs: (x: unknown) => (x === '' || x === null || x === undefined ? null : Number(x)),
        })}
        invalid={!!error}
      />
    </FieldShell>
  );
}
