/**
 * The model editor: a form over model spec v1, validated as you type by physics-core's
 * `parseModelSpec` (every message sits under the field its JSON path names), a live drawing of
 * the cluster, the Hilbert-space dimension and ED memory estimate, JSON import/export and the
 * bundled examples.
 */
import {
  LATTICE_KINDS,
  compileModel,
  estimateHilbertDimension,
  latticeClasses,
  latticeDimension,
  type CompiledModel,
  type LatticeKind,
  type ModelSpec,
} from '@phasewright/physics-core';
import { useDeferredValue, useMemo, useRef, useState } from 'react';
import { Button } from '../../../components/ui/button.js';
import { FieldErrors, SelectField, TextField } from '../../../components/ui/field.js';
import { Notice } from '../../../components/ui/notice.js';
import { EXAMPLE_MODELS, exampleName } from '../lib/examples.js';
import {
  fromInput,
  getAt,
  issuesAt,
  jsonPath,
  parseModelText,
  setAt,
  toInput,
  validateDraft,
  type Json,
  type JsonObject,
  type PathSegment,
  type SpecIssue,
} from '../lib/model-draft.js';
import { BROWSER_LIMIT_BYTES, estimateEdSize, formatBytes, formatCount, type SizeEstimate } from '../lib/size-estimate.js';
import { LatticePreview, termColor } from './lattice-preview.js';

/** Largest cluster (unit cells) drawn and compiled live; bigger ones are estimated from counts. */
const PREVIEW_MAX_CELLS = 400;
const TERM_KINDS = ['hop', 'conditional-hop', 'interaction', 'onsite'] as const;
const CELL_SITES: Record<Exclude<LatticeKind, 'custom'>, number> = { chain: 1, ladder: 2, zigzag: 2, square: 1, triangular: 1, honeycomb: 2, kagome: 3 };

interface Props {
  initial: Json;
  onSave: (spec: ModelSpec) => Promise<void> | void;
  saveLabel?: string;
}

function asObject(x: Json | undefined): JsonObject {
  return x !== null && typeof x === 'object' && !Array.isArray(x) ? x : {};
}
function asArray(x: Json | undefined): Json[] {
  return Array.isArray(x) ? x : [];
}

export function ModelEditor({ initial, onSave, saveLabel = 'Save model' }: Props) {
  const [draft, setDraft] = useState<Json>(initial);
  const [jsonText, setJsonText] = useState<string | null>(null);
  const [importError, setImportError] = useState<string | null>(null);
  const [saving, setSaving] = useState(false);
  const fileInput = useRef<HTMLInputElement>(null);
  const deferred = useDeferredValue(draft);
  const validation = useMemo(() => validateDraft(deferred), [deferred]);
  const issues: SpecIssue[] = validation.issues;

  const set = (segments: PathSegment[], value: Json | undefined) => setDraft((d) => setAt(d, segments, value));
  const at = (segments: PathSegment[], deep = false) => issuesAt(issues, jsonPath(segments), deep);

  const lattice = asObject(getAt(draft, ['lattice']));
  const kind = (typeof lattice.kind === 'string' ? lattice.kind : 'chain') as LatticeKind;
  const dims = kind === 'custom' ? asArray(lattice.size).length || 1 : latticeDimension({ kind });
  const classes = useMemo(() => {
    try {
      return latticeClasses({ kind, custom: lattice.custom as never });
    } catch {
      return ['nn', 'nnn'];
    }
  }, [kind, lattice.custom]);

  const changeKind = (next: LatticeKind) => {
    const d = next === 'custom' ? dims : latticeDimension({ kind: next });
    const resize = <T extends Json>(arr: Json[], fill: T) => Array.from({ length: d }, (_, i) => arr[i] ?? fill);
    setDraft((old) => {
      let out = setAt(old, ['lattice', 'kind'], next);
      out = setAt(out, ['lattice', 'size'], resize(asArray(lattice.size), d === 1 ? 8 : 4));
      out = setAt(out, ['lattice', 'boundary'], resize(asArray(lattice.boundary), 'periodic'));
      if (Array.isArray(lattice.twist)) out = setAt(out, ['lattice', 'twist'], resize(asArray(lattice.twist), 0));
      return out;
    });
  };

  const compiled: CompiledModel | null = useMemo(() => {
    if (!validation.ok) return null;
    const cells = validation.spec.lattice.size.reduce((p, q) => p * q, 1);
    if (cells > PREVIEW_MAX_CELLS) return null;
    try {
      return compileModel(validation.spec);
    } catch {
      return null;
    }
  }, [validation]);

  const estimate: SizeEstimate | null = useMemo(() => {
    if (compiled) return estimateEdSize(compiled);
    if (!validation.ok) return null;
    const spec = validation.spec;
    const cellSites = spec.lattice.kind === 'custom' ? (spec.lattice.custom?.sites.length ?? 1) : CELL_SITES[spec.lattice.kind];
    const nSites = spec.lattice.size.reduce((p, q) => p * q, 1) * cellSites;
    const nParticles = spec.particles.count ?? Math.round((spec.particles.filling ?? 0) * nSites);
    const dimension = estimateHilbertDimension(nSites, nParticles);
    const bytes = 16 * dimension * 24 + 16 * dimension;
    return { nSites, nParticles, dimension, csrBytes: Number.POSITIVE_INFINITY, matrixFreeBytes: bytes, bytes, verdict: bytes > BROWSER_LIMIT_BYTES ? 'too-large' : 'heavy' };
  }, [compiled, validation]);

  const exportJson = () => {
    const name = typeof asObject(draft).name === 'string' ? (asObject(draft).name as string) : 'model';
    const blob = new Blob([`${JSON.stringify(draft, null, 2)}\n`], { type: 'application/json' });
    const a = document.createElement('a');
    a.href = URL.createObjectURL(blob);
    a.download = `${name.replace(/[^a-z0-9]+/gi, '-').replace(/^-|-$/g, '').toLowerCase() || 'model'}.json`;
    a.click();
    setTimeout(() => URL.revokeObjectURL(a.href), 1000);
  };

  const importText = (text: string) => {
    const parsed = parseModelText(text);
    if ('error' in parsed) {
      setImportError(parsed.error);
      return false;
    }
    setImportError(null);
    setDraft(parsed.draft);
    return true;
  };

  const particles = asObject(getAt(draft, ['particles']));
  const byCount = particles.count !== undefined;
  const parameters = asObject(getAt(draft, ['parameters']));
  const paramEntries = Object.entries(parameters);
  const terms = asArray(getAt(draft, ['terms']));

  const renameParameter = (oldName: string, newName: string) => {
    const next: JsonObject = {};
    for (const [k, v] of paramEntries) next[k === oldName ? newName : k] = v;
    set(['parameters'], next);
  };

  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_minmax(0,28rem)]">
      <form
        className="space-y-6"
        aria-label="Model"
        onSubmit={(e) => {
          e.preventDefault();
          if (!validation.ok) return;
          setSaving(true);
          void Promise.resolve(onSave(validation.spec)).finally(() => setSaving(false));
        }}
      >
        <div className="flex flex-wrap items-end gap-3">
          <TextField className="min-w-64 flex-1" label="Name" path="$.name" value={toInput(getAt(draft, ['name']))} onChange={(v) => set(['name'], v)} errors={at(['name'])} />
          <Button type="submit" disabled={!validation.ok || saving}>
            {saving ? 'Saving…' : saveLabel}
          </Button>
        </div>

        <div role="status" aria-live="polite" data-testid="validation-summary">
          {validation.ok ? (
            <p className="text-sm font-semibold text-good-700">The model is valid.</p>
          ) : (
            <Notice tone="error" title={`${issues.length} problem${issues.length === 1 ? '' : 's'} in the model`}>
              <ul className="list-disc pl-4">
                {issues.map((i) => (
                  <li key={`${i.path}:${i.message}`}>
                    <code className="text-xs">{i.path}</code> — {i.message}
                  </li>
                ))}
              </ul>
            </Notice>
          )}
        </div>

        <fieldset className="rounded-xl border border-line bg-surface p-4">
          <legend className="px-1 text-sm font-bold text-ink-900">Lattice</legend>
          <div className="grid gap-3 sm:grid-cols-3">
            <SelectField
              label="Kind"
              path="$.lattice.kind"
              value={kind}
              options={LATTICE_KINDS.map((k) => ({ value: k, label: k === 'custom' ? 'custom (edit as JSON)' : k }))}
              onChange={changeKind}
              errors={at(['lattice', 'kind'])}
            />
            {Array.from({ length: dims }, (_, a) => (
              <div key={a} className="contents">
                <TextField
                  label={dims > 1 ? `Cells along axis ${a + 1}` : 'Cells'}
                  path={jsonPath(['lattice', 'size', a])}
                  inputMode="numeric"
                  value={toInput(getAt(draft, ['lattice', 'size', a]))}
                  onChange={(v) => set(['lattice', 'size', a], fromInput(v))}
                  errors={at(['lattice', 'size', a])}
                />
                <SelectField
                  label={dims > 1 ? `Boundary ${a + 1}` : 'Boundary'}
                  path={jsonPath(['lattice', 'boundary', a])}
                  value={(getAt(draft, ['lattice', 'boundary', a]) as 'open' | 'periodic') ?? 'periodic'}
                  options={[
                    { value: 'periodic', label: 'periodic' },
                    { value: 'open', label: 'open' },
                  ]}
                  onChange={(v) => set(['lattice', 'boundary', a], v)}
                  errors={at(['lattice', 'boundary', a])}
                />
                <TextField
                  label={dims > 1 ? `Twist ${a + 1} (rad)` : 'Twist (rad)'}
                  path={jsonPath(['lattice', 'twist', a])}
                  value={toInput(getAt(draft, ['lattice', 'twist', a]) ?? 0)}
                  onChange={(v) => set(['lattice', 'twist', a], fromInput(v))}
                  errors={at(['lattice', 'twist', a])}
                  hint="number or expression, e.g. pi/2"
                />
              </div>
            ))}
          </div>
          <FieldErrors messages={[...at(['lattice']), ...at(['lattice', 'size']), ...at(['lattice', 'boundary']), ...at(['lattice', 'twist']), ...at(['lattice', 'custom'], true)]} />
        </fieldset>

        <fieldset className="rounded-xl border border-line bg-surface p-4">
          <legend className="px-1 text-sm font-bold text-ink-900">Particles (hardcore bosons)</legend>
          <div className="grid gap-3 sm:grid-cols-3">
            <SelectField
              label="Fix the"
              path="$.particles"
              value={byCount ? 'count' : 'filling'}
              options={[
                { value: 'filling', label: 'filling (per site)' },
                { value: 'count', label: 'particle count' },
              ]}
              onChange={(v) => set(['particles'], v === 'count' ? { kind: 'hardcore', count: 4 } : { kind: 'hardcore', filling: 0.5 })}
            />
            <TextField
              label={byCount ? 'Count' : 'Filling'}
              path={byCount ? '$.particles.count' : '$.particles.filling'}
              inputMode="decimal"
              value={toInput(byCount ? particles.count : particles.filling)}
              onChange={(v) => set(['particles', byCount ? 'count' : 'filling'], fromInput(v))}
              errors={at(['particles', byCount ? 'count' : 'filling'])}
            />
          </div>
          <FieldErrors messages={[...at(['particles']), ...at(['particles', 'kind'])]} />
        </fieldset>

        <fieldset className="rounded-xl border border-line bg-surface p-4">
          <legend className="px-1 text-sm font-bold text-ink-900">Parameters</legend>
          <div className="space-y-2">
            {paramEntries.map(([name, value], i) => (
              <div key={i} className="grid grid-cols-[8rem_minmax(0,1fr)_auto] items-start gap-2">
                <TextField label="Name" path={`$.parameters#${i}`} value={name} onChange={(v) => renameParameter(name, v)} />
                <TextField
                  label="Value"
                  path={jsonPath(['parameters', name])}
                  value={toInput(value)}
                  onChange={(v) => set(['parameters', name], fromInput(v))}
                  errors={at(['parameters', name])}
                />
                <Button variant="ghost" className="mt-5" aria-label={`Remove parameter ${name}`} onClick={() => set(['parameters', name], undefined)}>
                  Remove
                </Button>
              </div>
            ))}
          </div>
          <FieldErrors messages={at(['parameters'])} />
          <Button
            variant="secondary"
            className="mt-3"
            onClick={() => {
              let n = paramEntries.length + 1;
              while (`p${n}` in parameters) n++;
              set(['parameters', `p${n}`], 0);
            }}
          >
            Add parameter
          </Button>
        </fieldset>

        <fieldset className="space-y-3 rounded-xl border border-line bg-surface p-4">
          <legend className="px-1 text-sm font-bold text-ink-900">Terms</legend>
          {terms.map((raw, i) => {
            const t = asObject(raw);
            const tkind = (typeof t.kind === 'string' ? t.kind : 'hop') as (typeof TERM_KINDS)[number];
            const hopLike = tkind === 'hop' || tkind === 'conditional-hop';
            const p = (field: string) => ['terms', i, field] as PathSegment[];
            return (
              <div key={i} className="rounded-lg border-l-4 bg-paper/60 p-3" style={{ borderColor: termColor(i) }} data-term-card={i}>
                <div className="grid gap-2 sm:grid-cols-4">
                  <SelectField
                    label={`Term ${i + 1}`}
                    path={jsonPath(p('kind'))}
                    value={tkind}
                    options={TERM_KINDS.map((k) => ({ value: k, label: k }))}
                    onChange={(v) => {
                      const next: JsonObject = { kind: v, amplitude: t.amplitude ?? 1 };
                      if (v !== 'onsite') {
                        if (t.class !== undefined) next.class = t.class;
                        else next.neighbors = t.neighbors ?? 1;
                      }
                      if (v === 'conditional-hop') Object.assign(next, { via: 'common-neighbor', when: 'empty' });
                      if ((v === 'hop' || v === 'conditional-hop') && t.phase !== undefined) next.phase = t.phase;
                      set(['terms', i], next);
                    }}
                    errors={at(p('kind'))}
                  />
                  {tkind !== 'onsite' ? (
                    <>
                      <SelectField
                        label="Bond class"
                        path={jsonPath(p('class'))}
                        value={typeof t.class === 'string' ? t.class : ''}
                        options={[{ value: '', label: '— by shell —' }, ...classes.map((c) => ({ value: c, label: c }))]}
                        onChange={(v) => setDraft((d) => setAt(setAt(d, [...p('class')], v === '' ? undefined : v), [...p('neighbors')], v === '' ? (t.neighbors ?? 1) : undefined))}
                        errors={at(p('class'))}
                      />
                      {t.class === undefined ? (
                        <TextField label="Shell" path={jsonPath(p('neighbors'))} inputMode="numeric" value={toInput(t.neighbors)} onChange={(v) => set(p('neighbors'), fromInput(v))} errors={at(p('neighbors'))} />
                      ) : null}
                    </>
                  ) : null}
                  {tkind === 'conditional-hop' ? (
                    <>
                      <SelectField
                        label="Steps along"
                        path={jsonPath(p('legs'))}
                        value={typeof t.legs === 'string' ? t.legs : ''}
                        options={[{ value: '', label: 'any bonds' }, ...classes.map((c) => ({ value: c, label: c }))]}
                        onChange={(v) => set(p('legs'), v === '' ? undefined : v)}
                        errors={at(p('legs'))}
                      />
                      <SelectField
                        label="Allowed when the middle site is"
                        path={jsonPath(p('when'))}
                        value={(t.when as 'empty' | 'occupied') ?? 'empty'}
                        options={[
                          { value: 'empty', label: 'empty' },
                          { value: 'occupied', label: 'occupied' },
                        ]}
                        onChange={(v) => set(p('when'), v)}
                        errors={[...at(p('when')), ...at(p('via'))]}
                      />
                    </>
                  ) : null}
                </div>
                <div className="mt-2 grid gap-2 sm:grid-cols-[minmax(0,1fr)_minmax(0,1fr)_auto]">
                  <TextField label="Amplitude" path={jsonPath(p('amplitude'))} value={toInput(t.amplitude)} onChange={(v) => set(p('amplitude'), fromInput(v))} errors={at(p('amplitude'))} />
                  {hopLike ? (
                    <TextField
                      label="Phase (rad)"
                      path={jsonPath(p('phase'))}
                      value={toInput(t.phase)}
                      placeholder="0"
                      onChange={(v) => set(p('phase'), v.trim() === '' ? undefined : fromInput(v))}
                      errors={at(p('phase'))}
                      hint="may use turn, dx, dy"
                    />
                  ) : (
                    <span />
                  )}
                  <Button variant="ghost" className="mt-5" aria-label={`Remove term ${i + 1}`} onClick={() => set(['terms'], terms.filter((_, j) => j !== i))}>
                    Remove
                  </Button>
                </div>
                <FieldErrors messages={[...at(['terms', i]), ...issuesAt(issues, jsonPath(['terms', i]), true).filter((m) => !['kind', 'class', 'neighbors', 'legs', 'when', 'via', 'amplitude', 'phase'].some((f) => at(p(f)).includes(m)) && !at(['terms', i]).includes(m))]} />
              </div>
            );
          })}
          <FieldErrors messages={at(['terms'])} />
          <Button variant="secondary" onClick={() => set(['terms'], [...terms, { kind: 'hop', neighbors: 1, amplitude: '-J' }])}>
            Add term
          </Button>
        </fieldset>
      </form>

      <aside className="space-y-4" aria-label="Cluster and size">
        <section className="space-y-2">
          <h2 className="text-sm font-bold text-ink-900">Cluster</h2>
          {compiled ? (
            <>
              <LatticePreview model={compiled} title={`${compiled.nSites} sites, ${compiled.nParticles} particles`} />
              <ul className="flex flex-wrap gap-x-4 gap-y-1 text-xs text-ink-700" aria-label="Term colours">
                {compiled.spec.terms.map((t, i) => (
                  <li key={i} className="flex items-center gap-1.5">
                    <span aria-hidden="true" className="inline-block h-1 w-5 rounded" style={{ background: termColor(i) }} />
                    {i + 1}. {t.kind}
                    {t.class ? ` (${t.class})` : t.neighbors ? ` (shell ${t.neighbors})` : ''}
                  </li>
                ))}
              </ul>
              <p className="text-xs text-ink-600">Arrows: the direction in which a hop's phase is positive (Im t &gt; 0). Dashed stubs cross a periodic boundary; dotted lines are interactions.</p>
            </>
          ) : (
            <p className="rounded-lg bg-surface p-4 text-sm text-ink-600 ring-1 ring-line">
              {validation.ok ? 'Too many cells to draw here.' : 'The drawing appears when the model is valid.'}
            </p>
          )}
        </section>

        {estimate ? <SizePanel estimate={estimate} /> : null}

        <section className="space-y-2 rounded-xl border border-line bg-surface p-4">
          <h2 className="text-sm font-bold text-ink-900">Import, export, examples</h2>
          <div className="flex flex-wrap gap-2">
            <Button variant="secondary" onClick={exportJson}>
              Export JSON
            </Button>
            <Button variant="secondary" onClick={() => fileInput.current?.click()}>
              Import JSON file
            </Button>
            <input
              ref={fileInput}
              type="file"
              accept="application/json,.json"
              className="hidden"
              data-testid="import-file"
              onChange={(e) => {
                const file = e.target.files?.[0];
                if (file) void file.text().then(importText);
                e.target.value = '';
              }}
            />
            <Button variant="secondary" onClick={() => setJsonText(jsonText === null ? JSON.stringify(draft, null, 2) : null)}>
              {jsonText === null ? 'Edit as JSON' : 'Close JSON'}
            </Button>
          </div>
          <label className="block text-xs font-semibold text-ink-700">
            Start from an example
            <select
              className="mt-1 block w-full rounded-md border border-line bg-surface px-2 py-1.5 text-sm"
              value=""
              onChange={(e) => {
                const ex = EXAMPLE_MODELS.find((m) => m.file === e.target.value);
                if (ex) setDraft(structuredClone(ex.spec) as Json);
              }}
            >
              <option value="">Choose…</option>
              {EXAMPLE_MODELS.map((m) => (
                <option key={m.file} value={m.file}>
                  {exampleName(m)}
                </option>
              ))}
            </select>
          </label>
          {jsonText !== null ? (
            <div className="space-y-2">
              <textarea
                aria-label="Model JSON"
                className="h-72 w-full rounded-md border border-line bg-paper p-2 font-mono text-xs"
                value={jsonText}
                spellCheck={false}
                onChange={(e) => setJsonText(e.target.value)}
              />
              <Button onClick={() => importText(jsonText) && setJsonText(null)}>Apply JSON</Button>
            </div>
          ) : null}
          {importError ? (
            <p role="alert" className="text-sm text-red-800">
              {importError}
            </p>
          ) : null}
        </section>
      </aside>
    </div>
  );
}

function SizePanel({ estimate }: { estimate: SizeEstimate }) {
  const tone = estimate.verdict === 'too-large' ? 'border-red-400 bg-red-50' : estimate.verdict === 'heavy' ? 'border-amber-400 bg-amber-50' : 'border-line bg-surface';
  return (
    <section className={`rounded-xl border p-4 text-sm ${tone}`} data-testid="size-estimate" data-verdict={estimate.verdict}>
      <h2 className="text-sm font-bold text-ink-900">Exact diagonalization size</h2>
      <dl className="mt-2 grid grid-cols-2 gap-x-3 gap-y-1">
        <dt className="text-ink-600">Sites, particles</dt>
        <dd className="font-semibold">
          {estimate.nSites}, {estimate.nParticles}
        </dd>
        <dt className="text-ink-600">Hilbert dimension</dt>
        <dd className="font-semibold" data-testid="hilbert-dimension">
          {formatCount(estimate.dimension)}
        </dd>
        <dt className="text-ink-600">Memory per worker</dt>
        <dd className="font-semibold">
          {formatBytes(estimate.bytes)}
          {Number.isFinite(estimate.csrBytes) && estimate.csrBytes !== estimate.bytes ? ` (${formatBytes(estimate.csrBytes)} with a stored matrix)` : ''}
        </dd>
      </dl>
      {estimate.verdict === 'too-large' ? (
        <p className="mt-2 font-semibold text-red-900" role="alert">
          Too large for a browser: ED needs more than {formatBytes(BROWSER_LIMIT_BYTES)} per worker here. Use a smaller cluster, mean-field, or the command line on a workstation.
        </p>
      ) : estimate.verdict === 'heavy' ? (
        <p className="mt-2 text-amber-950">Heavy for a browser: each sweep worker holds its own copy. Fewer workers or a smaller cluster are safer.</p>
      ) : null}
    </section>
  );
}
