import { Link } from 'react-router-dom';
import { ProjectItems } from '../../features/projects/components/project-items.js';
import { isActive } from '../../features/sweeps/lib/run-manager.js';
import { LOCAL_PROJECT_ID, LOCAL_PROJECT_NAME } from '../../lib/db.js';

/** /projects/device — the local-only space: models, sweeps and maps, newest first, with search; items can be deleted here. */
export function Component() {
  return (
    <div className="space-y-5">
      <title>{`${LOCAL_PROJECT_NAME} · Phasewright`}</title>
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <p className="text-sm font-semibold text-ink-600">Project</p>
          <h1 className="text-2xl font-bold tracking-tight text-ink-900">{LOCAL_PROJECT_NAME}</h1>
          <p className="mt-1 text-sm text-ink-700">Kept in this browser only, never sent to a server; works signed out and offline.</p>
        </div>
        <Link to="/models/new" className="rounded-md bg-accent-600 px-3.5 py-2 text-sm font-semibold text-white hover:bg-accent-700 dark:hover:bg-accent-300">
          New model
        </Link>
      </div>
      <ProjectItems projectId={LOCAL_PROJECT_ID} deletable={{ isRunning: isActive }} />
    </div>
  );
}
