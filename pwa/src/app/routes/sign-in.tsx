import { useState } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { Button } from '../../components/ui/button.js';
import { TextField } from '../../components/ui/field.js';
import { Notice } from '../../components/ui/notice.js';
import { useSignIn } from '../../features/auth/api/sign-in.js';
import { errorText, fieldProblems } from '../../lib/api-client.js';
import { useOnlineStatus } from '../../lib/use-online-status.js';

/** Only same-app paths are followed after signing in. */
export function safeNext(next: string | null): string {
  return next && next.startsWith('/') && !next.startsWith('//') ? next : '/projects';
}

/** /sign-in?next=/path */
export function Component() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const online = useOnlineStatus();
  const [email, setEmail] = useState(params.get('email') ?? '');
  const [password, setPassword] = useState('');
  const signIn = useSignIn();
  const problems = fieldProblems(signIn.error);
  return (
    <div className="mx-auto max-w-md space-y-5">
      <title>Sign in · Phasewright</title>
      <h1 className="text-2xl font-bold tracking-tight text-ink-900">Sign in</h1>
      <p className="text-sm text-ink-700">
        Signing in connects this device to your group's projects. Without it, everything you do stays in the local space{' '}
        <Link className="font-semibold text-accent-700 underline underline-offset-2" to="/projects/device">
          This device
        </Link>
        .
      </p>
      {params.get('reset') === 'done' ? (
        <Notice tone="info" title="Your password is changed" live>
          <span data-testid="reset-done">Every device of this account was signed out. Sign in with the new password.</span>
        </Notice>
      ) : null}
      {!online ? <Notice tone="warn" title="This device is offline">Signing in needs the server. Your local work is still here.</Notice> : null}
      <form
        aria-label="Sign in"
        className="space-y-4 rounded-xl bg-surface p-5 ring-1 ring-line"
        onSubmit={(e) => {
          e.preventDefault();
          signIn.mutate({ email: email.trim(), password }, { onSuccess: () => navigate(safeNext(params.get('next')), { replace: true }) });
        }}
      >
        <TextField label="E-mail address" path="email" type="email" autoComplete="username" value={email} onChange={setEmail} errors={problems.email} required />
        <TextField label="Password" path="password" type="password" autoComplete="current-password" value={password} onChange={setPassword} errors={problems.password} required />
        {signIn.error && Object.keys(problems).length === 0 ? (
          <Notice tone="error" title="Not signed in" live>
            {errorText(signIn.error)}
          </Notice>
        ) : null}
        <div className="flex flex-wrap items-center justify-between gap-3">
          <Button type="submit" disabled={signIn.isPending}>
            {signIn.isPending ? 'Signing in…' : 'Sign in'}
          </Button>
          <Link className="text-sm font-semibold text-accent-700 underline underline-offset-2" to={`/reset-password${email.trim() ? `?email=${encodeURIComponent(email.trim())}` : ''}`}>
            Forgot password?
          </Link>
        </div>
      </form>
      <p className="text-sm text-ink-700">
        No account yet?{' '}
        <Link className="font-semibold text-accent-700 underline underline-offset-2" to={`/register${params.get('next') ? `?next=${encodeURIComponent(params.get('next') ?? '')}` : ''}`}>
          Create one
        </Link>
        .
      </p>
    </div>
  );
}
