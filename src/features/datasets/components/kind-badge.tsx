import type { DatasetSummary } from '../../../../shared/api-types-datasets';
import { KIND_LABELS } from './format';

const STYLES: Record<DatasetSummary['kind'], string> = {
  hindcast: 'border-accent/50 bg-ok-soft',
  forecast: 'border-lamp bg-lamp/20',
  observation: 'border-line bg-surface-2',
};

/** The dataset kind as a small labelled badge (words, not colour alone). */
export function KindBadge({ kind }: { kind: DatasetSummary['kind'] }) {
  return (
    <span className={`inline-flex w-fit items-center rounded-full border px-2.5 py-0.5 text-xs font-semibold text-ink ${STYLES[kind]}`}>
      {KIND_LABELS[kind]}
    </span>
  );
}
