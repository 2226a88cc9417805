/**
 * The model inside a sweep is checked by the model validator (`parseModelSpec`); its issues are
 * re-rooted at the sweep's `$.model` so that the user sees where in the sweep file the problem is.
 */
import { SpecError } from '../errors.js';
import type { ModelSpec } from '../model/types.js';
import { parseModelSpec } from '../model/validate.js';

type Issues = { path: string; message: string }[];

export function checkModelSpec(raw: unknown, path: string, issues: Issues): ModelSpec | undefined {
  try {
    return parseModelSpec(raw);
  } catch (error) {
    if (!(error instanceof SpecError)) throw error;
    for (const issue of error.issues) issues.push({ path: issue.path.replace(/^\$/, path), message: issue.message });
    return undefined;
  }
}
