/** The caution that stays on every screen. */
export const CAUTION_TEXT =
  'Decision support only. The vessel master’s authority, marine warranty approval, local codes and licensed practice decide whether work goes ahead.';

export function Caution({ inverted = false }: { inverted?: boolean }) {
  return (
    <p className={`mx-auto max-w-5xl text-center text-xs ${inverted ? 'text-white/70' : 'text-ink-soft'}`} data-testid="caution">
      <span aria-hidden>⚓ </span>
      {CAUTION_TEXT}
    </p>
  );
}
