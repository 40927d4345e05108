// `/account`: change your password. Someone signed in with a temporary password from an
// administrator is sent here first and can use nothing else until it is changed.
import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { PASSWORD_MIN_LENGTH, passwordProblem } from '../../../../shared/auth/password-rules';
import { Button, Card, ErrorNotice, Notice, PageHeader, TextField } from '../../../components/ui';
import { useMe } from '../../../api/me';
import { useChangePassword } from '../api/change-password';

/** A controlled password input's props. */
function passwordInput(value: string, set: (value: string) => void) {
  return { type: 'password', value, onChange: (e: React.ChangeEvent<HTMLInputElement>) => set(e.target.value) };
}

export function AccountPage() {
  const me = useMe();
  const change = useChangePassword();
  const navigate = useNavigate();
  const [current, setCurrent] = useState('');
  const [next, setNext] = useState('');
  const [repeat, setRepeat] = useState('');
  const [problems, setProblems] = useState<{ next?: string; repeat?: string }>({});
  const [done, setDone] = useState(false);
  const forced = me.data?.mustChangePassword === true;

  function submit(e: React.FormEvent) {
    e.preventDefault();
    const problem = passwordProblem(next, { email: me.data?.email, name: me.data?.name });
    const found = {
      next: problem ? `The new password ${problem}.` : undefined,
      repeat: next !== repeat ? 'The two new passwords differ.' : undefined,
    };
    setProblems(found);
    if (found.next || found.repeat) return;
    change.mutate(
      { currentPassword: current, newPassword: next },
      {
        onSuccess: () => {
          setDone(true);
          setCurrent('');
          setNext('');
          setRepeat('');
          if (forced) void navigate('/', { replace: true });
        },
      },
    );
  }

  return (
    <div className="max-w-xl">
      <PageHeader title="Your account" subtitle={me.data ? `${me.data.name} · ${me.data.email}` : undefined} />
      {forced ? (
        <div className="mb-4">
          <Notice tone="info">
            You signed in with a temporary password. Choose your own password now: the rest of Lullwatch opens once it is changed.
          </Notice>
        </div>
      ) : null}
      {done ? (
        <div className="mb-4">
          <Notice tone="success">Password changed. You were signed out everywhere else.</Notice>
        </div>
      ) : null}
      <Card>
        <h2 className="mb-3 text-lg font-bold">Change your password</h2>
        <form className="grid gap-3" onSubmit={submit} noValidate>
          <TextField
            label={forced ? 'Temporary password' : 'Current password'}
            id="current-password"
            autoComplete="current-password"
            {...passwordInput(current, setCurrent)}
          />
          <TextField
            label="New password"
            id="new-password"
            autoComplete="new-password"
            hint={`At least ${PASSWORD_MIN_LENGTH} characters; a few unrelated words make a good one. Not your e-mail, not a common password.`}
            error={problems.next}
            {...passwordInput(next, setNext)}
          />
          <TextField
            label="New password again"
            id="repeat-password"
            autoComplete="new-password"
            error={problems.repeat}
            {...passwordInput(repeat, setRepeat)}
          />
          <p className="text-sm text-ink-soft">Changing your password signs you out on every other device.</p>
          <div>
            <Button type="submit" disabled={change.isPending || !current || !next}>
              Change password
            </Button>
          </div>
        </form>
        <ErrorNotice error={change.error} className="mt-3" />
      </Card>
    </div>
  );
}
