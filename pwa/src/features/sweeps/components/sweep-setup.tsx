/**
 * Sets up a sweep of a saved model: one axis (a cut) or two (a grid), each linear or log; the
 * method with its main options; refinement. Validated as you type by physics-core's
 * `parseSweepSpec`; each message sits under the field its JSON path names.
 */
import { SpecError, parseSweepSpec, type ModelSpec, type SweepSpec } from '@phasewright/physics-core';
import { useMemo, useState } from 'react';
import { Button } from '../../../components/ui/button.js';
import { FieldErrors, SelectField, TextField } from '../../../components/ui/field.js';
import { Notice } from '../../../components/ui/notice.js';

interface AxisDraft {
  parameter: string;
  kind: 'linear' | 'log';
  from: string;
  to: string;
  points: string;
}

interface Props {
  model: ModelSpec;
  onCreate: (spec: SweepSpec) => Promise<void> | void;
}

const num = (s: string): number | string => (s.trim() !== '' && Number.isFinite(Number(s)) ? Number(s) : s);

export function SweepSetup({ model, onCreate }: Props) {
  const params = Object.keys(model.parameters);
  const [name, setName] = useState(`${model.name ?? 'model'} sweep`);
  const [axes, setAxes] = useState<AxisDraft[]>([{ parameter: params[0] ?? '', kind: 'linear', from: '0', to: '2', points: '9' }]);
  const [method, setMethod] = useState<'ed' | 'meanfield'>('ed');
  const [states, setStates] = useState('2');
  const [fidelity, setFidelity] = useState<'on' | 'off'>('on');
  const [starts, setStarts] = useState('8');
  const [supercell, setSupercell] = useState('');
  const [depth, setDepth] = useState('0');
  const [busy, setBusy] = useState(false);

  const draft = useMemo(() => {
    const solver: Record<string, unknown> =
      method === 'ed' ? { states: num(states), ...(fidelity === 'off' ? { fidelity: false } : {}) } : { starts: num(starts) };
    if (method === 'meanfield' && supercell.trim()) {
      try {
        solver.supercell = JSON.parse(supercell);
      } catch {
        solver.supercell = supercell;
      }
    }
    const d: Record<string, unknown> = {
      spec: 'phasewright.sweep/1',
      name,
      model,
      axes: axes.map((a) => ({ parameter: a.parameter, kind: a.kind, from: num(a.from), to: num(a.to), points: num(a.points) })),
      method,
      solver,
      seed: 1,
    };
    if (Number(depth) > 0) d.refine = { maxDepth: num(depth), on: method === 'ed' && fidelity === 'on' ? ['label', 'fidelity'] : ['label'] };
    return d;
  }, [name, model, axes, method, states, fidelity, starts, supercell, depth]);

  const validation = useMemo((): { spec?: SweepSpec; issues: { path: string; message: string }[] } => {
    try {
      return { spec: parseSweepSpec(draft), issues: [] };
    } catch (e) {
      return { issues: e instanceof SpecError ? e.issues : [{ path: '$', message: e instanceof Error ? e.message : String(e) }] };
    }
  }, [draft]);
  const at = (path: string) => validation.issues.filter((i) => i.path === path).map((i) => i.message);
  const total = validation.spec ? validation.spec.axes.reduce((n, a) => n * (a.kind === 'list' ? a.values.length : a.points), 1) : 0;
  const setAxis = (i: number, patch: Partial<AxisDraft>) => setAxes((xs) => xs.map((a, j) => (j === i ? { ...a, ...patch } : a)));

  return (
    <form
      aria-label="Sweep"
      className="space-y-5"
      onSubmit={(e) => {
        e.preventDefault();
        if (!validation.spec) return;
        setBusy(true);
        void Promise.resolve(onCreate(validation.spec)).finally(() => setBusy(false));
      }}
    >
      <TextField label="Name" path="$.name" value={name} onChange={setName} errors={at('$.name')} />
      <fieldset className="space-y-3 rounded-xl border border-line bg-surface p-4">
        <legend className="px-1 text-sm font-bold text-ink-900">Axes</legend>
        {axes.map((a, i) => (
          <div key={i} className="grid gap-2 sm:grid-cols-6" data-axis={i}>
            <SelectField label={`Axis ${i + 1}: parameter`} path={`$.axes[${i}].parameter`} value={a.parameter} options={params.map((p) => ({ value: p, label: p }))} onChange={(v) => setAxis(i, { parameter: v })} errors={at(`$.axes[${i}].parameter`)} className="sm:col-span-2" />
            <SelectField label="Spacing" path={`$.axes[${i}].kind`} value={a.kind} options={[{ value: 'linear', label: 'linear' }, { value: 'log', label: 'log' }]} onChange={(v) => setAxis(i, { kind: v })} errors={at(`$.axes[${i}].kind`)} />
            <TextField label="From" path={`$.axes[${i}].from`} value={a.from} onChange={(v) => setAxis(i, { from: v })} errors={at(`$.axes[${i}].from`)} inputMode="decimal" />
            <TextField label="To" path={`$.axes[${i}].to`} value={a.to} onChange={(v) => setAxis(i, { to: v })} errors={at(`$.axes[${i}].to`)} inputMode="decimal" />
            <TextField label="Points" path={`$.axes[${i}].points`} value={a.points} onChange={(v) => setAxis(i, { points: v })} errors={at(`$.axes[${i}].points`)} inputMode="numeric" />
          </div>
        ))}
        <div className="flex gap-2">
          {axes.length < 2 ? (
            <Button variant="secondary" onClick={() => setAxes((xs) => [...xs, { parameter: params.find((p) => p !== xs[0].parameter) ?? params[0], kind: 'linear', from: '0', to: '1', points: '7' }])}>
              Add a second axis (grid)
            </Button>
          ) : (
            <Button variant="secondary" onClick={() => setAxes((xs) => xs.slice(0, 1))}>
              Remove the second axis (cut)
            </Button>
          )}
        </div>
        <FieldErrors messages={at('$.axes')} />
      </fieldset>
      <fieldset className="grid gap-3 rounded-xl border border-line bg-surface p-4 sm:grid-cols-3">
        <legend className="px-1 text-sm font-bold text-ink-900">Method</legend>
        <SelectField label="Solver" path="$.method" value={method} options={[{ value: 'ed', label: 'exact diagonalization' }, { value: 'meanfield', label: 'Gutzwiller mean-field' }]} onChange={setMethod} errors={at('$.method')} />
        {method === 'ed' ? (
          <>
            <TextField label="Lowest states" path="$.solver.states" value={states} onChange={setStates} inputMode="numeric" hint="2 or more gives the gap" errors={at('$.solver.states')} />
            <SelectField label="Fidelity susceptibility" path="$.solver.fidelity" value={fidelity} options={[{ value: 'on', label: 'along axis 1' }, { value: 'off', label: 'off' }]} onChange={setFidelity} />
          </>
        ) : (
          <>
            <TextField label="Starts per point" path="$.solver.starts" value={starts} onChange={setStarts} inputMode="numeric" errors={at('$.solver.starts')} />
            <TextField label="Supercell (JSON, optional)" path="$.solver.supercell" value={supercell} onChange={setSupercell} placeholder="e.g. [2] or [2, 2]" hint="Empty: one unit cell, which cannot hold a density wave or flux pattern longer than a cell" errors={at('$.solver.supercell')} />
          </>
        )}
        <TextField label="Refinement depth" path="$.refine.maxDepth" value={depth} onChange={setDepth} inputMode="numeric" hint="0 = the coarse grid only" errors={at('$.refine.maxDepth')} />
      </fieldset>
      {validation.issues.length > 0 ? (
        <Notice tone="error" title="The sweep is not valid yet">
          <ul className="list-disc pl-4">
            {validation.issues.map((i) => (
              <li key={i.path + i.message}>
                <code className="text-xs">{i.path}</code> — {i.message}
              </li>
            ))}
          </ul>
        </Notice>
      ) : (
        <p className="text-sm text-ink-700">{total} coarse points{Number(depth) > 0 ? ', plus refinement near boundaries' : ''}.</p>
      )}
      <Button type="submit" disabled={!validation.spec || busy}>
        Create sweep and start
      </Button>
    </form>
  );
}
