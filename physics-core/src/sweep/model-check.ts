/**
 * The model inside a sweep is checked by the model validator; its issues are re-rooted at the
 * sweep's `$.model` so that the user sees where in the sweep file the problem is.
 */
import type { ModelSpec } from '../model/types.js';
import { MODEL_SPEC_ID } from '../model/types.js';

type Issues = { path: string; message: string }[];

export function checkModelSpec(raw: unknown, path: string, issues: Issues): ModelSpec | undefined {
  if (typeof raw !== 'object' || raw === null || Array.isArray(raw)) {
    issues.push({ path, message: 'must be a model spec object ("spec": "phasewright.model/1")' });
    return undefined;
  }
  const m = raw as Record<string, unknown>;
  if (m.spec !== MODEL_SPEC_ID) {
    issues.push({ path: `${path}.spec`, message: `must be "${MODEL_SPEC_ID}"` });
    return undefined;
  }
  if (typeof m.parameters !== 'object' || m.parameters === null || Array.isArray(m.parameters)) {
    issues.push({ path: `${path}.parameters`, message: 'must be an object of named parameters' });
    return undefined;
  }
  return structuredClone(raw) as ModelSpec;
}
