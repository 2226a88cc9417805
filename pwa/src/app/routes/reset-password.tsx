import { useState } from 'react';
import { Link, useLocation, useNavigate, useSearchParams } from 'react-router-dom';
import { Button } from '../../components/ui/button.js';
import { TextField } from '../../components/ui/field.js';
import { Notice } from '../../components/ui/notice.js';
import { useRequestPasswordReset } from '../../features/auth/api/request-password-reset.js';
import { useResetPassword } from '../../features/auth/api/reset-password.js';
import { errorText, fieldProblems } from '../../lib/api-client.js';
import { useOnlineStatus } from '../../lib/use-online-status.js';

const link = 'font-semibold text-accent-700 underline underline-offset-2';

/** Step 1: the address to send a reset link to. */
function RequestForm({ initialEmail }: { initialEmail: string }) {
  const [email, setEmail] = useState(initialEmail);
  const request = useRequestPasswordReset();
  const problems = fieldProblems(request.error);
  if (request.isSuccess) {
    return (
      <Notice tone="info" title="Check your e-mail" live>
        <span data-testid="reset-requested">
          If an account uses <strong>{request.variables}</strong>, a message with a link to choose a new password is on its way. The link works once and
          for a limited time. Nothing arrived? Check the address and{' '}
          <button type="button" className={link} onClick={() => request.reset()}>
            ask again
          </button>
          .
        </span>
      </Notice>
    );
  }
  return (
    <form
      aria-label="Ask for a reset link"
      className="space-y-4 rounded-xl bg-surface p-5 ring-1 ring-line"
      onSubmit={(e) => {
        e.preventDefault();
        request.mutate(email.trim());
      }}
    >
      <p className="text-sm text-ink-700">We send a link to choose a new password to the address of your account.</p>
      <TextField label="E-mail address" path="email" type="email" autoComplete="username" value={email} onChange={setEmail} errors={problems.email} required />
      {request.error && Object.keys(problems).length === 0 ? (
        <Notice tone="error" title="No link sent" live>
          {errorText(request.error)}
        </Notice>
      ) : null}
      <Button type="submit" disabled={request.isPending} data-testid="reset-request-submit">
        {request.isPending ? 'Sending…' : 'Send me a reset link'}
      </Button>
    </form>
  );
}

/** Step 2 (from the e-mailed link): the new password. */
function NewPasswordForm({ token }: { token: string }) {
  const navigate = useNavigate();
  const [password, setPassword] = useState('');
  const [confirm, setConfirm] = useState('');
  const [mismatch, setMismatch] = useState(false);
  const reset = useResetPassword();
  const problems = fieldProblems(reset.error);
  if (problems.token) {
    const why = problems.token.join(' ');
    return (
      <Notice tone="error" title="This reset link cannot be used" live>
        <span data-testid="reset-token-error">
          {why}
          {/[.!?]$/.test(why) ? '' : '.'} Each link works once and only for a limited time.{' '}
          <Link className={link} to="/reset-password" replace>
            Ask for a new link
          </Link>
        </span>
      </Notice>
    );
  }
  return (
    <form
      aria-label="Choose a new password"
      className="space-y-4 rounded-xl bg-surface p-5 ring-1 ring-line"
      onSubmit={(e) => {
        e.preventDefault();
        if (password !== confirm) {
          setMismatch(true);
          return;
        }
        setMismatch(false);
        reset.mutate({ token, password }, { onSuccess: () => navigate('/sign-in?reset=done', { replace: true }) });
      }}
    >
      <TextField
        label="New password"
        path="password"
        type="password"
        autoComplete="new-password"
        value={password}
        onChange={setPassword}
        errors={problems.password}
        hint="At least 10 characters with at least 5 different ones, not containing your e-mail address."
        required
      />
      <TextField
        label="The same password again"
        path="confirm"
        type="password"
        autoComplete="new-password"
        value={confirm}
        onChange={(v) => {
          setConfirm(v);
          setMismatch(false);
        }}
        errors={mismatch ? ['The two passwords differ.'] : []}
        required
      />
      {reset.error && Object.keys(problems).length === 0 ? (
        <Notice tone="error" title="The password was not changed" live>
          {errorText(reset.error)}
        </Notice>
      ) : null}
      <p className="text-xs text-ink-600">Setting a new password signs this account out on every device; sign in again afterwards.</p>
      <Button type="submit" disabled={reset.isPending} data-testid="reset-submit">
        {reset.isPending ? 'Saving…' : 'Set the new password'}
      </Button>
    </form>
  );
}

/**
 * /reset-password — ask for a reset link; /reset-password#token=… — the link the server e-mails
 * (sync-server/src/auth/auth.service.ts; the token sits in the fragment, so it never reaches a server log).
 */
export function Component() {
  const { hash } = useLocation();
  const [params] = useSearchParams();
  const online = useOnlineStatus();
  const token = new URLSearchParams(hash.replace(/^#/, '')).get('token');
  return (
    <div className="mx-auto max-w-md space-y-5">
      <title>Reset the password · Phasewright</title>
      <h1 className="text-2xl font-bold tracking-tight text-ink-900">{token ? 'Choose a new password' : 'Forgot your password?'}</h1>
      {!online ? <Notice tone="warn" title="This device is offline">Resetting a password needs the server.</Notice> : null}
      {token ? <NewPasswordForm key={token} token={token} /> : <RequestForm initialEmail={params.get('email') ?? ''} />}
      <p className="text-sm text-ink-700">
        Remembered it?{' '}
        <Link className={link} to="/sign-in">
          Sign in
        </Link>
        .
      </p>
    </div>
  );
}
