import { useState, type ReactNode } from 'react';
import { Button as AriaButton, Tooltip, TooltipTrigger } from 'react-aria-components';
import { GLOSSARY, type GlossaryKey } from '../../../shared/glossary';

/** Gap kept between a tooltip and the edges of the window, px. */
const EDGE = 8;

/**
 * A word of the trade with its short explanation: the word keeps its place in the text, a small
 * "?" button beside it opens the explanation (click, tap, keyboard focus or hover; Escape closes).
 * React Aria's tooltip places the box below the word, or above it when there is no room, and keeps
 * it inside the window however narrow the phone; a press opens it too, for touch screens.
 */
export function Term({ k, children }: { k: GlossaryKey; children?: ReactNode }) {
  const entry = GLOSSARY[k];
  const [open, setOpen] = useState(false);
  return (
    <span className="inline-flex items-baseline gap-0.5">
      <span>{children ?? entry.term}</span>
      <TooltipTrigger isOpen={open} onOpenChange={setOpen} delay={0} closeDelay={0} shouldCloseOnPress={false}>
        <AriaButton
          className="no-print relative inline-flex size-4 shrink-0 translate-y-[-1px] items-center justify-center self-center rounded-full border border-current text-[0.65rem] leading-none font-bold opacity-70 outline-none before:absolute before:-inset-3 before:content-[''] hover:opacity-100 data-[focus-visible]:opacity-100 data-[focus-visible]:ring-2 data-[focus-visible]:ring-accent"
          aria-label={`What is ${entry.term}?`}
          aria-expanded={open}
          data-term={k}
          onPress={() => setOpen(true)}
        >
          ?
        </AriaButton>
        <Tooltip
          placement="bottom"
          offset={6}
          containerPadding={EDGE}
          style={{ width: `min(18rem, calc(100vw - ${2 * EDGE}px))` }}
          className="no-print z-50 rounded-lg border border-line bg-surface px-3 py-2 text-left text-sm font-normal normal-case tracking-normal whitespace-normal text-ink shadow-lg"
        >
          <span className="font-semibold">{entry.term}: </span>
          {entry.text}
        </Tooltip>
      </TooltipTrigger>
    </span>
  );
}
