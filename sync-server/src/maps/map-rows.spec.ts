import { createHash } from 'node:crypto';
import { pointsDigest, sha256 } from './map-rows.js';

describe('map row hashes', () => {
  it('sha256 is SHA-256 of the UTF-8 bytes, hex', () => {
    // FIPS 180-2, Appendix B.1 ("abc"), the standard's own example (digest from memory).
    expect(sha256('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
    const text = '{"label":"ü \\u2028 😀","x":1}';
    expect(sha256(text)).toBe(createHash('sha256').update(Buffer.from(text, 'utf8')).digest('hex'));
  });

  it('pointsDigest hashes the lines "key<TAB>hash\\n" sorted by key (reference: node:crypto, line by line)', () => {
    const entries: [string, string][] = [['V=2', sha256('b')], ['V=10', sha256('a')], ['J=ü', sha256('c')]];
    const h = createHash('sha256');
    for (const [k, v] of [...entries].sort(([a], [b]) => (a < b ? -1 : 1))) h.update(Buffer.from(`${k}\t${v}\n`, 'utf8'));
    expect(pointsDigest(entries)).toBe(h.digest('hex'));
    // Order of the input does not matter; the empty set is the SHA-256 of no bytes (from memory).
    expect(pointsDigest([...entries].reverse())).toBe(pointsDigest(entries));
    expect(pointsDigest([])).toBe('e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855');
  });
});
