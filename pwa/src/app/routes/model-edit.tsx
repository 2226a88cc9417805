import { useNavigate, useParams, useSearchParams } from 'react-router-dom';
import { saveModel, useModel } from '../../features/models/api/models.js';
import { ModelEditor } from '../../features/models/components/model-editor.js';
import { blankDraft, type Json } from '../../features/models/lib/model-draft.js';
import { useStoredProject } from '../../features/projects/api/get-projects.js';
import { useSession } from '../../lib/auth.js';
import { LOCAL_PROJECT_NAME } from '../../lib/db.js';

/** /models/new and /models/:id */
export function Component() {
  const { id } = useParams();
  const navigate = useNavigate();
  const record = useModel(id);
  const [params] = useSearchParams();
  const session = useSession();
  const projectId = record?.projectId ?? params.get('project') ?? undefined;
  const project = useStoredProject(projectId === 'device' ? undefined : projectId);
  if (id && record === undefined) return <p role="status">Loading…</p>;
  if (id && record === null) return <p>No model with this id on this device.</p>;
  const initial = (record?.spec as unknown as Json | undefined) ?? blankDraft();
  return (
    <div className="space-y-4">
      <title>{`${record?.name ?? 'New model'} · Phasewright`}</title>
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <p className="text-sm font-semibold text-ink-600" data-testid="model-project">
            Model · {project ? project.name : LOCAL_PROJECT_NAME}
          </p>
          <h1 className="text-2xl font-bold tracking-tight text-ink-900">{record?.name ?? 'New model'}</h1>
        </div>
        {id ? (
          <button type="button" className="text-sm font-semibold text-accent-700 underline underline-offset-2" onClick={() => navigate(`/models/${id}/sweep`)}>
            Sweep this model →
          </button>
        ) : null}
      </div>
      <ModelEditor
        key={id ?? 'new'}
        initial={initial}
        saveLabel={id ? 'Save changes' : 'Save model'}
        onSave={async (spec) => {
          const saved = await saveModel(spec, id, project ? { projectId: project.id, ownerId: session?.user.id ?? null } : {});
          if (!id) navigate(`/models/${saved}`, { replace: true });
        }}
      />
    </div>
  );
}
