import { Link, useParams } from 'react-router-dom';
import { useStoredProject } from '../../features/projects/api/get-projects.js';
import { ProjectItems } from '../../features/projects/components/project-items.js';

/** /projects/:id — a server project as stored on this device (opens offline). */
export function Component() {
  const { id } = useParams();
  const project = useStoredProject(id);
  if (project === undefined) return <p role="status">Loading…</p>;
  if (project === null || !id) {
    return (
      <p>
        This project is not on this device. <Link className="font-semibold text-accent-700 underline" to="/projects">See your projects</Link>.
      </p>
    );
  }
  const canEdit = project.myRole === 'owner' || project.myRole === 'editor';
  return (
    <div className="space-y-5">
      <title>{`${project.name} · Phasewright`}</title>
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <p className="text-sm font-semibold text-ink-600">Shared project · you are {project.myRole}</p>
          <h1 className="text-2xl font-bold tracking-tight text-ink-900">{project.name}</h1>
          {project.description ? <p className="mt-1 text-sm text-ink-700">{project.description}</p> : null}
        </div>
        <div className="flex items-center gap-3 text-sm font-semibold">
          <Link to={`/projects/${id}/members`} className="text-accent-700 underline underline-offset-2">
            Members
          </Link>
          {canEdit ? (
            <Link to={`/models/new?project=${id}`} className="rounded-md bg-accent-600 px-3.5 py-2 text-white hover:bg-accent-700">
              New model
            </Link>
          ) : null}
        </div>
      </div>
      <ProjectItems projectId={id} />
    </div>
  );
}
