/**
 * Checks of push input that are not the map format (physics-core's parseMap checks that): the
 * batch envelope, the shape of human-edited records, and that every point lies on its sweep.
 */
import { BadRequestException, PayloadTooLargeException } from '@nestjs/common';
import { pointKey, type PhaseMap, SpecError } from '@phasewright/physics-core';

export const CHANGE_KINDS = ['model', 'sweep', 'map', 'points', 'annotation', 'note'] as const;
export type ChangeKind = (typeof CHANGE_KINDS)[number];
export type RecordKind = Exclude<ChangeKind, 'map' | 'points'>;

export interface ChangeInput {
  kind: ChangeKind;
  id: string;
  baseRevision?: number;
  data: Record<string, unknown>;
}

export interface PushInput {
  batchId: string;
  changes: ChangeInput[];
}

export interface InputIssue {
  path: string;
  message: string;
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const isRecord = (x: unknown): x is Record<string, unknown> => typeof x === 'object' && x !== null && !Array.isArray(x);

/** 400 listing every issue (JSON paths into the request body). */
export function inputError(issues: InputIssue[], what = 'The push was refused; nothing was stored'): BadRequestException {
  const first = issues[0];
  const more = issues.length > 1 ? ` (and ${issues.length - 1} more problem${issues.length > 2 ? 's' : ''})` : '';
  return new BadRequestException({ message: `${what}: ${first ? `${first.path}: ${first.message}` : 'invalid input'}${more}`, details: issues });
}

/** Issues of a physics-core SpecError, re-rooted at `prefix` (e.g. `changes[2].data`). */
export function specIssues(error: SpecError, prefix: string): InputIssue[] {
  return error.issues.map((i) => ({ path: i.path.replace(/^\$/, prefix), message: i.message }));
}

/** The batch envelope: {batchId: uuid, changes: [{kind, id: uuid, baseRevision?, data: {}}]}. */
export function checkEnvelope(body: unknown, maxChanges: number): PushInput {
  if (!isRecord(body)) throw inputError([{ path: '$', message: 'the body must be a JSON object {batchId, changes}' }]);
  const issues: InputIssue[] = [];
  for (const key of Object.keys(body)) if (key !== 'batchId' && key !== 'changes') issues.push({ path: key, message: `unknown field "${key}" (allowed: batchId, changes)` });
  if (typeof body.batchId !== 'string' || !UUID.test(body.batchId)) issues.push({ path: 'batchId', message: 'must be a UUID made by the client (the same for every retry of this batch)' });
  if (!Array.isArray(body.changes) || body.changes.length === 0) {
    issues.push({ path: 'changes', message: 'must be a non-empty array of changes' });
  } else if (body.changes.length > maxChanges) {
    throw new PayloadTooLargeException({
      message: `This batch carries ${body.changes.length} changes; the limit is ${maxChanges} per batch (PW_SYNC_MAX_CHANGES_PER_BATCH): push them in several batches`,
      details: { changes: body.changes.length, limit: maxChanges },
    });
  } else {
    body.changes.forEach((c: unknown, i: number) => {
      const path = `changes[${i}]`;
      if (!isRecord(c)) {
        issues.push({ path, message: 'must be an object {kind, id, baseRevision?, data}' });
        return;
      }
      for (const key of Object.keys(c)) if (!['kind', 'id', 'baseRevision', 'data'].includes(key)) issues.push({ path: `${path}.${key}`, message: `unknown field "${key}"` });
      if (!(CHANGE_KINDS as readonly unknown[]).includes(c.kind)) issues.push({ path: `${path}.kind`, message: `must be one of ${CHANGE_KINDS.join(', ')} (got ${JSON.stringify(c.kind)})` });
      if (typeof c.id !== 'string' || !UUID.test(c.id)) issues.push({ path: `${path}.id`, message: 'must be a UUID made by the client' });
      if (c.baseRevision !== undefined && !(Number.isInteger(c.baseRevision) && (c.baseRevision as number) >= 0)) issues.push({ path: `${path}.baseRevision`, message: 'must be an integer ≥ 0 (the revision your edit started from)' });
      if (!isRecord(c.data)) issues.push({ path: `${path}.data`, message: 'must be an object' });
    });
  }
  if (issues.length > 0) throw inputError(issues);
  const changes = (body.changes as Record<string, unknown>[]).map((c) => ({ ...(c as unknown as ChangeInput), id: (c.id as string).toLowerCase() }));
  return { batchId: (body.batchId as string).toLowerCase(), changes };
}

/** Points a change carries (maps and points changes: `data.points`). */
export function pointsIn(change: ChangeInput): number {
  if (change.kind !== 'map' && change.kind !== 'points') return 0;
  const p = change.data.points;
  return isRecord(p) ? Object.keys(p).length : 0;
}

const COLOUR = /^#[0-9a-f]{6}$/i;

/** Shape of annotations and notes (models and sweeps are checked by physics-core). */
export function checkHumanRecord(kind: 'annotation' | 'note', data: Record<string, unknown>, path: string): InputIssue[] {
  const issues: InputIssue[] = [];
  const str = (field: string, max: number, required: boolean) => {
    const v = data[field];
    if (v === undefined && !required) return;
    if (typeof v !== 'string' || v.length > max || (required && v.length === 0)) issues.push({ path: `${path}.${field}`, message: `must be a${required ? ' non-empty' : ''} string of at most ${max} characters` });
  };
  if (kind === 'annotation') {
    str('mapId', 36, true);
    str('labelId', 64, true);
    str('name', 120, false);
    str('note', 20_000, false);
    if (data.color !== undefined && (typeof data.color !== 'string' || !COLOUR.test(data.color))) issues.push({ path: `${path}.color`, message: 'must be a colour like "#1d4ed8"' });
  } else {
    str('text', 100_000, true);
    str('mapId', 36, false);
    str('pointKey', 255, false);
  }
  return issues;
}

/** Lower and upper end of an axis. */
function axisRange(axis: PhaseMap['sweep']['axes'][number]): [number, number] {
  const values = axis.kind === 'list' ? axis.values : [axis.from, axis.to];
  return [Math.min(...values), Math.max(...values)];
}

/**
 * Every point must sit on the sweep: its parameters are exactly the swept ones, its key is
 * physics-core's `pointKey` of them, and each value lies within its axis (refinement adds points
 * between grid points, never outside).
 */
export function checkPointsOnSweep(map: PhaseMap, path: string): InputIssue[] {
  const issues: InputIssue[] = [];
  const axes = map.sweep.axes;
  const names = axes.map((a) => a.parameter).sort();
  const wanted = names.join(',');
  // Per axis, once: its parameter, ends and slack.
  const bounds = axes.map((axis) => {
    const [lo, hi] = axisRange(axis);
    return { name: axis.parameter, lo, hi, slack: 1e-9 * Math.max(1, Math.abs(lo), Math.abs(hi)) };
  });
  for (const key in map.points) {
    if (!Object.prototype.hasOwnProperty.call(map.points, key)) continue;
    const point = map.points[key];
    const at = () => `${path}.points[${JSON.stringify(key)}]`;
    const got = Object.keys(point.parameters).sort();
    if (got.join(',') !== wanted) {
      issues.push({ path: `${at()}.parameters`, message: `has parameters {${got.join(', ')}} but the sweep sweeps {${names.join(', ')}}` });
      continue;
    }
    const expected = pointKey(point.parameters);
    if (expected !== key) issues.push({ path: at(), message: `the key does not match the point's parameters (expected "${expected}")` });
    for (let a = 0; a < bounds.length; a++) {
      const { name, lo, hi, slack } = bounds[a];
      const v = point.parameters[name];
      if (v < lo - slack || v > hi + slack) {
        issues.push({ path: `${at()}.parameters.${name}`, message: `${name} = ${v} lies outside the sweep (axis ${a}: ${lo} … ${hi})` });
      }
    }
    if (issues.length >= 20) break;
  }
  return issues;
}
