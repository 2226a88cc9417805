import { useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { Button } from '../../components/ui/button.js';
import { TextField } from '../../components/ui/field.js';
import { Notice } from '../../components/ui/notice.js';
import { useCreateProject } from '../../features/projects/api/create-project.js';
import { useProjectsRefresh, useStoredProjects } from '../../features/projects/api/get-projects.js';
import { errorText, fieldProblems } from '../../lib/api-client.js';
import { useSession } from '../../lib/auth.js';
import { LOCAL_PROJECT_NAME } from '../../lib/db.js';
import { useOnlineStatus } from '../../lib/use-online-status.js';

const ROLE_TEXT = { owner: 'owner', editor: 'editor', reviewer: 'reviewer', viewer: 'viewer' } as const;

/** /projects — this device's local space beside the server projects of the signed-in account. */
export function Component() {
  const session = useSession();
  const online = useOnlineStatus();
  const signedIn = !!session?.refreshToken;
  const refresh = useProjectsRefresh(signedIn && online);
  const projects = useStoredProjects(session?.user.id);
  const create = useCreateProject();
  const navigate = useNavigate();
  const [name, setName] = useState('');
  const problems = fieldProblems(create.error);
  return (
    <div className="space-y-6">
      <title>Projects · Phasewright</title>
      <h1 className="text-2xl font-bold tracking-tight text-ink-900">Projects</h1>
      <ul className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3" aria-label="Projects">
        <li className="rounded-xl bg-surface p-4 ring-1 ring-line">
          <Link to="/projects/device" className="text-lg font-bold text-ink-900 underline-offset-2 hover:underline">
            {LOCAL_PROJECT_NAME}
          </Link>
          <p className="mt-1 text-sm text-ink-700">Local only: kept in this browser, never synced.</p>
        </li>
        {(projects ?? []).map((p) => (
          <li key={p.id} className="rounded-xl bg-surface p-4 ring-1 ring-line" data-project={p.id}>
            <Link to={`/projects/${p.id}`} className="text-lg font-bold text-ink-900 underline-offset-2 hover:underline">
              {p.name}
            </Link>
            <p className="mt-1 text-sm text-ink-700">
              Shared · you are {ROLE_TEXT[p.myRole]}
              {p.archived ? ' · archived' : ''}
            </p>
            {p.description ? <p className="mt-1 text-sm text-ink-600">{p.description}</p> : null}
          </li>
        ))}
      </ul>
      {session === null ? (
        <Notice tone="info" title="Shared projects need an account">
          <Link className="font-semibold text-accent-700 underline underline-offset-2" to="/sign-in">
            Sign in
          </Link>{' '}
          to see your group's projects. Work in {LOCAL_PROJECT_NAME} needs none.
        </Notice>
      ) : null}
      {session && !session.refreshToken ? (
        <Notice tone="warn" title="Your sign-in has ended">
          The projects shown are this device's copy.{' '}
          <Link className="font-semibold text-accent-700 underline underline-offset-2" to={`/sign-in?email=${encodeURIComponent(session.user.email)}`}>
            Sign in again
          </Link>{' '}
          to sync.
        </Notice>
      ) : null}
      {refresh.isError ? (
        <Notice tone="warn" title="Could not refresh the project list">
          {errorText(refresh.error)} The list shown is this device's copy.
        </Notice>
      ) : null}
      {signedIn ? (
        <form
          aria-label="New project"
          className="flex max-w-xl flex-wrap items-end gap-3 rounded-xl bg-surface p-4 ring-1 ring-line"
          onSubmit={(e) => {
            e.preventDefault();
            create.mutate({ name: name.trim() }, { onSuccess: (p) => navigate(`/projects/${p.id}`) });
          }}
        >
          <TextField className="min-w-64 flex-1" label="New shared project" path="name" value={name} onChange={setName} errors={problems.name} placeholder="e.g. kagome strip survey" required />
          <Button type="submit" disabled={create.isPending || !online}>
            Create project
          </Button>
          {!online ? <p className="w-full text-xs text-ink-600">Creating a shared project needs the server.</p> : null}
          {create.error && !problems.name ? <p className="w-full text-sm text-red-800">{errorText(create.error)}</p> : null}
        </form>
      ) : null}
    </div>
  );
}
