import { CAUTION_LINE } from '../../shared/caution';

export function Caution({ inverted = false }: { inverted?: boolean }) {
  return (
    <p className={`mx-auto max-w-5xl text-center text-xs ${inverted ? 'text-white/70' : 'text-ink-soft'}`} data-testid="caution">
      <span aria-hidden>⚓ </span>
      {CAUTION_LINE}
    </p>
  );
}
