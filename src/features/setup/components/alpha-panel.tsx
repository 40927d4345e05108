import { useState } from 'react';
import { formatInstant, localTimeZone } from '../../../../shared/dates';
import { useForm, useWatch, type FieldErrors } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import type { AlphaResponse } from '../../../../shared/api-types-sites';
import { LIMIT_RANGES } from '../../../../shared/engine/schemas';
import { AlphaTableInput } from '../../../../shared/schemas/sites';
import { Button, Card, ErrorNotice, Notice, Spinner } from '../../../components/ui';
import { useAlpha } from '../api/get-alpha';
import { useResetAlpha } from '../api/reset-alpha';
import { useSaveAlpha } from '../api/save-alpha';
import { applyServerErrors, blankAware, CellInput, errorAt, GridErrors, Tag, withoutAt } from './form-bits';
import { FactorGridEditor, FactorGridView } from './factor-grid-view';
import { fmt } from './format';
import { numberFromText, textFromNumber } from './number-text';

/** The alpha table as typed: the body's field names, numbers as text. */
const AlphaText = z.object({
  tpopBoundsH: z.array(z.string()),
  hsColumnsM: z.array(z.string()),
  values: z.array(z.array(z.string())),
});
type AlphaText = z.infer<typeof AlphaText>;

/** Text to numbers, then the shared {@link AlphaTableInput} schema (the server's checks and words). */
const AlphaFormSchema = AlphaText.transform((t) => ({
  tpopBoundsH: t.tpopBoundsH.map(numberFromText),
  hsColumnsM: t.hsColumnsM.map(numberFromText),
  values: t.values.map((row) => row.map(numberFromText)),
})).pipe(AlphaTableInput);

function toText(a: AlphaResponse): AlphaText {
  return {
    tpopBoundsH: a.table.tpopBoundsH.map(textFromNumber),
    hsColumnsM: a.table.hsColumnsM.map(textFromNumber),
    values: a.table.values.map((row) => row.map(textFromNumber)),
  };
}

/** The project's alpha table: OPWF = α·OPLIM for weather-restricted operations planned on a forecast. */
export function AlphaPanel({ projectId, canEdit }: { projectId: string; canEdit: boolean }) {
  const alpha = useAlpha(projectId);
  const [done, setDone] = useState<string | null>(null);
  if (alpha.isPending) return <Spinner label="Loading the alpha table" />;
  if (alpha.error) return <ErrorNotice error={alpha.error} />;
  const a = alpha.data;
  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-col gap-2">
        <p className="max-w-3xl text-sm text-ink-soft">
          Weather-restricted operations (TPOP up to 72 h and TR up to 96 h) are planned on a forecast with the forecast limit OPWF = α·OPLIM
          on their Hs limits. α comes from the first row whose TPOP bound is not exceeded, interpolated linearly between the Hs columns (the
          end column outside them). It never applies to Tp, bed velocity or wind limits. An edited table must reach TPOP 72 h (its last
          row), so no weather-restricted operation is left without α.
        </p>
        <div className="flex flex-wrap items-center gap-2">
          {a.isDefault ? (
            <Tag tone="warn">This project uses the default table</Tag>
          ) : (
            <Tag tone="accent">
              This project’s own table{a.updatedAt ? `, saved ${formatInstant(a.updatedAt, localTimeZone(), 'dateTimeYear')}` : ''}
            </Tag>
          )}
        </div>
        <Notice>
          <span className="font-semibold">Check before relying on it:</span> {a.note} Only the project’s marine warranty surveyor and the
          current edition of the standard decide the factors that apply.
        </Notice>
      </div>
      {done ? <Notice tone="success">{done}</Notice> : null}
      {canEdit ? (
        <AlphaEditor key={`${a.updatedAt ?? 'default'}`} projectId={projectId} alpha={a} onDone={setDone} />
      ) : (
        <AlphaView alpha={a} />
      )}
    </div>
  );
}

function AlphaView({ alpha }: { alpha: AlphaResponse }) {
  const t = alpha.table;
  return (
    <Card className="overflow-x-auto !p-0">
      <FactorGridView
        caption="Alpha factors by TPOP and Hs limit"
        corner="TPOP up to"
        columns={t.hsColumnsM.map((hs) => `Hs ${fmt(hs)} m`)}
        rows={t.tpopBoundsH.map((h, i) => ({ heading: `${fmt(h)} h`, factors: t.values[i] ?? [] }))}
      />
    </Card>
  );
}

function AlphaEditor({ projectId, alpha, onDone }: { projectId: string; alpha: AlphaResponse; onDone: (message: string | null) => void }) {
  const save = useSaveAlpha(projectId);
  const reset = useResetAlpha(projectId);
  const [asking, setAsking] = useState(false);
  const form = useForm<z.input<typeof AlphaFormSchema>, unknown, z.output<typeof AlphaFormSchema>>({
    resolver: blankAware(zodResolver(AlphaFormSchema)),
    defaultValues: toText(alpha),
  });
  const errors = form.formState.errors as FieldErrors;
  const [tpopBoundsH, hsColumnsM, values] = useWatch({ control: form.control, name: ['tpopBoundsH', 'hsColumnsM', 'values'] });
  const t: AlphaText = { tpopBoundsH, hsColumnsM, values };
  const revalidate = form.formState.isSubmitted;
  const put = (next: AlphaText) => {
    form.setValue('tpopBoundsH', next.tpopBoundsH, { shouldDirty: true, shouldValidate: revalidate });
    form.setValue('hsColumnsM', next.hsColumnsM, { shouldDirty: true, shouldValidate: revalidate });
    form.setValue('values', next.values, { shouldDirty: true, shouldValidate: revalidate });
    onDone(null);
  };
  /** The input of TPOP bound (row) or Hs limit (column) `k`. */
  const axisInput = (key: 'tpopBoundsH' | 'hsColumnsM', k: number, label: string) => (
    <CellInput
      label={label}
      value={t[key][k]}
      onValue={(text) => put({ ...t, [key]: t[key].map((x, c) => (c === k ? text : x)) })}
      error={errorAt(errors, `${key}.${k}`)}
      className="w-20"
    />
  );
  const setValue = (i: number, j: number, text: string) =>
    put({ ...t, values: t.values.map((row, r) => (r === i ? row.map((x, c) => (c === j ? text : x)) : row)) });
  const addRow = () => put({ ...t, tpopBoundsH: [...t.tpopBoundsH, ''], values: [...t.values, t.hsColumnsM.map(() => '')] });
  const removeRow = (i: number) => put({ ...t, tpopBoundsH: withoutAt(t.tpopBoundsH, i), values: withoutAt(t.values, i) });
  const addColumn = () => put({ ...t, hsColumnsM: [...t.hsColumnsM, ''], values: t.values.map((row) => [...row, '']) });
  const removeColumn = (j: number) =>
    put({ ...t, hsColumnsM: withoutAt(t.hsColumnsM, j), values: t.values.map((row) => withoutAt(row, j)) });

  const onSubmit = form.handleSubmit((table) => {
    save.mutate(table, {
      onSuccess: () => onDone('Alpha table saved. Plans and statistics use it from now on.'),
      onError: (e) => applyServerErrors(e, form.setError),
    });
  });

  const messages: { where: string; message: string }[] = [];
  const push = (where: string, path: string) => {
    const m = errorAt(errors, path);
    if (m) messages.push({ where, message: m });
  };
  push('TPOP rows', 'tpopBoundsH');
  push('Hs columns', 'hsColumnsM');
  push('Values', 'values');
  t.tpopBoundsH.forEach((_, i) => push(`TPOP row ${i + 1}`, `tpopBoundsH.${i}`));
  t.hsColumnsM.forEach((_, j) => push(`Hs column ${j + 1}`, `hsColumnsM.${j}`));
  t.values.forEach((row, i) => {
    push(`Row ${i + 1}`, `values.${i}`);
    row.forEach((_, j) => push(`α at row ${i + 1}, column ${j + 1}`, `values.${i}.${j}`));
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3" aria-label="Alpha table">
      <Card className="!p-0">
        <div className="overflow-x-auto">
          <FactorGridEditor
            caption="Alpha factors by TPOP bound (rows) and Hs limit (columns), editable"
            corner="TPOP up to (h) ↓ · Hs limit (m) →"
            columns={{
              count: t.hsColumnsM.length,
              head: (j) => axisInput('hsColumnsM', j, `Hs column ${j + 1}, m`),
              removeLabel: (j) => `Remove Hs column ${j + 1}`,
              onRemove: removeColumn,
            }}
            addColumn={
              <Button variant="secondary" onClick={addColumn} className="whitespace-nowrap">
                + Hs column
              </Button>
            }
            rows={{
              count: t.tpopBoundsH.length,
              head: (i) => axisInput('tpopBoundsH', i, `TPOP row ${i + 1} bound, h`),
              removeLabel: (i) => `Remove TPOP row ${i + 1}`,
              onRemove: removeRow,
            }}
            removeRowWhat="row"
            cell={(i, j) => ({
              label: `Alpha for TPOP up to ${t.tpopBoundsH[i] || '?'} h and Hs ${t.hsColumnsM[j] || '?'} m`,
              value: t.values[i]?.[j] ?? '',
              onValue: (x) => setValue(i, j, x),
              error: errorAt(errors, `values.${i}.${j}`),
            })}
          />
        </div>
        <div className="flex flex-wrap items-center gap-3 border-t border-line p-3">
          <Button variant="secondary" onClick={addRow}>
            + TPOP row
          </Button>
          <p className="text-xs text-ink-soft">
            Values above 0 and at most 1; TPOP bounds and Hs columns strictly ascending (TPOP {LIMIT_RANGES.tpopH.min}–
            {LIMIT_RANGES.tpopH.max} h, Hs {LIMIT_RANGES.hsM.min}–{LIMIT_RANGES.hsM.max} m). TPOP above the last bound gives α = 1.
          </p>
        </div>
      </Card>
      <GridErrors messages={messages} />
      {save.error ? <ErrorNotice error={save.error} /> : null}
      {reset.error ? <ErrorNotice error={reset.error} /> : null}
      <div className="flex flex-wrap items-center gap-2">
        <Button type="submit" disabled={save.isPending}>
          {save.isPending ? 'Saving…' : 'Save'}
        </Button>
        <Button variant="ghost" onClick={() => form.reset(toText(alpha))} disabled={!form.formState.isDirty}>
          Undo changes
        </Button>
        {!alpha.isDefault && !asking ? (
          <Button variant="secondary" onClick={() => setAsking(true)}>
            Reset to default
          </Button>
        ) : null}
      </div>
      {asking ? (
        <div role="group" aria-label="Confirm reset" className="flex flex-col gap-2 rounded-lg border border-line bg-surface-2 p-3 text-sm">
          <p>
            <span className="font-semibold">Go back to the default table?</span> The project’s own factors are replaced by the defaults; the
            change is kept in the audit trail.
          </p>
          <div className="flex flex-wrap gap-2">
            <Button
              variant="danger"
              disabled={reset.isPending}
              onClick={() =>
                reset.mutate(undefined, {
                  onSuccess: () => {
                    setAsking(false);
                    onDone('Back to the default table.');
                  },
                })
              }
            >
              {reset.isPending ? 'Resetting…' : 'Yes, reset to default'}
            </Button>
            <Button variant="secondary" onClick={() => setAsking(false)}>
              Keep this table
            </Button>
          </div>
        </div>
      ) : null}
    </form>
  );
}
