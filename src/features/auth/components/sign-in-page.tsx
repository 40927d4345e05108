import { useForm } from 'react-hook-form';
import { Navigate, useNavigate, useSearchParams } from 'react-router-dom';
import { Button, ErrorNotice, TextField } from '../../../components/ui';
import { useMe } from '../../../api/me';
import { useSignIn } from '../api/sign-in';
import { Caution } from '../../../components/caution';
import { Logo } from '../../../components/logo';

// Checked with react-hook-form's own rules, not a schema library: this page is part of the first
// page, whose script size has a budget. The server checks the credentials.
const EMAIL_SHAPE = /^[^\s@]+@[^\s@]+\.[^\s@]+$/;
const emailRules = {
  setValueAs: (v: string) => v.trim(),
  validate: (v: string) => EMAIL_SHAPE.test(v) || 'Enter your e-mail address',
};
const passwordRules = { required: 'Enter your password' };
const SIGN_IN_FIELDS = [
  { name: 'email', label: 'E-mail', type: 'email', autoComplete: 'username', rules: emailRules },
  { name: 'password', label: 'Password', type: 'password', autoComplete: 'current-password', rules: passwordRules },
] as const;

export function SignInPage() {
  const me = useMe();
  const navigate = useNavigate();
  const [params] = useSearchParams();
  const signIn = useSignIn();
  const form = useForm({ defaultValues: { email: '', password: '' } });
  const requested = params.get('from') ?? '/';
  // Only same-site paths: never send the user on to another address after sign-in.
  const from = requested.startsWith('/') && !requested.startsWith('//') ? requested : '/';

  if (me.data) return <Navigate to={from} replace />;

  return (
    <div className="flex min-h-screen flex-col bg-deep text-white">
      <main className="mx-auto flex w-full max-w-md flex-1 flex-col justify-center px-5 py-10">
        <div className="mb-8 flex items-center gap-3">
          <Logo className="size-11" />
          <div>
            <p className="text-2xl font-bold tracking-tight">Lullwatch</p>
            <p className="text-sm text-white/70">Weather windows for marine work</p>
          </div>
        </div>
        <form
          className="flex flex-col gap-4 rounded-[var(--radius-card)] bg-surface p-6 text-ink shadow-xl"
          onSubmit={form.handleSubmit((values) => signIn.mutate(values, { onSuccess: () => void navigate(from, { replace: true }) }))}
          noValidate
        >
          <h1 className="text-xl font-bold">Sign in</h1>
          {SIGN_IN_FIELDS.map(({ name, rules, ...field }) => (
            <TextField key={name} id={name} {...field} error={form.formState.errors[name]?.message} {...form.register(name, rules)} />
          ))}
          {signIn.error ? <ErrorNotice error={signIn.error} /> : null}
          <Button type="submit" disabled={signIn.isPending}>
            {signIn.isPending ? 'Signing in…' : 'Sign in'}
          </Button>
          <p className="text-xs text-ink-soft">Accounts are created by your administrator.</p>
        </form>
      </main>
      <footer className="px-5 pb-6">
        <Caution inverted />
      </footer>
    </div>
  );
}
