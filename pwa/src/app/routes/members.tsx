import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { Button } from '../../components/ui/button.js';
import { SelectField, TextField } from '../../components/ui/field.js';
import { Notice } from '../../components/ui/notice.js';
import { useChangeRole } from '../../features/projects/api/change-role.js';
import { useInvitations } from '../../features/projects/api/get-invitations.js';
import { useMembers } from '../../features/projects/api/get-members.js';
import { useStoredProject } from '../../features/projects/api/get-projects.js';
import { useInviteMember } from '../../features/projects/api/invite-member.js';
import { useRemoveMember } from '../../features/projects/api/remove-member.js';
import { useRevokeInvitation } from '../../features/projects/api/revoke-invitation.js';
import { errorText, fieldProblems } from '../../lib/api-client.js';
import { useSession } from '../../lib/auth.js';
import type { ProjectRole } from '../../lib/db.js';

const ROLES: { value: ProjectRole; label: string }[] = [
  { value: 'owner', label: 'owner — members, settings, delete' },
  { value: 'editor', label: 'editor — models, sweeps, maps, labels' },
  { value: 'reviewer', label: 'reviewer — read, comment, spot-check, verdict' },
  { value: 'viewer', label: 'viewer — read' },
];

/** /projects/:id/members — everyone sees the members; owners invite, change roles and remove. */
export function Component() {
  const { id = '' } = useParams();
  const project = useStoredProject(id);
  const session = useSession();
  const members = useMembers(id);
  const isOwner = project?.myRole === 'owner';
  const invitations = useInvitations(id, isOwner);
  const invite = useInviteMember(id);
  const changeRole = useChangeRole(id);
  const remove = useRemoveMember(id);
  const revoke = useRevokeInvitation(id);
  const [email, setEmail] = useState('');
  const [role, setRole] = useState<ProjectRole>('editor');
  const [sent, setSent] = useState<string | null>(null);
  const problems = fieldProblems(invite.error);
  const actionError = changeRole.error ?? remove.error ?? revoke.error;

  if (project === undefined) return <p role="status">Loading…</p>;
  return (
    <div className="space-y-6">
      <title>{`Members of ${project?.name ?? 'project'} · Phasewright`}</title>
      <div>
        <p className="text-sm font-semibold text-ink-600">
          <Link className="underline underline-offset-2" to={`/projects/${id}`}>
            {project?.name ?? 'Project'}
          </Link>{' '}
          · members
        </p>
        <h1 className="text-2xl font-bold tracking-tight text-ink-900">Members</h1>
      </div>
      {members.isError ? <Notice tone="warn" title="Members could not be loaded">{errorText(members.error)}</Notice> : null}
      {actionError ? (
        <Notice tone="error" title="Not changed" live>
          {errorText(actionError)}
        </Notice>
      ) : null}
      {members.data ? (
        <table className="w-full max-w-4xl text-left text-sm" aria-label="Members">
          <thead className="text-xs tracking-wide text-ink-600 uppercase">
            <tr>
              <th className="py-2">Name</th>
              <th>E-mail</th>
              <th>Role</th>
              <th>Since</th>
              <th />
            </tr>
          </thead>
          <tbody className="divide-y divide-line bg-surface">
            {members.data.map((m) => (
              <tr key={m.userId} data-member={m.email}>
                <td className="py-2 pl-2 font-semibold text-ink-900">
                  {m.displayName}
                  {m.userId === session?.user.id ? <span className="ml-1 text-xs font-normal text-ink-600">(you)</span> : null}
                </td>
                <td>{m.email}</td>
                <td>
                  {isOwner ? (
                    <select
                      aria-label={`Role of ${m.displayName}`}
                      className="rounded border border-line bg-surface px-1.5 py-1"
                      value={m.role}
                      disabled={changeRole.isPending}
                      onChange={(e) => changeRole.mutate({ userId: m.userId, role: e.target.value as ProjectRole })}
                    >
                      {ROLES.map((r) => (
                        <option key={r.value} value={r.value}>
                          {r.value}
                        </option>
                      ))}
                    </select>
                  ) : (
                    m.role
                  )}
                </td>
                <td className="text-ink-600">{new Date(m.since).toLocaleDateString()}</td>
                <td className="pr-2 text-right">
                  {isOwner && m.userId !== session?.user.id ? (
                    <Button
                      variant="ghost"
                      aria-label={`Remove ${m.displayName}`}
                      onClick={() => {
                        if (window.confirm(`Remove ${m.displayName} from ${project?.name ?? 'the project'}?`)) remove.mutate(m.userId);
                      }}
                    >
                      Remove
                    </Button>
                  ) : null}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      ) : members.isPending ? (
        <p role="status">Loading members…</p>
      ) : null}

      {isOwner ? (
        <section className="max-w-4xl space-y-3" aria-labelledby="invite-heading">
          <h2 id="invite-heading" className="text-lg font-bold text-ink-900">
            Invite by e-mail
          </h2>
          <form
            aria-label="Invite"
            className="flex flex-wrap items-start gap-3 rounded-xl bg-surface p-4 ring-1 ring-line"
            onSubmit={(e) => {
              e.preventDefault();
              const address = email.trim();
              invite.mutate(
                { email: address, role },
                {
                  onSuccess: (inv) => {
                    setSent(inv.mailSent === false ? `The invitation to ${address} is stored, but the e-mail could not be sent.` : `Invitation sent to ${address} as ${role}.`);
                    setEmail('');
                  },
                },
              );
            }}
          >
            <TextField className="min-w-64 flex-1" label="E-mail address" path="email" type="email" value={email} onChange={setEmail} errors={problems.email} required />
            <SelectField className="min-w-64" label="Role" path="role" value={role} options={ROLES} onChange={setRole} errors={problems.role} />
            <Button type="submit" className="mt-5" disabled={invite.isPending}>
              Send invitation
            </Button>
          </form>
          {invite.error && !problems.email && !problems.role ? <Notice tone="error" title="Not invited" live>{errorText(invite.error)}</Notice> : null}
          {sent && !invite.error ? <p role="status" className="text-sm font-semibold text-good-700">{sent}</p> : null}
          {invitations.data && invitations.data.length > 0 ? (
            <ul className="divide-y divide-line rounded-xl bg-surface text-sm ring-1 ring-line" aria-label="Invitations">
              {invitations.data.map((inv) => (
                <li key={inv.id} className="flex flex-wrap items-center gap-3 px-4 py-2" data-invitation={inv.email}>
                  <span className="font-semibold text-ink-900">{inv.email}</span>
                  <span>{inv.role}</span>
                  <span className="text-ink-600" data-state={inv.state}>
                    {inv.state}
                  </span>
                  <span className="text-xs text-ink-500">until {new Date(inv.expiresAt).toLocaleDateString()}</span>
                  {inv.state === 'pending' ? (
                    <Button variant="ghost" className="ml-auto" onClick={() => revoke.mutate(inv.id)}>
                      Withdraw
                    </Button>
                  ) : null}
                </li>
              ))}
            </ul>
          ) : null}
        </section>
      ) : null}
    </div>
  );
}
