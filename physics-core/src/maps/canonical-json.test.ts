import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { CanonicalJsonError, canonicalJson } from './canonical-json.js';

describe('canonicalJson', () => {
  it('sorts keys at every depth and drops undefined members', () => {
    expect(canonicalJson({ b: 1, a: { d: [1, { z: 0, y: null }], c: 'x' }, u: undefined })).toBe(
      '{"a":{"c":"x","d":[1,{"y":null,"z":0}]},"b":1}',
    );
  });

  it('writes numbers in shortest round-trip form and −0 as 0', () => {
    expect(canonicalJson([1.0, -0, 0.1 + 0.2, 1e21, 5e-324, 123456789012345680000])).toBe(
      '[1,0,0.30000000000000004,1e+21,5e-324,123456789012345680000]',
    );
  });

  it('refuses NaN, Infinity and undefined array items with the JSON path', () => {
    expect(() => canonicalJson({ a: [1, { 'b c': NaN }] })).toThrow(CanonicalJsonError);
    expect(() => canonicalJson({ a: [1, { 'b c': NaN }] })).toThrow('$.a[1]["b c"]: NaN is not a JSON number');
    expect(() => canonicalJson({ x: { y: Infinity } })).toThrow('$.x.y: Infinity');
    expect(() => canonicalJson([undefined])).toThrow('$[0]: undefined inside an array');
  });

  it('writes typed arrays as arrays', () => {
    expect(canonicalJson({ v: new Float64Array([0.5, -0]) })).toBe('{"v":[0.5,0]}');
  });

  it('is a fixed point of JSON.parse and independent of key insertion order (property)', () => {
    fc.assert(
      fc.property(fc.jsonValue(), (value) => {
        const text = canonicalJson(value);
        const again = canonicalJson(JSON.parse(text));
        expect(again).toBe(text);
        // Reversing key insertion order everywhere does not change the text.
        const reverse = (x: unknown): unknown =>
          Array.isArray(x) ? x.map(reverse)
            : x && typeof x === 'object' ? Object.fromEntries(Object.entries(x).reverse().map(([k, v]) => [k, reverse(v)]))
              : x;
        expect(canonicalJson(reverse(value))).toBe(text);
      }),
    );
  });
});
