import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { CreateUserInput } from '../../../../shared/schemas/projects';
import { PROJECT_ROLES, PROJECT_ROLE_LABELS, type ProjectRole } from '../../../../shared/auth/roles';
import type { AdminUser, ProjectSummary } from '../../../../shared/api-types';
import { Button, Card, Confirm, ErrorNotice, FieldShell, Input, Notice, PageHeader, Select, Spinner } from '../../../components/ui';
import { NamedOptions, PlainOptions } from '../../../components/ui/field';
import { useProjects } from '../../../api/projects';
import { useAdminUsers, useCreateUser, useIssueTemporaryPassword, useSetMembership, useUpdateUser } from '../api/users';

export function PeoplePage() {
  const users = useAdminUsers();
  const projects = useProjects();
  return (
    <div>
      <PageHeader title="People & access" subtitle="Create accounts, give project roles, and deactivate people who have left." />
      <CreateUserCard />
      {users.isPending || projects.isPending ? <Spinner /> : null}
      {users.error ? <ErrorNotice error={users.error} /> : null}
      <div className="mt-5 grid gap-3">
        {users.data?.map((u) => (
          <UserCard key={u.id} user={u} projects={projects.data ?? []} />
        ))}
      </div>
    </div>
  );
}

function CreateUserCard() {
  const create = useCreateUser();
  const [shown, setShown] = useState<{ email: string; password: string } | null>(null);
  const form = useForm({ resolver: zodResolver(CreateUserInput), defaultValues: { name: '', email: '', globalRole: 'user' as const } });
  return (
    <Card>
      <h2 className="mb-3 text-lg font-bold">New user</h2>
      <form
        className="grid gap-3 md:grid-cols-[1fr_1fr_auto_auto] md:items-end"
        onSubmit={form.handleSubmit((v) =>
          create.mutate(v, {
            onSuccess: (r) => {
              setShown({ email: r.user.email, password: r.temporaryPassword });
              form.reset();
            },
          }),
        )}
        noValidate
      >
        <FieldShell label="Name" htmlFor="new-name" error={form.formState.errors.name?.message}>
          <Input id="new-name" {...form.register('name')} invalid={!!form.formState.errors.name} />
        </FieldShell>
        <FieldShell label="E-mail" htmlFor="new-email" error={form.formState.errors.email?.message}>
          <Input id="new-email" type="email" {...form.register('email')} invalid={!!form.formState.errors.email} />
        </FieldShell>
        <FieldShell label="Global role" htmlFor="new-role">
          <Select id="new-role" {...form.register('globalRole')}>
            <option value="user">User</option>
            <option value="admin">Administrator</option>
          </Select>
        </FieldShell>
        <Button type="submit" disabled={create.isPending}>
          Create user
        </Button>
      </form>
      <ErrorNotice error={create.error} className="mt-3" />
      {shown ? <TemporaryPassword email={shown.email} password={shown.password} /> : null}
    </Card>
  );
}

/** A temporary password, shown once, with a button that copies it. */
function TemporaryPassword({ email, password }: { email: string; password: string }) {
  const [copied, setCopied] = useState<'yes' | 'no' | null>(null);
  async function copy() {
    try {
      await navigator.clipboard.writeText(password);
      setCopied('yes');
    } catch {
      setCopied('no');
    }
  }
  return (
    <div className="mt-3">
      <Notice tone="success">
        <p className="flex flex-wrap items-center gap-2">
          <span>
            Temporary password for <strong>{email}</strong>, shown only now:
          </span>
          <code className="rounded bg-surface px-2 py-1 font-mono text-base" data-testid="temporary-password">
            {password}
          </code>
          <Button variant="secondary" onClick={() => void copy()} data-testid="copy-temporary-password">
            {copied === 'yes' ? 'Copied' : 'Copy'}
          </Button>
        </p>
        {copied === 'no' ? (
          <p className="mt-1 text-xs">This browser did not allow copying: select the password and copy it by hand.</p>
        ) : null}
        <p className="mt-1 text-xs">
          Pass it on by a safe channel. It cannot be shown again, works for 7 days, and must be changed at the first sign-in.
        </p>
      </Notice>
    </div>
  );
}

type Pending =
  | { kind: 'remove'; projectId: string; projectName: string }
  | { kind: 'role'; projectId: string; projectName: string; from: ProjectRole; to: ProjectRole }
  | { kind: 'deactivate' };

function UserCard({ user, projects }: { user: AdminUser; projects: ProjectSummary[] }) {
  const update = useUpdateUser();
  const membership = useSetMembership();
  const [projectId, setProjectId] = useState('');
  const [role, setRole] = useState<ProjectRole>('skipper');
  // a removal, a role change or a deactivation waits here until the admin confirms it
  const [pending, setPending] = useState<Pending | null>(null);
  const unassigned = projects.filter((p) => !user.projects.some((m) => m.projectId === p.id));
  const done = { onSuccess: () => setPending(null) };

  return (
    <Card className={user.active ? '' : 'opacity-70'}>
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <p className="font-bold">
            {user.name} {user.globalRole === 'admin' ? <span className="ml-2 text-xs font-semibold text-accent">Administrator</span> : null}
            {!user.active ? <span className="ml-2 text-xs font-semibold text-danger">Deactivated</span> : null}
          </p>
          <p className="text-sm text-ink-soft">{user.email}</p>
          {user.mustChangePassword && user.temporaryPasswordExpiresAt ? (
            <p className="text-xs text-ink-soft">
              On a temporary password until{' '}
              {new Date(user.temporaryPasswordExpiresAt).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' })}
            </p>
          ) : null}
        </div>
        <Button
          variant={user.active ? 'secondary' : 'primary'}
          onClick={() => (user.active ? setPending({ kind: 'deactivate' }) : update.mutate({ userId: user.id, active: true }))}
          disabled={update.isPending}
        >
          {user.active ? 'Deactivate' : 'Reactivate'}
        </Button>
      </div>
      {pending?.kind === 'deactivate' ? (
        <Confirm
          title={`Deactivate ${user.name}?`}
          confirmLabel="Deactivate"
          busy={update.isPending}
          onConfirm={() => update.mutate({ userId: user.id, active: false }, done)}
          onCancel={() => setPending(null)}
        >
          They are signed out at once and can no longer sign in or receive alerts. You can reactivate them later.
        </Confirm>
      ) : null}
      <ErrorNotice error={update.error} className="mt-2" />
      <NewTemporaryPassword user={user} />
      <ul className="mt-3 grid gap-2">
        {user.projects.map((m) => {
          const mine = pending && pending.kind !== 'deactivate' && pending.projectId === m.projectId ? pending : null;
          return (
            <li key={m.projectId} className="text-sm">
              <div className="flex flex-wrap items-center gap-2">
                <span className="min-w-48 font-semibold">{m.projectName}</span>
                <Select
                  aria-label={`Role of ${user.name} in ${m.projectName}`}
                  className="max-w-56"
                  value={mine?.kind === 'role' ? mine.to : m.role}
                  onChange={(e) => {
                    const to = e.target.value as ProjectRole;
                    setPending(
                      to === m.role ? null : { kind: 'role', projectId: m.projectId, projectName: m.projectName, from: m.role, to },
                    );
                  }}
                >
                  <PlainOptions values={PROJECT_ROLES} labels={PROJECT_ROLE_LABELS} />
                </Select>
                <Button variant="ghost" onClick={() => setPending({ kind: 'remove', projectId: m.projectId, projectName: m.projectName })}>
                  Remove
                </Button>
              </div>
              {mine?.kind === 'role' ? (
                <Confirm
                  title={`Change ${user.name}’s role in ${m.projectName} from ${PROJECT_ROLE_LABELS[mine.from]} to ${PROJECT_ROLE_LABELS[mine.to]}?`}
                  confirmLabel="Change role"
                  tone="primary"
                  busy={membership.isPending}
                  onConfirm={() => membership.mutate({ userId: user.id, projectId: m.projectId, role: mine.to }, done)}
                  onCancel={() => setPending(null)}
                >
                  What they may see and change in this project follows the new role at once.
                </Confirm>
              ) : null}
              {mine?.kind === 'remove' ? (
                <Confirm
                  title={`Remove ${user.name} from ${m.projectName}?`}
                  confirmLabel="Remove from project"
                  busy={membership.isPending}
                  onConfirm={() => membership.mutate({ userId: user.id, projectId: m.projectId, role: null }, done)}
                  onCancel={() => setPending(null)}
                >
                  They lose access to this project’s board, alerts and reports at once.
                </Confirm>
              ) : null}
            </li>
          );
        })}
      </ul>
      {unassigned.length > 0 ? (
        <div className="mt-3 flex flex-wrap items-end gap-2">
          <Select
            aria-label={`Project to add ${user.name} to`}
            className="max-w-72"
            value={projectId}
            onChange={(e) => setProjectId(e.target.value)}
          >
            <option value="">Add to project…</option>
            <NamedOptions items={unassigned} />
          </Select>
          <Select aria-label="Role" className="max-w-56" value={role} onChange={(e) => setRole(e.target.value as ProjectRole)}>
            <PlainOptions values={PROJECT_ROLES} labels={PROJECT_ROLE_LABELS} />
          </Select>
          <Button
            variant="secondary"
            disabled={!projectId || membership.isPending}
            onClick={() => membership.mutate({ userId: user.id, projectId, role }, { onSuccess: () => setProjectId('') })}
          >
            Add
          </Button>
        </div>
      ) : null}
      <ErrorNotice error={membership.error} className="mt-2" />
    </Card>
  );
}

/** A new temporary password for a forgotten or expired one (ends the user's sessions). */
function NewTemporaryPassword({ user }: { user: AdminUser }) {
  const issue = useIssueTemporaryPassword();
  const [asking, setAsking] = useState(false);
  return (
    <div className="mt-2">
      <Button variant="ghost" disabled={issue.isPending || asking} onClick={() => setAsking(true)}>
        New temporary password
      </Button>
      {asking ? (
        <Confirm
          title={`Give ${user.name} a new temporary password?`}
          confirmLabel="Give a new password"
          busy={issue.isPending}
          onConfirm={() => {
            setAsking(false);
            issue.mutate(user.id);
          }}
          onCancel={() => setAsking(false)}
        >
          Their current password stops working and they are signed out everywhere.
        </Confirm>
      ) : null}
      {issue.error ? <ErrorNotice error={issue.error} /> : null}
      {issue.data ? <TemporaryPassword email={user.email} password={issue.data.temporaryPassword} /> : null}
    </div>
  );
}
