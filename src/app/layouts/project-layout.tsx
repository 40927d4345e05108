import { NavLink, Outlet, useParams } from 'react-router-dom';
import { useProject } from '../../api/projects';
import { ErrorNotice, Spinner } from '../../components/ui';
import { PROJECT_SECTIONS } from '../sections';
import { RoleBadge } from '../../features/projects/components/role-badge';

const tabClass = ({ isActive }: { isActive: boolean }) =>
  `inline-flex min-h-11 items-center whitespace-nowrap border-b-2 px-3 text-sm font-semibold ${isActive ? 'border-accent text-ink' : 'border-transparent text-ink-soft hover:text-ink'}`;

export function ProjectLayout() {
  const { projectId = '' } = useParams();
  const project = useProject(projectId);
  if (project.isPending) return <Spinner label="Opening project" />;
  if (project.error) return <ErrorNotice error={project.error} />;
  const p = project.data;
  const sections = PROJECT_SECTIONS.filter((s) => s.roles.includes(p.role));
  return (
    <div>
      <div className="mb-4 flex flex-wrap items-center gap-3">
        <h1 className="text-xl font-bold tracking-tight sm:text-2xl">{p.name}</h1>
        <RoleBadge role={p.role} />
      </div>
      <nav className="no-print mb-5 flex gap-1 overflow-x-auto border-b border-line" aria-label="Project">
        {sections.map((s) => (
          <NavLink key={s.path} to={s.path ? `/projects/${p.id}/${s.path}` : `/projects/${p.id}`} end={!s.path} className={tabClass}>
            {s.label}
          </NavLink>
        ))}
      </nav>
      <Outlet />
    </div>
  );
}
