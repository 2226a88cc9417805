import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { CanonicalJsonError, canonicalJson, canonicallyEqual } from './canonical-json.js';

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

  // A plain reference writer (the definition in the module comment, without any shortcut), to check
  // that the fast paths (JSON.stringify on a key-sorted copy, the string builder) write the same text.
  const reference = (x: unknown): string => {
    if (x === null) return 'null';
    if (typeof x === 'number') return Object.is(x, -0) ? '0' : String(x);
    if (typeof x === 'string' || typeof x === 'boolean') return JSON.stringify(x);
    if (ArrayBuffer.isView(x) && !(x instanceof DataView)) return `[${Array.from(x as unknown as ArrayLike<number>, reference).join(',')}]`;
    if (Array.isArray(x)) return `[${x.map(reference).join(',')}]`;
    const r = x as Record<string, unknown>;
    return `{${Object.keys(r).filter((k) => r[k] !== undefined).sort().map((k) => `${JSON.stringify(k)}:${reference(r[k])}`).join(',')}}`;
  };

  it('writes the same text as a plain reference writer on awkward shapes', () => {
    let deep: unknown = 1;
    for (let i = 0; i < 300; i++) deep = i % 2 ? [deep] : { [`k${i}`]: deep, a: -0 };
    const cases: unknown[] = [
      { 10: 'a', 2: 'b', x: 1, $: 2, '': 3 }, // array-index keys enumerate out of code-unit order
      { b: { 10: 1, 9: 2 }, a: 1 },
      { a: new Float32Array([0.1, -0]), b: [new Int8Array([1, -2])] },
      { when: new Date(0), m: new Map([[1, 2]]) }, // no own enumerable keys: {} (toJSON is not used)
      { z: undefined, y: [{ x: undefined, w: 1 }] },
      deep,
      { toJSON: 'not a function', b: 1 },
      JSON.parse('{"b":[1],"__proto__":{"x":1},"a":0}') as unknown,
      Object.assign(JSON.parse('{"__proto__":0}') as object, { '': new Int32Array(0) }),
    ];
    for (const c of cases) expect(canonicalJson(c)).toBe(reference(c));
    fc.assert(
      fc.property(fc.object({ values: [fc.double({ noNaN: true, noDefaultInfinity: true }), fc.string(), fc.boolean(), fc.constant(null)], withTypedArray: true, withNullPrototype: true }), (value) => {
        expect(canonicalJson(value)).toBe(reference(value));
      }),
    );
  });

  it('refuses cycles and bigints with the JSON path', () => {
    const a: Record<string, unknown> = { b: [1] };
    (a.b as unknown[]).push({ back: a });
    expect(() => canonicalJson(a)).toThrow('$.b[1].back: circular reference');
    expect(() => canonicalJson({ big: new BigInt64Array([1n]) })).toThrow('$.big[0]: a bigint cannot be written as JSON');
    expect(() => canonicalJson({ f: () => 1 })).toThrow('$.f: a function cannot be written as JSON');
  });

  it('canonicallyEqual holds only for values of equal canonical text (property)', () => {
    fc.assert(
      fc.property(fc.jsonValue(), fc.jsonValue(), (a, b) => {
        const copy = JSON.parse(JSON.stringify(a)) as unknown;
        expect(canonicallyEqual(a, copy)).toBe(true);
        if (canonicallyEqual(a, b)) expect(canonicalJson(a)).toBe(canonicalJson(b));
        else expect(canonicalJson(a) === canonicalJson(b) && JSON.stringify(a) === JSON.stringify(b)).toBe(false);
      }),
    );
    expect(canonicallyEqual({ a: -0, u: undefined }, { a: 0 })).toBe(true);
    expect(canonicallyEqual({ a: [1, 2] }, { a: [2, 1] })).toBe(false);
    expect(canonicallyEqual({ a: NaN }, { a: NaN })).toBe(false);
  });
});
