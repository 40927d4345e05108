import { useCallback, useEffect, useId, useLayoutEffect, useRef, useState, type ReactNode } from 'react';
import { GLOSSARY, type GlossaryKey } from '../../../shared/glossary';

/** Gap kept between a tooltip and the edges of the window, px. */
const EDGE = 8;

/**
 * A word of the trade with its short explanation: the word keeps its place in the text, a small
 * "?" button beside it opens the explanation (click, tap, keyboard focus or hover; Escape closes).
 * The box is placed in the window (fixed position), below the word or above it when there is no
 * room, and moved sideways so that it never leaves the window, however narrow the phone.
 */
export function Term({ k, children }: { k: GlossaryKey; children?: ReactNode }) {
  const entry = GLOSSARY[k];
  const [open, setOpen] = useState(false);
  const [pos, setPos] = useState<{ left: number; top: number; width: number } | null>(null);
  const anchor = useRef<HTMLButtonElement>(null);
  const box = useRef<HTMLSpanElement>(null);
  const id = useId();

  const place = useCallback(() => {
    const a = anchor.current?.getBoundingClientRect();
    if (!a) return;
    const vw = document.documentElement.clientWidth || window.innerWidth;
    const vh = window.innerHeight;
    const width = Math.min(288, vw - 2 * EDGE);
    const left = Math.min(Math.max(EDGE, a.left + a.width / 2 - width / 2), vw - width - EDGE);
    const height = box.current?.offsetHeight ?? 0;
    const below = a.bottom + 6;
    const top =
      below + height + EDGE > vh && a.top - 6 - height >= EDGE ? a.top - 6 - height : Math.min(below, Math.max(EDGE, vh - height - EDGE));
    setPos({ left, top, width });
  }, []);

  useLayoutEffect(() => {
    if (open) place();
  }, [open, place]);

  useEffect(() => {
    if (!open) return;
    const close = () => setOpen(false);
    const onKey = (e: KeyboardEvent) => {
      if (e.key === 'Escape') close();
    };
    window.addEventListener('scroll', place, true);
    window.addEventListener('resize', place);
    window.addEventListener('keydown', onKey);
    return () => {
      window.removeEventListener('scroll', place, true);
      window.removeEventListener('resize', place);
      window.removeEventListener('keydown', onKey);
    };
  }, [open, place]);

  return (
    <span className="inline-flex items-baseline gap-0.5">
      <span>{children ?? entry.term}</span>
      <button
        ref={anchor}
        type="button"
        className="no-print relative inline-flex size-4 shrink-0 translate-y-[-1px] items-center justify-center self-center rounded-full border border-current text-[0.65rem] leading-none font-bold opacity-70 before:absolute before:-inset-3 before:content-[''] hover:opacity-100 focus-visible:opacity-100"
        aria-label={`What is ${entry.term}?`}
        aria-describedby={open ? id : undefined}
        aria-expanded={open}
        data-term={k}
        onClick={() => setOpen(true)}
        onMouseEnter={() => setOpen(true)}
        onMouseLeave={() => setOpen(false)}
        onFocus={() => setOpen(true)}
        onBlur={() => setOpen(false)}
      >
        ?
      </button>
      {open ? (
        <span
          ref={box}
          id={id}
          role="tooltip"
          className="no-print fixed z-50 rounded-lg border border-line bg-surface px-3 py-2 text-left text-sm font-normal normal-case tracking-normal whitespace-normal text-ink shadow-lg"
          style={pos ? { left: pos.left, top: pos.top, width: pos.width } : { left: EDGE, top: -9999, width: 288 }}
        >
          <span className="font-semibold">{entry.term}: </span>
          {entry.text}
        </span>
      ) : null}
    </span>
  );
}
