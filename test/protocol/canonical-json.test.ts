import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { canonicalJson } from '../../src/protocol/index.js';

function shuffleKeys(value: unknown, random: () => number): unknown {
  if (Array.isArray(value)) return value.map((v) => shuffleKeys(v, random));
  if (value && typeof value === 'object') {
    const entries = Object.entries(value).sort(() => random() - 0.5);
    return Object.fromEntries(entries.map(([k, v]) => [k, shuffleKeys(v, random)]));
  }
  return value;
}

describe('canonical JSON', () => {
  it('sorts members by key and writes no whitespace', () => {
    expect(canonicalJson({ b: 1, a: [true, null, 'x'], c: { z: 1.5, y: -0 } })).toBe(
      '{"a":[true,null,"x"],"b":1,"c":{"y":0,"z":1.5}}',
    );
    // Keys sort by UTF-16 code units (as RFC 8785 orders them): digits, upper case, lower case, then the rest.
    expect(canonicalJson({ é: 1, a: 2, B: 3, '10': 4, '9': 5 })).toBe('{"10":4,"9":5,"B":3,"a":2,"é":1}');
  });

  it('gives the same text whatever order members were built in, and reads back as the same value', () => {
    fc.assert(
      fc.property(fc.jsonValue(), fc.integer(), (value, seed) => {
        let s = seed;
        const random = () => (s = (s * 1103515245 + 12345) % 2 ** 31) / 2 ** 31;
        const text = canonicalJson(value);
        expect(canonicalJson(shuffleKeys(value, random))).toBe(text);
        expect(JSON.parse(text)).toEqual(JSON.parse(JSON.stringify(value)));
        // Read back, every member is in order: the same text again (the path a device's payload takes).
        expect(canonicalJson(JSON.parse(text))).toBe(text);
      }),
      { numRuns: 300, seed: 7 },
    );
  });

  it('writes values in order, out of order, and nested past any shortcut alike', () => {
    let deep: unknown = { b: [1, { d: 2, c: 3 }], a: 'x' };
    let expected = '{"a":"x","b":[1,{"c":3,"d":2}]}';
    for (let i = 0; i < 60; i++) {
      deep = { z: i, y: [deep] };
      expected = `{"y":[${expected}],"z":${i}}`;
    }
    expect(canonicalJson(deep)).toBe(expected);
    expect(canonicalJson(JSON.parse(expected))).toBe(expected);
    const list = Object.assign([1, 2], { toJSON: () => 'not a list' });
    expect(canonicalJson({ a: list })).toBe('{"a":[1,2]}');
  });

  it('refuses what JSON cannot say, rather than dropping it', () => {
    expect(() => canonicalJson({ a: undefined })).toThrow(/undefined/);
    expect(() => canonicalJson([Number.NaN])).toThrow(/NaN/);
    expect(() => canonicalJson(Infinity)).toThrow();
    expect(() => canonicalJson(1n)).toThrow(/bigint/);
    const holey = [1, 2, 3];
    delete holey[1];
    expect(() => canonicalJson({ a: holey })).toThrow(/undefined/);
    expect(() => canonicalJson({ a: { b: () => 1 } })).toThrow(/function/);
    const loop: Record<string, unknown> = {};
    loop['self'] = loop;
    expect(() => canonicalJson(loop)).toThrow(/cycle/);
  });
});
