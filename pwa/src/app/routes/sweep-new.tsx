import { useNavigate, useParams } from 'react-router-dom';
import { useModel } from '../../features/models/api/models.js';
import { createSweep } from '../../features/sweeps/api/sweeps.js';
import { SweepSetup } from '../../features/sweeps/components/sweep-setup.js';
import { startRun } from '../../features/sweeps/lib/run-manager.js';

/** /models/:id/sweep */
export function Component() {
  const { id } = useParams();
  const navigate = useNavigate();
  const model = useModel(id);
  if (model === undefined) return <p role="status">Loading…</p>;
  if (model === null || !id) return <p>No model with this id on this device.</p>;
  return (
    <div className="max-w-4xl space-y-4">
      <title>{`Sweep ${model.name} · Phasewright`}</title>
      <div>
        <p className="text-sm font-semibold text-ink-600">New sweep of</p>
        <h1 className="text-2xl font-bold tracking-tight text-ink-900">{model.name}</h1>
      </div>
      <SweepSetup
        model={model.spec}
        onCreate={async (spec) => {
          const sweepId = await createSweep(spec, id);
          void startRun(sweepId);
          navigate(`/sweeps/${sweepId}`);
        }}
      />
    </div>
  );
}
