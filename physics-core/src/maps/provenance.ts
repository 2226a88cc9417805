/**
 * Hashes that identify models, maps and points. SHA-256 from @noble/hashes: synchronous and the
 * same in the browser, in workers, in Node and on the server.
 */
import { sha256 } from '@noble/hashes/sha2.js';
import { bytesToHex, utf8ToBytes } from '@noble/hashes/utils.js';
import type { ModelSpec } from '../model/types.js';
import { canonicalJson } from './canonical-json.js';
import type { SweepSpec } from '../sweep/spec.js';

/** SHA-256 of a UTF-8 string, lower-case hex. */
export function sha256Hex(text: string): string {
  return bytesToHex(sha256(utf8ToBytes(text)));
}

/** SHA-256 of the canonical JSON of `value` (see canonical-json.ts). */
export function canonicalHash(value: unknown): string {
  return sha256Hex(canonicalJson(value));
}

/**
 * Identity of a model spec: SHA-256 of its canonical JSON. Two specs that differ only in key
 * order or number spelling (1 vs 1.0) hash alike; any change of meaning changes the hash.
 * The solve dispatcher fills `Result.provenance.modelHash` with it.
 */
export function hashModel(spec: ModelSpec): string {
  return canonicalHash(spec);
}

/** The document whose hash is a map's identity (exported so that a reader can recompute it). */
export function mapIdentityDocument(sweep: SweepSpec, coreVersion: string): unknown {
  return {
    identity: 'phasewright.map-identity/1',
    model: sweep.model,
    sweep: {
      axes: sweep.axes,
      method: sweep.method,
      observables: sweep.observables ?? null,
      seed: sweep.seed ?? 0,
    },
    solver: sweep.solver ?? {},
    coreVersion,
  };
}

/**
 * Identity of a map: SHA-256 of the canonical JSON of {model, sweep (axes, method, observables,
 * seed), solver options, core version} (pass `CORE_VERSION`). The sweep's `name` and its `refine` block are left out:
 * refinement only adds points to the same map, and a name is not physics.
 */
export function mapIdentity(sweep: SweepSpec, coreVersion: string): string {
  return canonicalHash(mapIdentityDocument(sweep, coreVersion));
}

/**
 * The random seed of one point, derived from the sweep's seed and the point's key, so that a
 * point's result does not depend on which chunk, worker or order computed it. Unsigned 32-bit.
 */
export function pointSeed(seed: number, key: string): number {
  const digest = sha256(utf8ToBytes(`${seed}|${key}`));
  return ((digest[0] << 24) | (digest[1] << 16) | (digest[2] << 8) | digest[3]) >>> 0;
}
