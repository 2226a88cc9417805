/**
 * Errors of physics-core. Every error says what is wrong and where: `path` is a JSON path into
 * the input (e.g. `$.terms[2].amplitude`) when the input is a document.
 */
export class PhasewrightError extends Error {
  constructor(
    message: string,
    /** Machine-readable kind, e.g. `spec`, `size`, `convergence`. */
    readonly code: string,
    /** JSON path of the offending input, when there is one. */
    readonly path?: string,
    readonly details?: Record<string, unknown>,
    /** Whether `message` already names the path (then it is not prefixed again). */
    pathInMessage = false,
  ) {
    super(path && !pathInMessage ? `${path}: ${message}` : message);
    this.name = 'PhasewrightError';
  }
}

/** An invalid model, sweep or map document. `issues` lists every problem found, each with its path. */
export class SpecError extends PhasewrightError {
  constructor(readonly issues: { path: string; message: string }[]) {
    super(
      issues.map((i) => `${i.path}: ${i.message}`).join('; '),
      'spec',
      issues[0]?.path,
      { issues },
      true,
    );
    this.name = 'SpecError';
  }
}

/** A problem too large for the configured memory budget; `details` carries the estimate. */
export class SizeError extends PhasewrightError {
  constructor(message: string, path: string | undefined, details: Record<string, unknown>) {
    super(message, 'size', path, details);
    this.name = 'SizeError';
  }
}
