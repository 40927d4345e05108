import type { ReactNode } from 'react';
import { Tab, TabList, TabPanel, Tabs as AriaTabs, type Key } from 'react-aria-components';

export interface TabItem<K extends string> {
  id: K;
  label: ReactNode;
  disabled?: boolean;
}

/**
 * Tabs on React Aria (WAI-ARIA tabs pattern: arrow keys, Home and End move along the list and
 * select, Tab moves into the panel). Controlled: the caller keeps the open tab (in the address,
 * say) and gets `onSelect`. Only the open panel is rendered.
 */
export function Tabs<K extends string>({
  label,
  tabs,
  selected,
  onSelect,
  listClassName = 'mb-4 flex gap-1 overflow-x-auto rounded-lg bg-surface-2 p-1',
  children,
}: {
  /** the list's accessible name */
  label: string;
  tabs: readonly TabItem<K>[];
  selected: K;
  onSelect: (id: K) => void;
  listClassName?: string;
  /** the open tab's panel */
  children: ReactNode;
}) {
  return (
    <AriaTabs
      selectedKey={selected}
      onSelectionChange={(k: Key) => onSelect(String(k) as K)}
      disabledKeys={tabs.filter((t) => t.disabled).map((t) => t.id)}
    >
      <TabList aria-label={label} className={`no-print ${listClassName}`}>
        {tabs.map((t) => (
          <Tab
            key={t.id}
            id={t.id}
            className={({ isSelected }) =>
              `inline-flex min-h-11 shrink-0 cursor-pointer items-center rounded-md px-3 text-sm font-semibold whitespace-nowrap transition outline-none data-[disabled]:cursor-not-allowed data-[disabled]:opacity-40 data-[focus-visible]:ring-2 data-[focus-visible]:ring-accent ${isSelected ? 'bg-surface text-ink shadow-sm ring-1 ring-line' : 'text-ink-soft hover:text-ink'}`
            }
          >
            {t.label}
          </Tab>
        ))}
      </TabList>
      <TabPanel id={selected} className="outline-none data-[focus-visible]:ring-2 data-[focus-visible]:ring-accent">
        {children}
      </TabPanel>
    </AriaTabs>
  );
}
