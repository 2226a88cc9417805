import { useState } from 'react';
import { Link, useLocation, useNavigate } from 'react-router-dom';
import { Button } from '../../components/ui/button.js';
import { TextField } from '../../components/ui/field.js';
import { Notice } from '../../components/ui/notice.js';
import { useAcceptInvitation } from '../../features/projects/api/accept-invitation.js';
import { useInvitationPreview } from '../../features/projects/api/preview-invitation.js';
import { errorText, fieldProblems } from '../../lib/api-client.js';
import { useSession } from '../../lib/auth.js';

/** /invitations/accept#token=… — the link from an invitation e-mail (the token never reaches a server log). */
export function Component() {
  const { hash, pathname } = useLocation();
  const token = new URLSearchParams(hash.replace(/^#/, '')).get('token');
  const session = useSession();
  const navigate = useNavigate();
  const preview = useInvitationPreview(token);
  const accept = useAcceptInvitation();
  const [displayName, setDisplayName] = useState('');
  const [password, setPassword] = useState('');
  const problems = fieldProblems(accept.error);

  if (!token) return <Notice tone="error" title="This link has no invitation token">Open the link from the e-mail exactly as it was sent.</Notice>;
  if (preview.isPending || session === undefined) return <p role="status">Reading the invitation…</p>;
  if (preview.isError) {
    return (
      <Notice tone="error" title="This invitation cannot be used">
        {errorText(preview.error)}
      </Notice>
    );
  }
  const inv = preview.data;
  const signedInAsInvited = session?.user.email.toLowerCase() === inv.email.toLowerCase() && !!session.refreshToken;
  const done = (projectId: string) => navigate(`/projects/${projectId}`, { replace: true });
  return (
    <div className="mx-auto max-w-lg space-y-5">
      <title>Invitation · Phasewright</title>
      <p className="text-sm font-semibold text-ink-600">Invitation</p>
      <h1 className="text-2xl font-bold tracking-tight text-ink-900">Join “{inv.projectName}”</h1>
      <p className="text-ink-700">
        {inv.invitedBy ?? 'An owner'} invites <strong>{inv.email}</strong> to this project as <strong>{inv.role}</strong>. The link works once, until {new Date(inv.expiresAt).toLocaleString()}.
      </p>
      {accept.error && Object.keys(problems).length === 0 ? (
        <Notice tone="error" title="Not accepted" live>
          {errorText(accept.error)}
        </Notice>
      ) : null}
      {signedInAsInvited ? (
        <Button disabled={accept.isPending} onClick={() => accept.mutate({ token, signedIn: true }, { onSuccess: (r) => done(r.projectId) })}>
          Accept and open the project
        </Button>
      ) : inv.accountExists ? (
        <Notice tone="info" title={session ? `You are signed in as ${session.user.email}` : 'You have an account'}>
          Sign in as {inv.email}, then open this link again.{' '}
          <Link className="font-semibold text-accent-700 underline underline-offset-2" to={`/sign-in?email=${encodeURIComponent(inv.email)}&next=${encodeURIComponent(pathname + hash)}`}>
            Sign in
          </Link>
        </Notice>
      ) : (
        <form
          aria-label="Register and accept"
          className="space-y-4 rounded-xl bg-surface p-5 ring-1 ring-line"
          onSubmit={(e) => {
            e.preventDefault();
            accept.mutate({ token, signedIn: false, displayName: displayName.trim(), password }, { onSuccess: (r) => done(r.projectId) });
          }}
        >
          <p className="text-sm text-ink-700">Create your account for {inv.email} to accept.</p>
          <TextField label="Your name (as colleagues see it)" path="displayName" autoComplete="name" value={displayName} onChange={setDisplayName} errors={problems.displayName} required />
          <TextField label="Password" path="password" type="password" autoComplete="new-password" value={password} onChange={setPassword} errors={problems.password} hint="At least 10 characters with at least 5 different ones." required />
          <Button type="submit" disabled={accept.isPending}>
            {accept.isPending ? 'Joining…' : 'Create the account and join'}
          </Button>
        </form>
      )}
    </div>
  );
}
