import { useCallback, useEffect, useRef, useState } from 'react';
import { NavLink, Outlet, useLocation, useParams } from 'react-router-dom';
import { useProject } from '../../api/projects';
import { ErrorNotice, Spinner } from '../../components/ui';
import { PROJECT_SECTIONS } from '../sections';
import { PageZoneStatement } from '../../components/page-zone';
import { RoleBadge } from '../../features/projects/components/role-badge';

const tabClass = ({ isActive }: { isActive: boolean }) =>
  `inline-flex min-h-11 items-center whitespace-nowrap border-b-2 px-3 text-sm font-semibold ${isActive ? 'border-accent text-ink' : 'border-transparent text-ink-soft hover:text-ink'}`;

/**
 * Whether the tab strip hides tabs to the left or right; keeps the current tab in view. On a phone
 * the strip scrolls sideways, and a fading edge with an arrow says that more tabs are there.
 */
function useScrollCue(dep: unknown) {
  const ref = useRef<HTMLElement>(null);
  const [cue, setCue] = useState({ left: false, right: false });
  const measure = useCallback(() => {
    const el = ref.current;
    if (!el) return;
    setCue({ left: el.scrollLeft > 2, right: el.scrollLeft + el.clientWidth < el.scrollWidth - 2 });
  }, []);
  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    el.querySelector<HTMLElement>('[aria-current="page"]')?.scrollIntoView({ block: 'nearest', inline: 'nearest' });
    measure();
    const ro = new ResizeObserver(measure);
    ro.observe(el);
    return () => ro.disconnect();
  }, [measure, dep]);
  return [ref, cue, measure] as const;
}

export function ProjectLayout() {
  const { projectId = '' } = useParams();
  const project = useProject(projectId);
  const { pathname } = useLocation();
  const [tabsRef, cue, measureTabs] = useScrollCue(`${pathname}:${project.data?.role ?? ''}`);
  if (project.isPending) return <Spinner label="Opening project" />;
  if (project.error) return <ErrorNotice error={project.error} />;
  const p = project.data;
  const sections = PROJECT_SECTIONS.filter((s) => s.roles.includes(p.role));
  return (
    <div>
      <div className="mb-4 flex flex-wrap items-center gap-3">
        <h1 className="text-xl font-bold tracking-tight sm:text-2xl">{p.name}</h1>
        <RoleBadge role={p.role} />
        <PageZoneStatement className="w-full" />
      </div>
      <div className="no-print relative mb-5 border-b border-line">
        <nav ref={tabsRef} onScroll={measureTabs} className="flex gap-1 overflow-x-auto [scrollbar-width:thin]" aria-label="Project">
          {sections.map((s) => (
            <NavLink key={s.path} to={s.path ? `/projects/${p.id}/${s.path}` : `/projects/${p.id}`} end={!s.path} className={tabClass}>
              {s.label}
            </NavLink>
          ))}
        </nav>
        {cue.left ? (
          <span
            className="pointer-events-none absolute inset-y-0 left-0 flex w-10 items-center bg-gradient-to-r from-canvas to-transparent pl-0.5 text-lg font-bold text-ink-soft"
            aria-hidden
            data-testid="tabs-cue-left"
          >
            ‹
          </span>
        ) : null}
        {cue.right ? (
          <span
            className="pointer-events-none absolute inset-y-0 right-0 flex w-10 items-center justify-end bg-gradient-to-l from-canvas to-transparent pr-0.5 text-lg font-bold text-ink-soft"
            aria-hidden
            data-testid="tabs-cue-right"
          >
            ›
          </span>
        ) : null}
      </div>
      <Outlet />
    </div>
  );
}
