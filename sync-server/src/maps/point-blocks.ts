/**
 * Map points are stored in blocks (table `map_point_blocks`, migration 0013): one row per block of
 * up to POINTS_PER_BLOCK points of one map. A row holds the points' keys with the SHA-256 of their
 * canonical JSON (`point_keys`, a JSON array of [key, hash]) and, in the same order, the canonical
 * texts joined by "\n", deflated (raw deflate, level 1: `data`). A point stays in the block it was
 * first written to; new points fill the map's last block, then new ones.
 */
import { promisify } from 'node:util';
import { deflateRaw, deflateRawSync, inflateRaw, inflateRawSync } from 'node:zlib';

const deflateRawAsync = promisify(deflateRaw);
const inflateRawAsync = promisify(inflateRaw);
/** Block compression: raw deflate at level 1, the fastest that compresses. */
const DEFLATE = { level: 1 };

/** Points per block: a 10,000-point map is 40 rows; rewriting a block for one changed point costs ~0.3 MB. */
export const POINTS_PER_BLOCK = 250;

/** One stored point: key, hash of its canonical text, and (when loaded) the text itself. */
export interface BlockEntry {
  key: string;
  hash: string;
  text?: string;
}

export interface PointBlock {
  blockNo: number;
  entries: BlockEntry[];
}

/** A block's row values from its entries (every entry must carry its text). */
export function encodeBlock(entries: BlockEntry[]): { keys: string; data: Buffer } {
  const { keys, text } = blockText(entries);
  return { keys, data: deflateRawSync(text, DEFLATE) };
}

/**
 * `encodeBlock` with the compression on libuv's thread pool: the same bytes, but blocks encoded
 * together (Promise.all) compress in parallel, off the event loop.
 */
export async function encodeBlockAsync(entries: BlockEntry[]): Promise<{ keys: string; data: Buffer }> {
  const { keys, text } = blockText(entries);
  return { keys, data: await deflateRawAsync(text, DEFLATE) };
}

function blockText(entries: BlockEntry[]): { keys: string; text: string } {
  const texts = entries.map((e) => {
    if (e.text === undefined) throw new Error(`point ${e.key}: text not loaded`);
    // Canonical JSON escapes control characters, so a raw newline would be a bug upstream.
    if (e.text.includes('\n')) throw new Error(`point ${e.key}: canonical text contains a newline`);
    return e.text;
  });
  return { keys: JSON.stringify(entries.map((e) => [e.key, e.hash])), text: texts.join('\n') };
}

/** Entries of a block row; `data` absent → keys and hashes only. */
export function decodeBlock(blockNo: number, keys: string, data?: Uint8Array): PointBlock {
  return blockOf(blockNo, keys, data === undefined ? undefined : inflateRawSync(data));
}

/** `decodeBlock` of a row with its data, inflated on the thread pool (blocks decoded together inflate in parallel). */
export async function decodeBlockAsync(blockNo: number, keys: string, data: Uint8Array): Promise<PointBlock> {
  return blockOf(blockNo, keys, await inflateRawAsync(data));
}

/**
 * Sets the texts of a block's entries (keys and hashes already read) from its row's `data`,
 * inflated on the thread pool.
 */
export async function fillTexts(block: PointBlock, data: Uint8Array): Promise<void> {
  const texts = (await inflateRawAsync(data)).toString('utf8').split('\n');
  if (texts.length !== block.entries.length) throw new Error(`block ${block.blockNo}: ${block.entries.length} keys but ${texts.length} texts`);
  block.entries.forEach((e, i) => (e.text = texts[i]));
}

function blockOf(blockNo: number, keys: string, inflated: Buffer | undefined): PointBlock {
  const pairs = JSON.parse(keys) as [string, string][];
  const texts = inflated === undefined ? undefined : inflated.toString('utf8').split('\n');
  if (texts && texts.length !== pairs.length) throw new Error(`block ${blockNo}: ${pairs.length} keys but ${texts.length} texts`);
  return { blockNo, entries: pairs.map(([key, hash], i) => (texts ? { key, hash, text: texts[i] } : { key, hash })) };
}

/** Where each stored key is: its block number and index in that block. */
export type PointPlaces = Map<string, { blockNo: number; index: number }>;

export function placesOf(blocks: Iterable<PointBlock>): PointPlaces {
  const where: PointPlaces = new Map();
  for (const b of blocks) b.entries.forEach((e, index) => where.set(e.key, { blockNo: b.blockNo, index }));
  return where;
}

/**
 * Places changed points into a map's blocks: a key already stored is replaced where it is; new
 * keys fill the last block, then new blocks. `blocks` holds every block of the map by number, with
 * the texts loaded at least for the blocks that hold changed keys and for the last block when new
 * keys come; `where` is updated. Returns the numbers of the blocks to write, ascending.
 */
export function placePoints(blocks: Map<number, PointBlock>, where: PointPlaces, changed: BlockEntry[]): number[] {
  const touched = new Set<number>();
  let last = blocks.size === 0 ? undefined : blocks.get(Math.max(...blocks.keys()));
  for (const entry of changed) {
    const at = where.get(entry.key);
    if (at !== undefined) {
      (blocks.get(at.blockNo) as PointBlock).entries[at.index] = entry;
      touched.add(at.blockNo);
      continue;
    }
    if (!last || last.entries.length >= POINTS_PER_BLOCK) {
      last = { blockNo: last ? last.blockNo + 1 : 0, entries: [] };
      blocks.set(last.blockNo, last);
    }
    where.set(entry.key, { blockNo: last.blockNo, index: last.entries.length });
    last.entries.push(entry);
    touched.add(last.blockNo);
  }
  return [...touched].sort((a, b) => a - b);
}
