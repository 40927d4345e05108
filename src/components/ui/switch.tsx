import type { ReactNode } from 'react';
import { Switch as AriaSwitch } from 'react-aria-components';

/**
 * An on/off switch at least 44 px tall, with its state in words beside the colour. React Aria's
 * switch: a real checkbox input with the switch role inside a label (so the visible text is its
 * name), Space toggles it, and the focus ring shows for keyboard use only.
 */
export function Switch({
  on,
  onChange,
  children,
  hint,
  disabled,
  testId,
  id,
  wide,
}: {
  on: boolean;
  onChange: (on: boolean) => void;
  children: ReactNode;
  /** a line under the label */
  hint?: ReactNode;
  disabled?: boolean;
  testId?: string;
  id?: string;
  /** fill the row (forms) rather than fit the text (tool bars) */
  wide?: boolean;
}) {
  return (
    <AriaSwitch
      id={id}
      isSelected={on}
      onChange={onChange}
      isDisabled={disabled}
      data-testid={testId}
      className={`group flex min-h-11 cursor-pointer items-center gap-3 rounded-lg border border-line bg-surface px-3 py-2 text-left text-sm hover:border-accent data-[disabled]:cursor-not-allowed data-[disabled]:opacity-50 data-[focus-visible]:outline-2 data-[focus-visible]:outline-offset-2 data-[focus-visible]:outline-accent ${wide ? 'w-full' : 'inline-flex'}`}
    >
      <span
        className={`relative inline-flex h-6 w-10 shrink-0 items-center rounded-full transition ${on ? 'bg-accent' : 'bg-st-nodata'}`}
        aria-hidden
      >
        <span className={`absolute size-5 rounded-full bg-white shadow transition-all ${on ? 'left-[1.15rem]' : 'left-0.5'}`} />
      </span>
      <span className="flex flex-col">
        <span className="font-semibold">
          {children}
          <span className="ml-1 font-normal text-ink-soft">{on ? 'on' : 'off'}</span>
        </span>
        {hint ? <span className="text-xs text-ink-soft">{hint}</span> : null}
      </span>
    </AriaSwitch>
  );
}
