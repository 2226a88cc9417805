import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { CanonicalJsonError, canonicalJson, canonicallyEqual, insertMembers } from './canonical-json.js';

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
        // fc's typed arrays may hold ±Infinity, NaN or bigints: those are refused, not written.
        const refused = (x: unknown): boolean =>
          ArrayBuffer.isView(x) ? Array.from(x as unknown as ArrayLike<unknown>).some((v) => typeof v !== 'number' || !Number.isFinite(v))
            : x !== null && typeof x === 'object' ? Object.values(x).some(refused) : false;
        if (refused(value)) expect(() => canonicalJson(value)).toThrow(CanonicalJsonError);
        else expect(canonicalJson(value)).toBe(reference(value));
      }),
    );
  });

  // Strings of arbitrary UTF-16 code units: controls, quotes, backslashes, U+2028, paired and lone surrogates, astral characters.
  const unit = fc.oneof(
    fc.integer({ min: 0, max: 0xffff }),
    fc.constantFrom(0, 0x1f, 0x22, 0x5c, 0x7f, 0x2028, 0xd800, 0xdbff, 0xdc00, 0xdfff, 0xfeff),
    fc.integer({ min: 0x20, max: 0x7e }),
  );
  const anyString = fc.oneof(
    fc.array(unit, { maxLength: 40 }).map((codes) => String.fromCharCode(...codes)),
    fc.string({ unit: 'grapheme', maxLength: 12 }),
    fc.string({ maxLength: 50 }), // long plain strings take the regex test
  );
  // Keys from a small pool (so objects share first keys and shapes) and arbitrary ones: index-like keys, "__proto__", "".
  const key = fc.oneof(
    fc.constantFrom('a', 'b', 'B', 'aa', 'energy', 'level', 'seed', '10', '2', '0', '01', '__proto__', '', 'é', '\u{1f600}', 'a"b', 'x\\y', 'k\n'),
    anyString,
  );
  const number = fc.oneof(
    fc.double({ noNaN: true, noDefaultInfinity: true }),
    fc.integer(),
    fc.constantFrom(-0, 0, 5e-324, -5e-324, 1e21, 1e-7, 1e-6, 123456789012345680000, Number.MAX_VALUE, Number.MAX_SAFE_INTEGER + 2, 0.1 + 0.2),
  );
  const { value: nested } = fc.letrec((tie) => ({
    value: fc.oneof({ depthSize: 'small', withCrossShrink: true }, number, anyString, fc.boolean(), fc.constant(null), tie('array'), tie('object'), tie('wide'), tie('typed')),
    array: fc.array(tie('value'), { maxLength: 6 }),
    // Unsorted insertion order; undefined members are dropped; some objects have no prototype.
    object: fc
      .tuple(fc.array(fc.tuple(key, fc.option(tie('value'), { nil: undefined, freq: 6 })), { maxLength: 8 }), fc.boolean())
      .map(([entries, bare]) => {
        const o: Record<string, unknown> = bare ? (Object.create(null) as Record<string, unknown>) : {};
        for (const [k, v] of entries) Object.defineProperty(o, k, { value: v, enumerable: true, writable: true, configurable: true });
        return o;
      }),
    // Containers above the shape cache's size (joined, not concatenated).
    wide: fc.oneof(
      fc.array(number, { minLength: 65, maxLength: 90 }),
      fc.uniqueArray(fc.tuple(key, fc.oneof(number, anyString, fc.constant(null))), { minLength: 65, maxLength: 80, selector: ([k]) => k }).map((entries) => Object.fromEntries(entries)),
    ),
    typed: fc.array(fc.double({ noNaN: true, noDefaultInfinity: true }), { maxLength: 5 }).map((a) => new Float64Array(a)),
  }));

  it('writes the same text as the plain reference writer on random nested values (property)', () => {
    fc.assert(
      fc.property(nested, (value) => {
        expect(canonicalJson(value)).toBe(reference(value));
      }),
      { numRuns: 300 },
    );
    // The text is JSON, and reading it back gives a value of the same text.
    fc.assert(
      fc.property(nested, (value) => {
        const text = canonicalJson(value);
        expect(canonicalJson(JSON.parse(text))).toBe(text);
      }),
      { numRuns: 100 },
    );
  });

  it('keeps shapes apart: objects with the same first key and size but other keys, and many shapes', () => {
    const objects: Record<string, unknown>[] = [];
    for (let i = 0; i < 40; i++) objects.push({ a: i, [`k${i % 13}`]: -i, z: i % 2 ? 'odd' : undefined });
    for (let i = 0; i < 1500; i++) objects.push({ [`first${i}`]: i, b: [i] }); // more first keys than the cache holds
    for (const o of [...objects, ...objects]) expect(canonicalJson(o)).toBe(reference(o));
    expect(canonicalJson({ b: 1, 10: 2, a: 3 })).toBe('{"10":2,"a":3,"b":1}');
    expect(canonicalJson({ b: 1, 9: 2, a: 3 })).toBe('{"9":2,"a":3,"b":1}');
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

describe('insertMembers', () => {
  // Keys and strings a text scanner could trip on: quotes, backslashes, brackets, commas, colons,
  // non-ASCII, "__proto__", and keys sorting before, between and after the others.
  const awkward = fc.constantFrom('a', 'b', 'energy', 'history', 'zz', '__proto__', 'q"x', 'b\\s', '{', '}', '[,]', ':', 'ü', '\u2028', '');
  const value = fc.oneof(fc.jsonValue({ maxDepth: 3 }), fc.dictionary(awkward, fc.oneof(awkward, fc.jsonValue({ maxDepth: 2 }))), fc.array(awkward));
  const object = fc.dictionary(fc.oneof(awkward, fc.string()), value, { maxKeys: 8 });
  const define = (o: Record<string, unknown>, k: string, v: unknown) => Object.defineProperty(o, k, { value: v, enumerable: true, writable: true, configurable: true });

  it('gives canonicalJson of the object with the new members (property, against canonicalJson)', () => {
    fc.assert(
      fc.property(object, object, (base, extra) => {
        const added = Object.entries(extra).filter(([k]) => !Object.prototype.hasOwnProperty.call(base, k));
        const whole: Record<string, unknown> = {};
        for (const [k, v] of Object.entries(base)) define(whole, k, v);
        for (const [k, v] of added) define(whole, k, v);
        expect(insertMembers(canonicalJson(base), added.map(([k, v]) => [k, canonicalJson(v)]))).toBe(canonicalJson(whole));
      }),
      { numRuns: 400 },
    );
  });

  it('refuses a key already there and texts that are not canonical objects', () => {
    expect(insertMembers('{"a":1,"c":{"b":",}"}}', [['b', '[2]']])).toBe('{"a":1,"b":[2],"c":{"b":",}"}}');
    expect(insertMembers('{}', [['b', '1'], ['a', '2']])).toBe('{"a":2,"b":1}');
    expect(insertMembers('{"a":1}', [['a', '2']])).toBeUndefined();
    expect(insertMembers('[1]', [['a', '2']])).toBeUndefined();
    expect(insertMembers('{ "a": 1 }', [['b', '2']])).toBeUndefined();
  });
});
