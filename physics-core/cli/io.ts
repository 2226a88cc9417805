/** File helpers of the CLI: JSON input with one-line errors, atomic output. */
import { readFileSync, renameSync, writeFileSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { PhasewrightError, SpecError } from '../src/errors.js';
import type { RuntimeInfo } from '../src/maps/map-format.js';

/** Reads and parses a JSON file; a missing file or a syntax error becomes a one-line PhasewrightError. */
export function readJsonFile(path: string): unknown {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    throw new PhasewrightError(code === 'ENOENT' ? `${path}: no such file` : `${path}: cannot read (${code ?? String(error)})`, 'io');
  }
  try {
    return JSON.parse(text);
  } catch (error) {
    throw new PhasewrightError(`${path}: not valid JSON (${(error as Error).message})`, 'io');
  }
}

/** Writes a file atomically: a temporary file beside it, then a rename (a killed run never leaves half a map). */
export function writeFileAtomic(path: string, text: string): void {
  const tmp = `${path}.${process.pid}.tmp`;
  writeFileSync(tmp, text);
  renameSync(tmp, path);
}

export function nodeRuntime(): RuntimeInfo {
  return { kind: 'node', version: process.version, cores: availableParallelism() };
}

/** Prefixes errors from a document with its file name (a SpecError lists each problem with its JSON path). */
export function inFile<T>(path: string, read: () => T): T {
  try {
    return read();
  } catch (error) {
    if (error instanceof SpecError) throw new PhasewrightError(`${path}: ${error.issues.map((i) => `${i.path}: ${i.message}`).join('; ')}`, error.code);
    if (error instanceof PhasewrightError && !error.message.startsWith(`${path}:`)) throw new PhasewrightError(`${path}: ${error.message}`, error.code);
    throw error;
  }
}
