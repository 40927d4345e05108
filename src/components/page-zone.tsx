// The one statement of a page's time zone. A page says which zone its times are in with
// `usePageZone(statement)`; the layout shows that statement once, under the page's title (on
// screen and on paper), so no section repeats the zone beside its times.
import { createContext, useContext, useEffect, useState, type ReactNode } from 'react';

interface PageZoneState {
  statement: string | null;
  set: (statement: string | null) => void;
}

const PageZoneContext = createContext<PageZoneState | null>(null);

export function PageZoneProvider({ children }: { children: ReactNode }) {
  const [statement, set] = useState<string | null>(null);
  return <PageZoneContext.Provider value={{ statement, set }}>{children}</PageZoneContext.Provider>;
}

/** Declares the page's zone statement (from shared/dates.ts: `zoneStatement`, `worksiteZoneStatement`); null while unknown. */
export function usePageZone(statement: string | null): void {
  const set = useContext(PageZoneContext)?.set;
  useEffect(() => {
    if (!set) return;
    set(statement);
    return () => set(null);
  }, [set, statement]);
}

/** Where the layout shows the statement: nothing on a page without times. */
export function PageZoneStatement({ className = '' }: { className?: string }) {
  const statement = useContext(PageZoneContext)?.statement;
  if (!statement) return null;
  return (
    <p className={`text-sm text-ink-soft ${className}`} data-testid="zone-statement">
      {statement}
    </p>
  );
}
