import { useState } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { Button } from '../../components/ui/button.js';
import { TextField } from '../../components/ui/field.js';
import { Notice } from '../../components/ui/notice.js';
import { useRegister } from '../../features/auth/api/register.js';
import { errorText, fieldProblems } from '../../lib/api-client.js';
import { safeNext } from './sign-in.js';

/** /register */
export function Component() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const [email, setEmail] = useState('');
  const [displayName, setDisplayName] = useState('');
  const [password, setPassword] = useState('');
  const register = useRegister();
  const problems = fieldProblems(register.error);
  return (
    <div className="mx-auto max-w-md space-y-5">
      <title>Create an account · Phasewright</title>
      <h1 className="text-2xl font-bold tracking-tight text-ink-900">Create an account</h1>
      <form
        aria-label="Create an account"
        className="space-y-4 rounded-xl bg-surface p-5 ring-1 ring-line"
        onSubmit={(e) => {
          e.preventDefault();
          register.mutate({ email: email.trim(), displayName: displayName.trim(), password }, { onSuccess: () => navigate(safeNext(params.get('next')), { replace: true }) });
        }}
      >
        <TextField label="E-mail address" path="email" type="email" autoComplete="username" value={email} onChange={setEmail} errors={problems.email} required />
        <TextField label="Your name (as colleagues see it)" path="displayName" autoComplete="name" value={displayName} onChange={setDisplayName} errors={problems.displayName} required />
        <TextField
          label="Password"
          path="password"
          type="password"
          autoComplete="new-password"
          value={password}
          onChange={setPassword}
          errors={problems.password}
          hint="At least 10 characters with at least 5 different ones, not containing your e-mail address."
          required
        />
        {register.error && Object.keys(problems).length === 0 ? (
          <Notice tone="error" title="No account created" live>
            {errorText(register.error)}
          </Notice>
        ) : null}
        <Button type="submit" disabled={register.isPending}>
          {register.isPending ? 'Creating…' : 'Create the account'}
        </Button>
      </form>
      <p className="text-sm text-ink-700">
        Already have one?{' '}
        <Link className="font-semibold text-accent-700 underline underline-offset-2" to="/sign-in">
          Sign in
        </Link>
        .
      </p>
    </div>
  );
}
