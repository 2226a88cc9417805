import { inflateRawSync } from 'node:zlib';
import { decodeBlock, decodeBlockAsync, encodeBlock, encodeBlockAsync, fillTexts, type BlockEntry } from './point-blocks.js';

// Texts shaped like canonical point texts (no raw newlines), with non-ASCII and escapes.
const entries: BlockEntry[] = Array.from({ length: 250 }, (_, i) => {
  const text = `{"energy":${-1 - i / 7},"label":{"id":"phase ü ${i}","note":"a\\nb \\"q\\""},"parameters":{"V":${i / 10}}}`;
  return { key: `V=${i / 10}`, hash: i.toString(16).padStart(64, '0'), text };
});

describe('point blocks', () => {
  it('compress on the thread pool to the same bytes as the synchronous encoder, and decode back (both ways)', async () => {
    const sync = encodeBlock(entries);
    const async = await encodeBlockAsync(entries);
    expect(async.keys).toBe(sync.keys);
    expect(Buffer.compare(async.data, sync.data)).toBe(0);
    // Raw deflate (zlib's own inflate, not our decoder): the texts joined by newlines.
    expect(inflateRawSync(async.data).toString('utf8')).toBe(entries.map((e) => e.text).join('\n'));
    expect((await decodeBlockAsync(3, async.keys, async.data)).entries).toEqual(entries);
    expect(decodeBlock(3, sync.keys, sync.data).entries).toEqual(entries);
    expect(decodeBlock(3, sync.keys).entries).toEqual(entries.map(({ key, hash }) => ({ key, hash })));
  });

  it('refuses a block whose texts do not match its keys, and texts with raw newlines', async () => {
    const { keys, data } = encodeBlock(entries.slice(0, 3));
    await expect(decodeBlockAsync(7, JSON.stringify([['a', 'b']]), data)).rejects.toThrow('block 7: 1 keys but 3 texts');
    expect(() => decodeBlock(7, keys, encodeBlock(entries.slice(0, 2)).data)).toThrow('block 7: 3 keys but 2 texts');
    await expect(encodeBlockAsync([{ key: 'k', hash: 'h', text: 'a\nb' }])).rejects.toThrow('point k: canonical text contains a newline');
  });
});

describe('fillTexts', () => {
  it('sets the texts of a directory block from its row data, and refuses a row of another length', async () => {
    const { keys, data } = encodeBlock(entries.slice(0, 5));
    const block = decodeBlock(2, keys);
    await fillTexts(block, data);
    expect(block.entries).toEqual(entries.slice(0, 5));
    await expect(fillTexts(decodeBlock(2, keys), encodeBlock(entries.slice(0, 4)).data)).rejects.toThrow('block 2: 5 keys but 4 texts');
  });
});
